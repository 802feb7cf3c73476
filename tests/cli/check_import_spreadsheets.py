#!/usr/bin/python3
"""`log import` meets spreadsheets where they are: each messy file of tests/cli/fixtures is
imported as a keeper would, with what it stores (or refuses) checked; --dry-run stores nothing;
local time, --time-zone and --utc-offset for times without a zone.
Usage: check_import_spreadsheets.py <tidewright binary>. Prints "N passed, M failed"."""
import json
import os
import subprocess
import sys
import tempfile

from cli_check import binary, check, finish, run_text
fixtures = os.path.join(os.path.dirname(os.path.abspath(__file__)), "fixtures")


def run(*args, env=None):
    e = dict(os.environ, TZ="UTC")
    if env:
        e.update(env)
    return run_text(*args, env=e)


def fresh():
    d = tempfile.mkdtemp()
    j = os.path.join(d, "j.db")
    run("log", "--journal", j, "add", "system", "--name", "Reef", "--volume", "300")
    return j


def events(j):
    rc, out, _ = run("log", "--journal", j, "--json", "list")
    return json.loads(out) if rc == 0 else []


def tests_of(j):
    return [(e["time"], e["parameter"], e["value"], e["unit"]) for e in events(j) if e["type"] == "test"]


def fixture(name):
    return os.path.join(fixtures, name)


# Semicolons, decimal commas, day.month.year (25.10.2026 shows the order), units in headers.
j = fresh()
rc, out, err = run("log", "--journal", j, "import", fixture("semicolon_decimal_comma.csv"))
check("semicolon file imports", rc == 0, err)
check("says the separator it detected", "read as semicolon-separated" in out, out)
t = tests_of(j)
check("decimal comma 8,2 is 8.2 dKH", any(p == "alkalinity" and abs(v - 8.2) < 1e-9 and u == "dKH" for _, p, v, u in t), t)
check("Calcium (mg/L) read", any(p == "calcium" and v == 430 for _, p, v, u in t), t)
check("25.10.2026 is 25 October", any(tm.startswith("2026-10-25T08:00") for tm, *_ in t), t)
check("Notes column becomes a note", any(e.get("note", {}) == {"text": "after the water change"} or
                                         "after the water change" in json.dumps(e) for e in events(j)), events(j))
check("the date order found is said", "day/month/year" in out, out)
check("9 events", "imported 9 events" in out, out)

# BOM + CRLF + units after the names (Ca_mg_l, alk meq/L, Temp (F), pH total).
j = fresh()
rc, out, err = run("log", "--journal", j, "import", fixture("bom_crlf_units.csv"))
check("BOM/CRLF file imports", rc == 0 and "imported 8 events" in out, out + err)
t = tests_of(j)
check("alk meq/L kept in meq/L for the core's conversion", ("2026-11-01T09:00:00Z", "alkalinity", 2.9, "meq/L") in
      [(a, b, c, d) for a, b, c, d in t], t)
check("Temp (°F) in F", any(p == "temperature" and u == "F" and v == 77.0 for _, p, v, u in t), t)
check("no BOM in the first header", "\ufeff" not in out + err, out + err)

# Ambiguous d/m/y: refused row by row until the user says dmy; then 3 April etc.
j = fresh()
rc, out, err = run("log", "--journal", j, "import", fixture("dmy_ambiguous.csv"))
check("ambiguous dates refused (exit 3)", rc == 3 and "ambiguous" in err and "dmy" in err, err)
check("nothing stored from ambiguous rows", tests_of(j) == [])
rc, out, err = run("log", "--journal", j, "import", "--date-order", "dmy", fixture("dmy_ambiguous.csv"))
check("--date-order dmy imports", rc == 0, err)
check("03/04/2026 read as 3 April", any(tm.startswith("2026-04-03") for tm, *_ in tests_of(j)), tests_of(j))

# Blank rows and rows of bare separators: skipped and counted, not a failure.
j = fresh()
rc, out, err = run("log", "--journal", j, "import", fixture("blank_rows.csv"))
check("blank rows: exit 0", rc == 0, out + err)
check("blank rows counted", "3 blank rows" in out, out)
check("blank rows: 4 results", len(tests_of(j)) == 4, tests_of(j))

# Tab separated; every unused column named (never dropped silently while reporting success).
j = fresh()
rc, out, err = run("log", "--journal", j, "import", fixture("tab_unused_columns.tsv"))
check("tab file imports", rc == 0 and len(tests_of(j)) == 1, out + err)
check("Observer reported as not imported", "'Observer'" in out, out)
check("Calcium (furlongs) reported with the units accepted", "furlongs" in err and "mg/L" in err, err)
rc, out, err = run("log", "--journal", j, "--json", "import", fixture("tab_unused_columns.tsv"))
rep = json.loads(out)
check("JSON report lists unused columns", [u["column"] for u in rep["unused_columns"]] == ["Observer", "Calcium (furlongs)"], out)
check("second import: duplicates skipped", rep["duplicates_skipped"] == 2 and rep["added"] == 0, out)

# A column only the user can name: --map.
j = fresh()
rc, out, err = run("log", "--journal", j, "import", "--map", "Reading 1=alkalinity dKH", fixture("needs_mapping.csv"))
check("--map reads the column", rc == 0 and len(tests_of(j)) == 1 and tests_of(j)[0][2] == 8.4, out + err)
rc, out, err = run("log", "--journal", j, "import", "--map", "Nope=note", fixture("needs_mapping.csv"))
check("--map of a missing column refused naming --map", rc == 1 and "--map" in err and "'reading 1'" in err, err)

