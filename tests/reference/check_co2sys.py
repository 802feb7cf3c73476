#!/usr/bin/python3
"""Outside-reference check of Tidewright's carbonate system against the conventions of the
reference packages, CO2SYS-MATLAB v3 and PyCO2SYS.

Run with Debian's interpreter:
    /usr/bin/python3 tests/reference/check_co2sys.py path/to/tidewright

Neither package is in Debian (PyCO2SYS is on PyPI, which this machine cannot reach), so this
file is an independent re-implementation, in plain Python floats, of the formulas as CO2SYS.m
v3.1.1 codes them (github.com/jonathansharp/CO2-System-Extd, CO2SYS.m, sub Constants and the
alkalinity sums of CalculateAlkParts) at 1 atm, with the options oceanographers use by
default: K1 K2 of Lueker et al. 2000 (K1K2CONSTANTS 10), KSO4 of Dickson 1990 (KSO4CONSTANT
1), KF of Perez & Fraga 1987 (KFCONSTANT 2; "on the free pH scale in mol/kg-SW"), total boron
of Uppstrom 1974 (BORON 1), results on the total scale (pHSCALEIN 1). PyCO2SYS reads the same
formulas the same way (PyCO2SYS/equilibria/p1atm.py: k_HF_free_PF87, k_H2O_sws_M95,
k_H3PO4_sws_YM95, k_H2PO4_sws_YM95, k_HPO4_sws_YM95, k_Si_sws_YM95). The solver here is plain
bisection on pH_T to 1e-13, nothing shared with Tidewright's.

Grid (the goal of issue 16): S 20, 25, 30, 35, 40; T 10, 16, 22, 28, 32 C; alkalinity 1500,
2300, 3500, 5000 umol/kg; pH_T 7.5, 8.1, 8.7 and pCO2 200, 800, 3000 uatm; without nutrients
and with phosphate 3, silicate 60 umol/kg. Pairs fed to `tidewright chem --batch -`:
alkalinity+DIC, alkalinity+pH_T, alkalinity+pH_NBS, alkalinity+pCO2, DIC+pH_SWS, DIC+pCO2.

Total boron is taken once as each package writes it (see TB_FORMS).
Compared: pH on all four scales, pCO2, carbonate ion, against the inter-package spread of
Orr et al. (2015, Biogeosciences 12:1483): 0.0002 pH, 0.2 uatm pCO2, 0.1 umol/kg CO3.
The worst difference of each is printed with its place, for the default conventions (must be
inside the spread) and, for information, for --conventions guide2007 (the 2007 Guide's forms).
Exit status 0 when every default-convention value is inside the spread; a closing line
"co2sys: N passed, M failed".
"""
import csv
import io
import math
import subprocess
import sys

LN10 = math.log(10.0)
ORR_SPREAD = {"ph": 0.0002, "pco2": 0.2, "co3": 0.1}


# ---------------------------------------------------------------- CO2SYS.m v3.1.1, sub Constants
# Total boron, Uppstrom 1974, as each package writes it: CO2SYS.m v3.1.1 (sub Constants,
# "CalculateTB", BORON 1) 0.0004157 S/35; PyCO2SYS (salts.py, total_borate_U74) the ratio form
# (0.000232/10.811)(S/1.80655), 0.014 % more, which Tidewright uses too. The only difference
# between the two packages' formulas on this grid.
TB_FORMS = {
    "CO2SYS.m v3.1.1": lambda sal: 0.0004157 * sal / 35.0,
    "PyCO2SYS": lambda sal: (0.000232 / 10.811) * (sal / 1.80655),
}
TB_FORM = ["CO2SYS.m v3.1.1"]


