#!/usr/bin/python3
"""The tidewright command line as a user meets it: every subcommand answers --help; bad input
exits non-zero with one line naming the field (or option) and the accepted range; a refused
entry leaves the journal exactly as it was; multi-compound stocks add what their
formula weights say. Usage: check_cli.py <tidewright binary>. Prints "N passed, M failed"."""
import os
import subprocess
import sys
import tempfile

binary = os.path.abspath(sys.argv[1])
passed = failed = 0


def check(name, ok, detail=""):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print(f"FAIL {name} {detail}")


def run(*args, cwd=None, stdin=b""):
    return subprocess.run([binary, *args], capture_output=True, input=stdin, cwd=cwd)


def refused(name, args, *words, cwd=None):
    """Exit status 1 or 2, exactly one line on stderr, containing every word."""
    r = run(*args, cwd=cwd)
    err = r.stderr.decode().strip()
    check(f"{name}: non-zero exit", r.returncode != 0, f"exit {r.returncode}")
    check(f"{name}: one line", err.count("\n") == 0 and err != "", repr(err))
    for w in words:
        check(f"{name}: says {w!r}", w in err, repr(err))


for sub in [[], ["chem"], ["salinity"], ["log"], ["log", "add", "test"], ["demand"], ["plan"], ["mix"], ["buffer"],
            ["buffer", "line"]]:
    r = run(*sub, "--help")
    check(f"{' '.join(sub) or 'tidewright'} --help", r.returncode == 0 and b"Usage" in r.stdout, r.stderr)

# 100 dKH is about 35,700 umol/kg, above the solver's 30,000 umol/kg.
refused("alkalinity out of range", ["chem", "--alkalinity", "100", "--ph", "8.1", "--ph-scale", "nbs"], "alkalinity", "accepted")
refused("pH out of range", ["chem", "--alkalinity", "8", "--ph", "13", "--ph-scale", "nbs"], "ph", "accepted")
refused("missing batch file", ["chem", "--batch", "/nonexistent/samples.csv"], "--batch", "/nonexistent/samples.csv")
refused("unknown option", ["chem", "--alkalinty", "8"], "--alkalinty")
refused("unknown compound", ["mix", "--compound", "unobtainium", "--grams-per-l", "5"], "--compound", "accepted")
refused("compounds without amounts", ["mix", "--compound", "CaCl2.2H2O", "--compound", "MgCl2.6H2O",
                                      "--grams-per-l", "100"], "--grams-per-l", "one per --compound")
refused("calcium with carbonate precipitates", ["mix", "--compound", "CaCl2.2H2O", "--grams-per-l", "150",
                                                "--compound", "sodium_carbonate", "--grams-per-l", "50"],
        "ingredients[1]", "separate stocks")
refused("--out into a missing directory", ["chem", "--alkalinity", "8", "--ph", "8.1", "--ph-scale", "nbs", "--json", "--out",
                                          "/nonexistent/dir/state.json"], "--out", "/nonexistent/dir/state.json")

# The hatchery line: intake -> 20 % fresh water, heated to 22 C -> dosed; each point printed.
# The other water and the tank temperature are bounded by the water's ranges (EOS-80's validity).
line = ["buffer", "line", "--salinity", "28", "--temperature", "14", "--alkalinity", "1900", "--ph", "7.7",
        "--ph-scale", "nbs", "--target-omega", "2.5"]
r = run(*line, "--mix-fraction", "0.2", "--tank-temperature", "22")
out = r.stdout.decode()
check("buffer line runs", r.returncode == 0, r.stderr)
for point in ["intake", "conditioned", "dosed", "at the tanks"]:
    check(f"buffer line shows {point!r}", point in out, out[:400])
refused("line: other water's salinity", [*line, "--mix-fraction", "0.2", "--mix-salinity", "45"], "--mix-salinity 45", "0 to 42")
refused("line: tank temperature", [*line, "--tank-temperature", "45"], "--tank-temperature 45", "-2 to 40")
refused("line: mix fraction", [*line, "--mix-fraction", "1.5"], "--mix-fraction 1.5", "0 to 1")
r = run(*line, "--tank-temperature", "45")
check("line: an option name is not put inside another", "tank_--" not in r.stderr.decode(), r.stderr)

# 150 g/L CaCl2.2H2O + 100 g/L MgCl2.6H2O: per mL 150 x 40.078/147.01 = 40.89 mg Ca and
# 100 x 24.305/203.30 = 11.96 mg Mg (standard atomic weights, IUPAC 2021; computed here).
r = run("mix", "--compound", "CaCl2.2H2O", "--grams-per-l", "150", "--compound", "MgCl2.6H2O", "--grams-per-l", "100")
out = r.stdout.decode()
check("two-compound stock runs", r.returncode == 0, r.stderr)
line = next((l for l in out.splitlines() if l.startswith("per mL:")), "")
try:
    ca = float(line.split(",")[2].split()[0])
    mg = float(line.split(",")[3].split()[0])
except (IndexError, ValueError):
    ca = mg = float("nan")
check("calcium per mL", abs(ca - 40.89) < 0.01, line)
check("magnesium per mL", abs(mg - 11.96) < 0.01, line)
check("cautions of both compounds", "Calcium chloride dihydrate" in out and "Magnesium chloride hexahydrate" in out)

