#!/usr/bin/python3
"""`log export --format json` honours --system, --parameter, --from and --to exactly as the
CSV export does (issue 14): the same tests, notes and doses, only the chosen system, and the
result reads back as a journal. Usage: check_export_filters.py <tidewright>. Prints
"N passed, M failed"."""
import csv
import io
import json
import os
import subprocess
import sys
import tempfile

from cli_check import binary, check, finish, run


with tempfile.TemporaryDirectory() as tmp:
    db = os.path.join(tmp, "j.db")
    log = ["log", "--journal", db]
    run(*log, "add", "system", "--name", "Reef", "--volume", "300")
    run(*log, "add", "system", "--name", "Rack", "--volume", "800")
    for day in range(1, 7):
        for system in ("Reef", "Rack"):
            run(*log, "add", "test", "--system", system, "--parameter", "alkalinity", "--value", "8",
                "--time", f"2026-03-0{day}T08:00Z")
            run(*log, "add", "test", "--system", system, "--parameter", "calcium", "--value", "420",
                "--time", f"2026-03-0{day}T08:05Z")
        run(*log, "add", "note", "--system", "Reef", "--text", f"day {day}", "--time", f"2026-03-0{day}T09:00Z")

    def key_of_csv(row):
        return (row["time"], row["system"], row["type"], row["parameter"], row["note"])

    for filters in [["--system", "Reef"], ["--parameter", "calcium"], ["--from", "2026-03-04"],
                    ["--to", "2026-03-02"], ["--system", "Rack", "--parameter", "alkalinity", "--from", "2026-03-03"]]:
        name = " ".join(filters)
        c = run(*log, "export", *filters)
        j = run(*log, "export", "--format", "json", *filters)
        check(f"{name}: both run", c.returncode == 0 and j.returncode == 0, c.stderr + j.stderr)
        rows = list(csv.DictReader(io.StringIO(c.stdout.decode())))
        doc = json.loads(j.stdout)
        names = {s["id"]: s["name"] for s in doc["systems"]}
        from_json = []
        for e in doc["events"]:
            from_json.append((e.get("time"), names.get(e["system_id"]), e["type"], e.get("parameter", ""),
                              e.get("text", "")))
        check(f"{name}: same number of events", len(rows) == len(doc["events"]), (len(rows), len(doc["events"])))
        check(f"{name}: same systems, types and parameters",
              sorted(k[1:] for k in map(key_of_csv, rows)) == sorted(k[1:] for k in from_json),
              (rows[:2], from_json[:2]))
        if "--system" in filters:
            check(f"{name}: only that system", list(names.values()) == [filters[1]], names)
        back = os.path.join(tmp, "back.db")
        if os.path.exists(back):
            os.remove(back)
        path = os.path.join(tmp, "f.json")
        with open(path, "wb") as f:
            f.write(j.stdout)
        r = run("log", "--journal", back, "import", path)
        check(f"{name}: reads back as a journal", r.returncode == 0, r.stderr)

finish()