def constants(sal, temp_c, tp_umol=0.0, tsi_umol=0.0):
    """Every constant on the TOTAL scale, mol/kg-SW, as CO2SYS.m v3.1.1 makes them at 0 dbar."""
    tk = temp_c + 273.15
    ln_tk = math.log(tk)
    sq = math.sqrt(sal)
    k = {}
    # Totals: TB = 0.0004157 S/35 (Uppstrom 1974, BORON 1); Ca with 40.087 as CO2SYS writes it;
    # TF Riley 1965; TS Morris & Riley 1966.
    k["TB"] = TB_FORMS[TB_FORM[0]](sal)
    k["CAL"] = 0.02128 / 40.087 * (sal / 1.80655)
    k["TF"] = (0.000067 / 18.998) * (sal / 1.80655)
    k["TS"] = (0.14 / 96.062) * (sal / 1.80655)
    k["TP"] = tp_umol * 1e-6
    k["TSi"] = tsi_umol * 1e-6
    t100 = tk / 100.0
    k["K0"] = math.exp(-60.2409 + 93.4517 / t100 + 23.3585 * math.log(t100)
                       + sal * (0.023517 - 0.023656 * t100 + 0.0047036 * t100 ** 2))
    ion_s = 19.924 * sal / (1000.0 - 1.005 * sal)
    ln_ks = (-4276.1 / tk + 141.328 - 23.093 * ln_tk
             + (-13856.0 / tk + 324.57 - 47.986 * ln_tk) * math.sqrt(ion_s)
             + (35474.0 / tk - 771.54 + 114.723 * ln_tk) * ion_s
             + (-2698.0 / tk) * math.sqrt(ion_s) * ion_s + (1776.0 / tk) * ion_s ** 2)
    ks = math.exp(ln_ks) * (1.0 - 0.001005 * sal)           # free scale, mol/kg-SW
    kf = math.exp(874.0 / tk - 9.68 + 0.111 * sq)            # Perez & Fraga 1987, FREE scale
    sws_to_tot = (1.0 + k["TS"] / ks) / (1.0 + k["TS"] / ks + k["TF"] / kf)
    free_to_tot = 1.0 + k["TS"] / ks
    fh = 1.2948 - 0.002036 * tk + (0.0004607 - 0.000001475 * tk) * sal ** 2
    ln_kb = ((-8966.9 - 2890.53 * sq - 77.942 * sal + 1.728 * sq * sal - 0.0996 * sal ** 2) / tk
             + 148.0248 + 137.1942 * sq + 1.62142 * sal
             + (-24.4344 - 25.085 * sq - 0.2474 * sal) * ln_tk + 0.053105 * sq * tk)
    kb_sws = math.exp(ln_kb) / sws_to_tot
    kw_sws = math.exp(148.9802 - 13847.26 / tk - 23.6521 * ln_tk
                      + (-5.977 + 118.67 / tk + 1.0495 * ln_tk) * sq - 0.01615 * sal)
    kp1_sws = math.exp(-4576.752 / tk + 115.54 - 18.453 * ln_tk + (-106.736 / tk + 0.69171) * sq
                       + (-0.65643 / tk - 0.01844) * sal)
    kp2_sws = math.exp(-8814.715 / tk + 172.1033 - 27.927 * ln_tk + (-160.34 / tk + 1.3566) * sq
                       + (0.37335 / tk - 0.05778) * sal)
    kp3_sws = math.exp(-3070.75 / tk - 18.126 + (17.27039 / tk + 2.81197) * sq
                       + (-44.99486 / tk - 0.09984) * sal)
    ksi_sws = math.exp(-8904.2 / tk + 117.4 - 19.334 * ln_tk + (-458.79 / tk + 3.5913) * math.sqrt(ion_s)
                       + (188.74 / tk - 1.5998) * ion_s + (-12.1652 / tk + 0.07871) * ion_s ** 2
                       ) * (1.0 - 0.001005 * sal)
    # Lueker et al. 2000 (WhichKs 10), total scale -> SWS (/SWStoTOT) in CO2SYS.m
    pk1 = 3633.86 / tk - 61.2172 + 9.6777 * ln_tk - 0.011555 * sal + 0.0001152 * sal ** 2
    pk2 = 471.78 / tk + 25.929 - 3.16967 * ln_tk - 0.01781 * sal + 0.0001122 * sal ** 2
    k1_sws = 10.0 ** -pk1 / sws_to_tot
    k2_sws = 10.0 ** -pk2 / sws_to_tot
    # "FindpHScaleConversionFactor": pHScale 1 (total) multiplies every SWS constant by SWStoTOT.
    for name, v in (("K1", k1_sws), ("K2", k2_sws), ("KB", kb_sws), ("KW", kw_sws),
                    ("KP1", kp1_sws), ("KP2", kp2_sws), ("KP3", kp3_sws), ("KSi", ksi_sws)):
        k[name] = v * sws_to_tot
    k["KS"], k["KF"], k["FREEtoTOT"], k["SWStoTOT"], k["fH"] = ks, kf, free_to_tot, sws_to_tot, fh
    # Fugacity factor (Weiss 1974), CO2SYS.m: exp((b + 2 Delta) P1atm / RT), R 83.14462618.
    b = -1636.75 + 12.0408 * tk - 0.0327957 * tk ** 2 + 3.16528e-5 * tk ** 3
    delta = 57.7 - 0.118 * tk
    k["FugFac"] = math.exp((b + 2.0 * delta) * 1.01325 / (83.14462618 * tk))
    # CaSolubility: Mucci 1983 (aragonite), at 0 dbar
    log_ka = (-171.945 - 0.077993 * tk + 2903.293 / tk + 71.595 * ln_tk / LN10
              + (-0.068393 + 0.0017276 * tk + 88.135 / tk) * sq - 0.10018 * sal + 0.0059415 * sq * sal)
    k["KAr"] = 10.0 ** log_ka
    return k