# A refused entry loses nothing: the journal (database) exports byte for byte the same JSON
# afterwards.
with tempfile.TemporaryDirectory() as d:
    r = run("log", "--journal", "j.db", "add", "system", "--name", "Quarantine", "--volume", "60", cwd=d)
    check("add system", r.returncode == 0, r.stderr)
    r = run("log", "--journal", "j.db", "add", "test", "--parameter", "alkalinity", "--value", "8.1", cwd=d)
    check("add test", r.returncode == 0, r.stderr)
    def exported():
        return run("log", "--journal", "j.db", "export", "--format", "json", cwd=d).stdout
    before = exported()
    check("export of the journal", b'"tidewright-journal"' in before and b'"alkalinity"' in before)
    refused("alkalinity 40 dKH", ["log", "--journal", "j.db", "add", "test", "--parameter", "alkalinity",
                                  "--value", "40", "--unit", "dKH"], "alkalinity", "0 to 25", cwd=d)
    refused("water change larger than the tank", ["log", "--journal", "j.db", "add", "water-change",
                                                  "--volume", "500"], "volume", cwd=d)
    refused("time that is not a time", ["log", "--journal", "j.db", "add", "test", "--parameter", "ph",
                                        "--value", "8.1", "--time", "yesterday"], "time", cwd=d)
    refused("time in the future", ["log", "--journal", "j.db", "add", "test", "--parameter", "ph",
                                   "--value", "8.1", "--time", "2199-01-01T00:00Z"], "time", "future", cwd=d)
    check("journal unchanged after refusals", exported() == before)

# ---- chem with uncertainty (issue 13) ----
import csv
import io
import json

# Orr et al. (2018, Mar. Chem. 207:84) Table 4, the worked example: TA 2300, DIC 2000 umol/kg,
# S 35, 18 C, PO4 2, Si 60, u(TA) = u(DIC) = 2 umol/kg (PO4 and Si exact here, worth < 0.1 %);
# their CO2SYS-MATLAB row gives u(pCO2) 3.8033 uatm, u(CO3) 1.8540 umol/kg, u(Omega_ar) 0.02862,
# and with the constants' uncertainties 9.733, 3.261, 0.1558 (as copied by PyCO2SYS,
# manuscript/data/orr2018-table4.csv). chem --json must carry the core's numbers.
orr = ["chem", "--alkalinity", "2300", "--alkalinity-unit", "umol/kg", "--dic", "2000", "--temperature", "18",
       "--phosphate", "2", "--silicate", "60", "--alkalinity-precision", "2", "--dic-precision", "2",
       "--salinity-precision", "0", "--temperature-precision", "0", "--json"]
for extra, want in [([], {"pco2_uatm": 3.8033, "co3_umol_kg": 1.8540, "omega_aragonite": 0.02862}),
                    (["--constants-uncertainty"], {"pco2_uatm": 9.733, "co3_umol_kg": 3.261, "omega_aragonite": 0.1558})]:
    r = run(*orr, *extra)
    check("chem --json with precisions runs", r.returncode == 0, r.stderr)
    if r.returncode == 0:
        j = json.loads(r.stdout)
        for key, value in want.items():
            got = j["uncertainty"]["outputs"][key]["u"]
            check(f"Orr 2018 Table 4 u({key}) {extra}", abs(got - value) <= 0.004 * value, f"{got} vs {value}")
        pco2 = j["uncertainty"]["outputs"]["pco2_uatm"]
        check("95 % range is +/-1.96 u", abs(pco2["high_95"] - j["pco2_uatm"] - 1.96 * pco2["u"]) < 1e-9)
        check("state numbers unchanged by --uncertainty",
              j["pco2_uatm"] == json.loads(run(*orr[:13], "--json").stdout)["pco2_uatm"])

# Parity: chem --json (single) and chem --batch --uncertainty (the core's batch) give the same u.
single = run("chem", "--alkalinity", "2900", "--alkalinity-unit", "umol/kg", "--ph", "8.15", "--ph-scale", "nbs",
             "--uncertainty", "--json")
batch = run("chem", "--batch", "-", "--uncertainty",
            stdin=b"id,alkalinity_umol_kg,ph,ph_scale\r\nreef,2900,8.15,nbs\r\n")
check("chem --batch --uncertainty runs", batch.returncode == 0, batch.stderr)
if single.returncode == 0 and batch.returncode == 0:
    j = json.loads(single.stdout)
    row = next(csv.DictReader(io.StringIO(batch.stdout.decode())))
    for key in ["ph_total", "pco2_uatm", "co3_umol_kg", "omega_aragonite", "alkalinity_umol_kg"]:
        a, b = j["uncertainty"]["outputs"][key]["u"], float(row["u_" + key])
        check(f"chem --json and --batch agree on u({key})", abs(a - b) <= 1e-5 * a, f"{a} vs {b}")
refused("precision out of range", ["chem", "--alkalinity", "8.2", "--ph", "8.1", "--ph-scale", "nbs",
                                   "--alkalinity-precision", "3"], "--alkalinity-precision", "0 to 2 dKH")
refused("negative pH precision", ["chem", "--alkalinity", "8.2", "--ph", "8.1", "--ph-scale", "nbs",
                                  "--ph-precision", "-0.1"], "--ph-precision", "0 to 0.5")
refused("DIC precision too large", ["chem", "--alkalinity", "8.2", "--dic", "2000", "--dic-precision", "5000"],
        "--dic-precision", "0 to 1000")
refused("precision without its input", ["chem", "--alkalinity", "8.2", "--dic", "2000", "--ph-precision", "0.1"],
        "--ph-precision", "--ph")

print(f"{passed} passed, {failed} failed")
sys.exit(1 if failed else 0)
