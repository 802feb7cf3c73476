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


for sub in [[], ["chem"], ["salinity"], ["log"], ["log", "add", "test"], ["demand"], ["plan"], ["mix"], ["buffer"]]:
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

print(f"{passed} passed, {failed} failed")
sys.exit(1 if failed else 0)