# Future rows refused exactly as log add refuses them; the others stored.
j = fresh()
rc, out, err = run("log", "--journal", j, "import", fixture("future_row.csv"))
check("future row refused (exit 3)", rc == 3 and "line 3" in err and "in the future" in err, err)
check("the past row stored", len(tests_of(j)) == 1, tests_of(j))
rc, _, err_add = run("log", "--journal", j, "add", "test", "--parameter", "alkalinity", "--value", "8",
                     "--time", "2099-01-01T08:00Z")
check("log add refuses with the same words", rc != 0 and "in the future" in err_add and "10 minutes" in err_add, err_add)
check("same rule: same range text", "accepted: up to 10 minutes after now" in err, err)

# --dry-run: prints the events, stores nothing; then the real import stores them.
j = fresh()
before = events(j)
rc, out, err = run("log", "--journal", j, "import", "--dry-run", fixture("semicolon_decimal_comma.csv"))
check("dry run exit 0", rc == 0, err)
check("dry run lists the events", out.count("would add") == 9 and "nothing was stored" in out, out)
check("dry run stores nothing", events(j) == before)
# With --json the events are written as the import finds them (memory flat for a farm's file):
# one object still, with every event and the same counts.
rc, out, err = run("log", "--journal", j, "import", "--dry-run", "--json", fixture("semicolon_decimal_comma.csv"))
try:
    dry = json.loads(out)
except ValueError as e:
    dry = {"error": str(e)}
check("dry run --json: one JSON object with every event", rc == 0 and len(dry.get("events", [])) == 9
      and dry.get("would_add") == 9 and dry.get("dry_run") is True, out)
check("dry run --json stores nothing", events(j) == before)
rc, out, err = run("log", "--journal", j, "import", "--dry-run", "--json", fixture("no_such_file.csv"))
check("dry run --json of a missing file: nothing on stdout, the reason on stderr", rc != 0 and out == ""
      and "no_such_file.csv" in err, (rc, out, err))

# Delimiter given by an option; a wrong one leaves no time column and says which separator.
j = fresh()
rc, out, err = run("log", "--journal", j, "import", "--delimiter", "comma", fixture("semicolon_decimal_comma.csv"))
check("--delimiter comma on a semicolon file: no time column, says comma", rc == 1 and "comma" in err, err)
rc, out, err = run("log", "--journal", j, "import", "--delimiter", "pipe", fixture("semicolon_decimal_comma.csv"))
check("--delimiter pipe refused with the choices", rc != 0 and "--delimiter" in err and "semicolon" in err, err)

# Times without a zone in a file: the machine's zone (Berlin in November: UTC+1), or --time-zone.
j = fresh()
rc, out, err = run("log", "--journal", j, "import", fixture("bom_crlf_units.csv"), env={"TZ": "Europe/Berlin"})
check("import: bare times read in the machine's zone", rc == 0 and tests_of(j)[0][0] == "2026-11-01T08:00:00Z", tests_of(j))
j = fresh()
rc, out, err = run("log", "--journal", j, "import", "--time-zone", "Asia/Kolkata", fixture("bom_crlf_units.csv"))
check("import: --time-zone Asia/Kolkata (UTC+5:30)", rc == 0 and tests_of(j)[0][0] == "2026-11-01T03:30:00Z", tests_of(j))
rc, out, err = run("log", "--journal", j, "import", "--utc-offset", "99999", fixture("bom_crlf_units.csv"))
check("import: --utc-offset 99999 refused, nothing added", rc == 1 and "--utc-offset" in err and len(tests_of(j)) == 8, err)
rc, out, err = run("log", "import", "--help")
check("import help says which zone a bare time is read in", "machine's time zone" in out, out)

# Time: the machine's zone by default, --time-zone NAME, --utc-offset validated.
j = fresh()
add = ["log", "--journal", j, "--json", "add", "test", "--parameter", "alkalinity", "--value", "8"]
rc, out, err = run(*add, "--time", "2026-07-01 08:00", env={"TZ": "Europe/Berlin"})
check("bare time read in the machine's zone (Berlin summer: UTC+2)", rc == 0 and '"2026-07-01T06:00:00Z"' in out, out + err)
rc, out, err = run(*add, "--time", "2026-01-01 08:00", "--time-zone", "America/New_York")
check("--time-zone America/New_York (winter: UTC-5)", rc == 0 and '"2026-01-01T13:00:00Z"' in out, out + err)
rc, out, err = run(*add, "--time", "2026-01-01 08:00", "--utc-offset", "+05:30")
check("--utc-offset +05:30", rc == 0 and '"2026-01-01T02:30:00Z"' in out, out + err)
rc, out, err = run(*add, "--time", "2026-01-01 08:00Z", "--time-zone", "Asia/Tokyo")
check("a written zone wins over --time-zone", rc == 0 and '"2026-01-01T08:00:00Z"' in out, out + err)
for bad in ["99999", "+14:30", "-13", "60"]:
    rc, out, err = run(*add, "--time", "2026-01-01 08:00", "--utc-offset", bad)
    check(f"--utc-offset {bad} refused with the range", rc == 1 and "--utc-offset" in err and "-12:00 to +14:00" in err, err)
rc, out, err = run(*add, "--time", "2026-01-01 08:00", "--time-zone", "Mars/Olympus")
check("unknown --time-zone refused naming it", rc == 1 and "--time-zone" in err and "Mars/Olympus" in err, err)
rc, out, err = run("log", "add", "test", "--help")
check("help says which zone a bare time is read in", "machine's time zone" in out, out)
check("nothing stored by the refusals", len(tests_of(j)) == 4, tests_of(j))

finish()