# ---------------------------------------------------------------- CalculateAlkParts
def alkalinity(k, dic, h):
    """TA(h, DIC) with h on the total scale, mol/kg (CO2SYS.m: HCO3 + 2 CO3 + BAlk + OH + PAlk
    + SiAlk - Hfree - HSO4 - HF)."""
    k1, k2 = k["K1"], k["K2"]
    carb = dic * k1 * (h + 2.0 * k2) / (h * h + k1 * h + k1 * k2)
    balk = k["TB"] * k["KB"] / (k["KB"] + h)
    oh = k["KW"] / h
    kp1, kp2, kp3 = k["KP1"], k["KP2"], k["KP3"]
    palk = k["TP"] * (kp1 * kp2 * h + 2 * kp1 * kp2 * kp3 - h ** 3) / (
        h ** 3 + kp1 * h ** 2 + kp1 * kp2 * h + kp1 * kp2 * kp3)
    sialk = k["TSi"] * k["KSi"] / (k["KSi"] + h)
    hfree = h / k["FREEtoTOT"]
    hso4 = k["TS"] / (1.0 + k["KS"] / hfree)
    hf = k["TF"] / (1.0 + k["KF"] / hfree)
    return carb + balk + oh + palk + sialk - hfree - hso4 - hf


def ph_from_ta_dic(k, ta, dic):
    lo, hi = 2.0, 12.0  # TA falls as pH falls
    for _ in range(200):
        mid = 0.5 * (lo + hi)
        if alkalinity(k, dic, 10.0 ** -mid) > ta:
            hi = mid
        else:
            lo = mid
        if hi - lo < 1e-13:
            break
    return 0.5 * (lo + hi)


def dic_from_ph_co2(k, ph, co2):
    h = 10.0 ** -ph
    return co2 * (1.0 + k["K1"] / h + k["K1"] * k["K2"] / h ** 2)


def state(k, ph_t, dic):
    h = 10.0 ** -ph_t
    k1, k2 = k["K1"], k["K2"]
    den = h * h + k1 * h + k1 * k2
    co2 = dic * h * h / den
    co3 = dic * k1 * k2 / den
    fco2 = co2 / k["K0"]
    ph_sws = ph_t + math.log10(k["SWStoTOT"])  # [H+]_T = SWStoTOT [H+]_SWS
    return {"ph_total": ph_t, "ph_sws": ph_sws, "ph_free": ph_t + math.log10(k["FREEtoTOT"]),
            "ph_nbs": ph_sws - math.log10(k["fH"]), "pco2_uatm": fco2 / k["FugFac"] * 1e6,
            "co3_umol_kg": co3 * 1e6, "alkalinity_umol_kg": alkalinity(k, dic, h) * 1e6,
            "dic_umol_kg": dic * 1e6, "omega_aragonite": k["CAL"] * co3 / k["KAr"]}


# ---------------------------------------------------------------- the grid
SALINITIES = [20.0, 25.0, 30.0, 35.0, 40.0]
TEMPERATURES = [10.0, 16.0, 22.0, 28.0, 32.0]
ALKALINITIES = [1500.0, 2300.0, 3500.0, 5000.0]
PHS = [7.5, 8.1, 8.7]
PCO2S = [200.0, 800.0, 3000.0]
NUTRIENTS = [(0.0, 0.0), (3.0, 60.0)]


def reference_states():
    """Reference states on the grid: (conditions, state) from TA with pH_T or pCO2."""
    out = []
    for sal in SALINITIES:
        for t in TEMPERATURES:
            for tp, tsi in NUTRIENTS:
                k = constants(sal, t, tp, tsi)
                for ta in ALKALINITIES:
                    for ph in PHS:
                        h = 10.0 ** -ph
                        nc = alkalinity(k, 0.0, h)
                        per_dic = alkalinity(k, 1.0, h) - nc
                        dic = (ta * 1e-6 - nc) / per_dic
                        if dic > 0:
                            out.append(((sal, t, tp, tsi), state(k, ph, dic)))
                    for pco2 in PCO2S:
                        co2 = pco2 * 1e-6 * k["FugFac"] * k["K0"]
                        lo, hi = 2.0, 12.0
                        for _ in range(200):
                            mid = 0.5 * (lo + hi)
                            dic = dic_from_ph_co2(k, mid, co2)
                            if alkalinity(k, dic, 10.0 ** -mid) > ta * 1e-6:
                                hi = mid
                            else:
                                lo = mid
                            if hi - lo < 1e-13:
                                break
                        ph = 0.5 * (lo + hi)
                        out.append(((sal, t, tp, tsi), state(k, ph, dic_from_ph_co2(k, ph, co2))))
    return out


