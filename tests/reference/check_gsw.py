#!/usr/bin/python3
"""Outside-reference check of Tidewright's salinity and density against python3-gsw (TEOS-10).

Run with Debian's interpreter (python3-gsw lives there):
    /usr/bin/python3 tests/reference/check_gsw.py path/to/tidewright

Grid: practical salinity 5..42, temperature 0..35 C (ITS-90), pressure 0, 1000 and 5000 dbar.
Our numbers come from two calls of `tidewright salinity --batch -` (CSV on stdin).

What is compared, and why the tolerances differ:
  1. PSS-78 both ways: gsw.SP_from_C(C, t, p) and gsw.C_from_SP(SP, t, p) implement the same
     PSS-78 (UNESCO 1983) as we do, so the two must agree to the digits we print (10
     significant): tolerance 1e-7 in salinity and 1e-7 mS/cm.
  2. Density: ours is EOS-80 (UNESCO 1983); gsw.rho(SA, CT, p) is TEOS-10 (IOC et al. 2010),
     a different standard. SA = gsw.SA_from_SP(SP, p, lon, lat) at a mid-ocean position in the
     North Atlantic subtropical gyre (30 N, 30 W), CT = gsw.CT_from_t(SA, t, p). The two
     standards differ by up to a few hundredths of a kg/m3 (TEOS-10 also adds the absolute
     salinity anomaly at that position); measured here: under 0.009 kg/m3 at the surface and
     0.019 kg/m3 at 5000 dbar. Each tolerance is set just above the worst difference measured
     on this grid, and the worst is printed with its place.
  3. Specific gravity (25 C pure-water reference): ours rho(S, t, 0)/rho_w(25) against gsw's
     rho(SA, CT, 0)/rho(0, CT_w(25), 0) -- the same comparison as 2, scaled by ~1/1000.
Exit status 0 when every check passes; a closing line "gsw: N passed, M failed".
"""
import csv
import io
import subprocess
import sys

import gsw

LON, LAT = -30.0, 30.0            # mid-ocean North Atlantic (30 N, 30 W)
SALINITIES = [5.0 + 2.0 * i for i in range(19)] + [42.0]   # 5, 7, ..., 41, 42
TEMPERATURES = [0.0, 5.0, 10.0, 15.0, 20.0, 25.0, 30.0, 35.0]
PRESSURES = [0.0, 1000.0, 5000.0]
REFERENCE_T = 25.0

# PSS-78: same standard; worst seen 4e-14 in S and 5e-9 mS/cm (our CSV prints 10 digits).
TOL_PSS78_S = 1e-7          # practical salinity
TOL_PSS78_C = 1e-7          # mS/cm
# EOS-80 vs TEOS-10 (different standards), worst seen on this grid (2026-12-01, gsw 3.6.16):
# 0.0087 kg/m3 at 0 dbar (S 42, 0 C), 0.0079 at 1000 dbar, 0.0191 at 5000 dbar (S 39, 30 C);
# specific gravity 1.05e-5 (S 42, 0 C). Tolerances sit just above these.
TOL_DENSITY = {0.0: 0.010, 1000.0: 0.010, 5000.0: 0.022}   # kg/m3, per pressure
TOL_SG = 1.2e-5             # specific gravity


def run_batch(binary, text):
    proc = subprocess.run([binary, "salinity", "--batch", "-"], input=text, capture_output=True,
                          text=True, check=False)
    if proc.returncode != 0:
        sys.exit(f"gsw: tidewright salinity --batch failed (exit {proc.returncode}): "
                 f"{proc.stderr.strip()}")
    return list(csv.DictReader(io.StringIO(proc.stdout)))


