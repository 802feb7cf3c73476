#!/usr/bin/python3
"""Edit and undo (issue 14): `log edit event|system` changes only the fields given, through
the same checks as `log add` (a refusal names the option and the rule and changes nothing);
every add, edit and remove is recorded so `log undo` reverts the last one; an older database
(schema version 2) migrates and then records its changes; advice after a damaged journal names
a backup only when one exists. Usage: check_edit_undo.py <tidewright>. Prints "N passed,
M failed"."""
import json
import os
import sqlite3
import subprocess
import sys
import tempfile

from cli_check import binary, check, finish, run
here = os.path.dirname(os.path.abspath(__file__))


def refused(name, args, *words, same_as=None, log=None):
    r = run(*args)
    err = r.stderr.decode().strip()
    check(f"{name}: refused", r.returncode != 0 and err.count("\n") == 0, err)
    for w in words:
        check(f"{name}: says {w!r}", w in err, err)
    if same_as is not None:
        check(f"{name}: nothing changed", run(*log, "export", "--format", "json").stdout == same_as)


with tempfile.TemporaryDirectory() as tmp:
    db = os.path.join(tmp, "j.db")
    log = ["log", "--journal", db]
    run(*log, "add", "system", "--name", "Garage", "--volume", "100", "--volume-unit", "gal")
    run(*log, "add", "test", "--parameter", "alkalinity", "--value", "8.1", "--time", "2026-01-01T00:00Z")
    run(*log, "add", "water-change", "--volume", "5", "--time", "2026-01-01T01:00Z")
    run(*log, "add", "note", "--text", "first", "--time", "2026-01-01T02:00Z")
    start = run(*log, "export", "--format", "json").stdout

    r = run(*log, "edit", "event", "--id", "2", "--value", "7.6")
    check("edit a test's value", r.returncode == 0 and "test alkalinity 7.6 dKH" in r.stdout.decode(), r.stdout + r.stderr)
    r = run(*log, "edit", "event", "--id", "3", "--volume", "4")
    check("edit a water change in the system's unit", "water change 4.00 gal" in r.stdout.decode(), r.stdout + r.stderr)
    r = run(*log, "edit", "event", "--id", "4", "--text", " =1+2", "--time", "2026-01-01T03:00Z")
    check("edit a note's text and time", r.returncode == 0 and "03:00Z" in r.stdout.decode(), r.stdout + r.stderr)
    r = run(*log, "edit", "system", "--id", "1", "--volume", "120", "--name", " Big garage ")
    check("edit a system's volume and name", "Big garage (reef_display, 120.00 gal net" in r.stdout.decode(),
          r.stdout + r.stderr)
    r = run(*log, "--json", "edit", "system", "--id", "1", "--volume-unit", "L")
    check("edit a system's unit", r.returncode == 0 and json.loads(r.stdout)["system"]["units"]["volume"] == "L", r.stdout)

    now = run(*log, "export", "--format", "json").stdout
    refused("value out of range", [*log, "edit", "event", "--id", "2", "--value", "40"], "--value", "0 to 25 dKH",
            same_as=now, log=log)
    refused("volume of the wrong event", [*log, "edit", "event", "--id", "2", "--volume", "3"], "--volume", "is a test",
            same_as=now, log=log)
    refused("system smaller than a water change", [*log, "edit", "system", "--id", "1", "--volume", "5"],
            "--volume", "would no longer be valid", same_as=now, log=log)
    refused("name that reads as an id", [*log, "edit", "system", "--id", "1", "--name", "7"], "--name", "reads as the id 7",
            same_as=now, log=log)
    refused("blank name", [*log, "edit", "system", "--id", "1", "--name", "  "], "--name", "1 to 100",
            same_as=now, log=log)
    refused("no such event", [*log, "edit", "event", "--id", "99", "--value", "8"], "--id", "99", same_as=now, log=log)

    run(*log, "remove", "--id", "4")
    for expect in ["removed note 4", "edited system 1", "edited system 1", "edited note 4", "edited water_change 3",
                   "edited test 2"]:
        r = run(*log, "undo")
        check(f"undo: {expect}", r.returncode == 0 and expect in r.stdout.decode(), r.stdout + r.stderr)
    check("undo: back to the start", run(*log, "export", "--format", "json").stdout == start)
    for expect in ["added note 4", "added water_change 3", "added test 2", "added system 1"]:
        r = run(*log, "undo")
        check(f"undo: {expect}", r.returncode == 0 and expect in r.stdout.decode(), r.stdout + r.stderr)
    refused("nothing left to undo", [*log, "undo"], "undo", "no change to undo")

    # An import is not recorded: undo refuses to reach past what it added.
    run(*log, "add", "system", "--name", "Reef", "--volume", "300")
    run(*log, "add", "note", "--text", "before the import", "--time", "2026-02-01T00:00Z")
    rows = os.path.join(tmp, "rows.csv")
    with open(rows, "w") as f:
        f.write("time,type,parameter,value,unit\n2026-02-02T08:00Z,test,calcium,420,mg/L\n")
    r = run(*log, "import", rows, "--system", "Reef")
    check("import runs", r.returncode == 0, r.stderr)
    now = run(*log, "export", "--format", "json").stdout
    refused("undo after an import", [*log, "undo"], "undo", "import", same_as=now, log=log)

    # A database written by a build with schema version 2 migrates, keeps its records, and
    # records changes from then on.
    old = os.path.join(tmp, "old.db")
    con = sqlite3.connect(old)
    with open(os.path.join(here, "..", "unit", "store", "journal_schema_v2.sql")) as f:
        con.executescript(f.read())
    con.close()
    before = json.loads(run("log", "--journal", old, "export", "--format", "json").stdout)
    r = run("log", "--journal", old, "--json", "check")
    check("old database: migrated to version 4", r.returncode == 0 and json.loads(r.stdout)["schema_version"] == 4,
          r.stdout + r.stderr)
    after = json.loads(run("log", "--journal", old, "export", "--format", "json").stdout)
    check("old database: records kept", before["events"] == after["events"] and before["systems"] == after["systems"])
    refused("old database: nothing to undo yet", ["log", "--journal", old, "undo"], "no change to undo")
    sid = str(after["systems"][0]["id"])
    run("log", "--journal", old, "add", "note", "--system", sid, "--text", "after the update", "--time", "2026-01-05T00:00Z")
    r = run("log", "--journal", old, "undo")
    check("old database: a new change undone", r.returncode == 0 and "added note" in r.stdout.decode(), r.stderr)
    check("old database: as it was", json.loads(run("log", "--journal", old, "export", "--format", "json").stdout)["events"]
          == after["events"])

    # Advice after damage names a backup only when there is one.
    bad = os.path.join(tmp, "bad.db")
    with open(bad, "wb") as f:
        f.write(b"SQLite format 3\0" + b"x" * 200)
    out = run("log", "--journal", bad, "check").stdout.decode()
    check("no backup: says so", "no backup of this journal was found" in out and "restore" not in out, out)
    kept = os.path.join(tmp, "kept.db")
    klog = ["log", "--journal", kept]
    run(*klog, "add", "system", "--name", "Reef", "--volume", "100")
    spare = os.path.join(tmp, "spare.db")
    run(*klog, "backup", spare)
    run(*klog, "restore", spare)
    copies = [n for n in os.listdir(tmp) if n.startswith("kept.db.before-restore-")]
    refused("undo stops at a restore", [*klog, "undo"], "undo", "restore", *copies[:1])
    with open(kept, "wb") as f:
        f.write(b"SQLite format 3\0" + b"x" * 200)
    out = run(*klog, "check").stdout.decode()
    check("a backup exists: named", len(copies) == 1 and copies[0] in out and "restore" in out, (copies, out))

finish()
