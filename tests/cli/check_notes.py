#!/usr/bin/python3
"""Notes (issue 14): a leading space is kept (a neutralised " =1+2" stays " =1+2") through add,
list, CSV export and JSON export and import; a multi-line note is one escaped line in
`log list`. Usage: check_notes.py <tidewright>. Prints "N passed, M failed"."""
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
    run(*log, "add", "system", "--name", "Reef", "--volume", "100")
    r = run(*log, "add", "note", "--text", " =1+2", "--time", "2026-01-01T00:00Z")
    check("add keeps the space", r.returncode == 0 and "note:  =1+2" in r.stdout.decode(), r.stdout + r.stderr)
    run(*log, "add", "note", "--text", "line one\nline two\tend", "--time", "2026-01-02T00:00Z")
    r = run(*log, "list")
    lines = r.stdout.decode().splitlines()
    check("list: one line per event", len(lines) == 2, lines)
    check("list: leading space kept", any(l.endswith("note:  =1+2") for l in lines), lines)
    check("list: line break escaped", any(l.endswith("note: line one\\nline two\\tend") for l in lines), lines)
    r = run(*log, "--json", "list")
    texts = [e["text"] for e in json.loads(r.stdout)]
    check("list --json: texts as stored", texts == [" =1+2", "line one\nline two\tend"], texts)
    rows = list(csv.DictReader(io.StringIO(run(*log, "export").stdout.decode())))
    check("CSV export: cell keeps the space", rows and rows[0]["note"] == " =1+2", rows[:1])
    check("CSV export: line break kept in the quoted cell", len(rows) == 2 and rows[1]["note"] == "line one\nline two\tend", rows)
    exported = os.path.join(tmp, "e.json")
    run(*log, "export", "--format", "json", "--output", exported)
    other = os.path.join(tmp, "k.db")
    r = run("log", "--journal", other, "import", exported)
    check("JSON import runs", r.returncode == 0, r.stderr)
    texts = [e["text"] for e in json.loads(run("log", "--journal", other, "--json", "list").stdout)]
    check("JSON export/import: texts as stored", texts == [" =1+2", "line one\nline two\tend"], texts)
    # CSV round trip: the export's cell comes back with its space (the import trimmed it).
    csv_file = os.path.join(tmp, "e.csv")
    run(*log, "export", "--output", csv_file)
    third = os.path.join(tmp, "c.db")
    run("log", "--journal", third, "add", "system", "--name", "Reef", "--volume", "100")
    r = run("log", "--journal", third, "import", csv_file, "--system", "Reef")
    check("CSV import runs", r.returncode == 0, r.stdout + r.stderr)
    texts = [e["text"] for e in json.loads(run("log", "--journal", third, "--json", "list").stdout)]
    check("CSV export/import: texts as stored", texts == [" =1+2", "line one\nline two\tend"], texts)

finish()