class Tally:
    def __init__(self, name, tolerance_of, unit):
        self.name, self.tolerance_of, self.unit = name, tolerance_of, unit
        self.passed = self.failed = 0
        self.worst = (0.0, None)

    def add(self, ours, theirs, where):
        err = abs(ours - theirs)
        if err > self.worst[0] or self.worst[1] is None:
            self.worst = (err, where)
        if err <= self.tolerance_of(where):
            self.passed += 1
        else:
            self.failed += 1
            print(f"FAIL {self.name} at {where}: ours {ours:.8f}, gsw {theirs:.8f}, "
                  f"|diff| {err:.3g} {self.unit} > {self.tolerance_of(where):g}")

    def report(self):
        err, where = self.worst
        place = "S {:g}, t {:g} C, p {:g} dbar".format(*where) if where else "-"
        print(f"{self.name}: worst |diff| {err:.3g} {self.unit} at {place}; "
              f"{self.passed} passed, {self.failed} failed")


def main():
    if len(sys.argv) != 2:
        sys.exit("usage: check_gsw.py path/to/tidewright")
    binary = sys.argv[1]
    grid = [(s, t, p) for p in PRESSURES for t in TEMPERATURES for s in SALINITIES]

    # Call 1: salinity in, our conductivity, density and specific gravity out.
    text = "salinity,sample_temperature_c,reference_temperature_c,pressure_dbar\n" + "".join(
        f"{s!r},{t!r},{REFERENCE_T!r},{p!r}\n" for s, t, p in grid)
    ours = run_batch(binary, text)
    # Call 2: gsw's conductivity in, our practical salinity out.
    gsw_c = [float(gsw.C_from_SP(s, t, p)) for s, t, p in grid]
    text = "conductivity_ms_cm,sample_temperature_c,pressure_dbar\n" + "".join(
        f"{c!r},{t!r},{p!r}\n" for c, (s, t, p) in zip(gsw_c, grid))
    ours_from_c = run_batch(binary, text)
    if len(ours) != len(grid) or len(ours_from_c) != len(grid):
        sys.exit("gsw: tidewright returned a different number of rows than sent")

    sp_from_c = Tally("PSS-78 SP_from_C", lambda w: TOL_PSS78_S, "")
    c_from_sp = Tally("PSS-78 C_from_SP", lambda w: TOL_PSS78_C, "mS/cm")
    density = {p: Tally(f"density EOS-80 vs TEOS-10, {p:g} dbar", lambda w: TOL_DENSITY[w[2]],
                        "kg/m3") for p in PRESSURES}
    sg = Tally("specific gravity 25 C ref", lambda w: TOL_SG, "")
    ct_ref = float(gsw.CT_from_t(0.0, REFERENCE_T, 0.0))
    rho_w_ref = float(gsw.rho(0.0, ct_ref, 0.0))

    for (s, t, p), row, row_c, c in zip(grid, ours, ours_from_c, gsw_c):
        where = (s, t, p)
        label = f"S {s:g}, t {t:g} C, p {p:g} dbar"
        for r in (row, row_c):
            if r["error"]:
                print(f"FAIL tidewright refused {label}: {r['error']}")
                sp_from_c.failed += 1
        if row["error"] or row_c["error"]:
            continue
        # 1. PSS-78 (same standard both sides)
        sp_from_c.add(float(row_c["salinity"]), float(gsw.SP_from_C(c, t, p)), where)
        c_from_sp.add(float(row["conductivity_ms_cm"]), c, where)
        # 2. density (EOS-80 vs TEOS-10)
        sa = float(gsw.SA_from_SP(s, p, LON, LAT))
        ct = float(gsw.CT_from_t(sa, t, p))
        density[p].add(float(row["density_kg_m3"]), float(gsw.rho(sa, ct, p)), where)
        # 3. specific gravity at the surface
        if p == 0.0:
            sg.add(float(row["specific_gravity"]), float(gsw.rho(sa, ct, 0.0)) / rho_w_ref, where)

    tallies = [sp_from_c, c_from_sp] + [density[p] for p in PRESSURES] + [sg]
    for tally in tallies:
        tally.report()
    passed = sum(x.passed for x in tallies)
    failed = sum(x.failed for x in tallies)
    print(f"gsw: {passed} passed, {failed} failed")
    return 0 if failed == 0 else 1


if __name__ == "__main__":
    sys.exit(main())