PAIRS = [  # (name, input columns from the reference state)
    ("alk+dic", {"alkalinity_umol_kg": "alkalinity_umol_kg", "dic_umol_kg": "dic_umol_kg"}),
    ("alk+pH_T", {"alkalinity_umol_kg": "alkalinity_umol_kg", "ph": "ph_total", "ph_scale": "total"}),
    ("alk+pH_NBS", {"alkalinity_umol_kg": "alkalinity_umol_kg", "ph": "ph_nbs", "ph_scale": "nbs"}),
    ("alk+pCO2", {"alkalinity_umol_kg": "alkalinity_umol_kg", "pco2_uatm": "pco2_uatm"}),
    ("dic+pH_SWS", {"dic_umol_kg": "dic_umol_kg", "ph": "ph_sws", "ph_scale": "sws"}),
    ("dic+pCO2", {"dic_umol_kg": "dic_umol_kg", "pco2_uatm": "pco2_uatm"}),
]
COLUMNS = ["id", "salinity", "temperature_c", "phosphate_umol_kg", "silicate_umol_kg",
           "alkalinity_umol_kg", "dic_umol_kg", "ph", "ph_scale", "pco2_uatm"]
COMPARED = [("ph_total", "ph"), ("ph_sws", "ph"), ("ph_free", "ph"), ("ph_nbs", "ph"),
            ("pco2_uatm", "pco2"), ("co3_umol_kg", "co3")]


def batch_input(states):
    text = io.StringIO()
    w = csv.writer(text, lineterminator="\n")
    w.writerow(COLUMNS)
    rows = []
    for i, ((sal, t, tp, tsi), st) in enumerate(states):
        for name, inputs in PAIRS:
            cells = {"id": f"{len(rows)}", "salinity": sal, "temperature_c": t,
                     "phosphate_umol_kg": tp, "silicate_umol_kg": tsi}
            for col, src in inputs.items():
                cells[col] = src if col == "ph_scale" else repr(st[src])
            w.writerow([cells.get(c, "") for c in COLUMNS])
            rows.append((name, (sal, t, tp, tsi), st))
    return text.getvalue(), rows


def run(binary, text, conventions):
    proc = subprocess.run([binary, "chem", "--batch", "-", "--conventions", conventions],
                          input=text, capture_output=True, text=True, check=False)
    if proc.returncode != 0:
        sys.exit(f"co2sys: tidewright chem --batch failed (exit {proc.returncode}): {proc.stderr.strip()}")
    return list(csv.DictReader(io.StringIO(proc.stdout)))


def compare(binary, conventions, enforce):
    states = reference_states()
    text, rows = batch_input(states)
    ours = run(binary, text, conventions)
    if len(ours) != len(rows):
        sys.exit(f"co2sys: {len(ours)} rows out for {len(rows)} in")
    worst = {}
    failed = passed = 0
    for (pair, cond, ref), got in zip(rows, ours):
        for col, kind in COMPARED:
            diff = abs(float(got[col]) - ref[col])
            ok = diff <= ORR_SPREAD[kind]
            if enforce:
                passed += ok
                failed += not ok
            key = (col, pair)
            if key not in worst or diff > worst[key][0]:
                worst[key] = (diff, cond, ref["ph_total"], ref["pco2_uatm"])
    print(f"--conventions {conventions}: worst |difference| from the re-implementation, total boron as "
          f"{TB_FORM[0]} writes it ({len(rows)} rows)")
    for col, kind in COMPARED:
        d, cond, ph, pco2 = max((worst[(col, p)] for p, _ in PAIRS), key=lambda x: x[0])
        pair = max(((worst[(col, p)][0], p) for p, _ in PAIRS))[1]
        flag = "" if d <= ORR_SPREAD[kind] else "  OUTSIDE the Orr et al. spread"
        print(f"  {col:12s} {d:.3g} (spread {ORR_SPREAD[kind]}) from {pair} at S {cond[0]:g}, "
              f"{cond[1]:g} C, P {cond[2]:g}, Si {cond[3]:g}, pH_T {ph:.3f}, pCO2 {pco2:.0f}{flag}")
    return passed, failed


def main():
    if len(sys.argv) != 2:
        sys.exit("usage: check_co2sys.py path/to/tidewright")
    binary = sys.argv[1]
    passed = failed = 0
    for tb_form in TB_FORMS:
        TB_FORM[0] = tb_form
        p, f = compare(binary, "co2sys", enforce=True)
        passed, failed = passed + p, failed + f
    TB_FORM[0] = "CO2SYS.m v3.1.1"
    compare(binary, "guide2007", enforce=False)  # for information: the Guide's forms
    print(f"co2sys: {passed} passed, {failed} failed")
    sys.exit(1 if failed else 0)


if __name__ == "__main__":
    main()
