#!/usr/bin/python3
"""System names (issue 14): trimmed, not blank, no control characters, never an id; a refused
name changes nothing; an older journal with a name that reads as an id still opens, its id
wins when resolving, and `log check` notes it. Usage: check_system_names.py <tidewright>.
Prints "N passed, M failed"."""
import json
import os
import subprocess
import sys
import tempfile

from cli_check import binary, check, finish, run


with tempfile.TemporaryDirectory() as tmp:
    db = os.path.join(tmp, "j.db")
    log = ["log", "--journal", db]
    r = run(*log, "add", "system", "--name", "  Frag tank  ", "--volume", "200")
    check("trimmed name accepted", r.returncode == 0, r.stderr)
    r = run(*log, "--json", "systems")
    names = [s["name"] for s in json.loads(r.stdout)]
    check("stored trimmed", names == ["Frag tank"], names)

    for bad, words in [("   ", ["name", "1 to 100"]), ("2", ["name", "reads as the id 2"]),
                       (" 7 ", ["name", "reads as the id 7"]), ("#3", ["name", "id 3"]),
                       ("a\nb", ["name", "control character"]), ("a\tb", ["name", "control character"]),
                       (" frag TANK", ["name", "already used"])]:
        before = run(*log, "export", "--format", "json").stdout
        r = run(*log, "add", "system", "--name", bad, "--volume", "100")
        err = r.stderr.decode().strip()
        check(f"{bad!r} refused", r.returncode != 0 and err.count("\n") == 0, err)
        for w in words:
            check(f"{bad!r}: says {w!r}", w in err, err)
        check(f"{bad!r}: journal unchanged", run(*log, "export", "--format", "json").stdout == before)

    # An older journal (JSON, written before the rule) with a system named "2" beside id 2.
    seed = os.path.join(tmp, "seed.db")
    run("log", "--journal", seed, "add", "system", "--name", "Old one", "--volume", "100")
    run("log", "--journal", seed, "add", "system", "--name", "Reef", "--volume", "300")
    old = json.loads(run("log", "--journal", seed, "export", "--format", "json").stdout)
    old["systems"][0]["name"] = "2"
    path = os.path.join(tmp, "old.json")
    with open(path, "w") as f:
        json.dump(old, f)
    r = run("log", "--journal", path, "--json", "systems")
    check("older journal opens", r.returncode == 0, r.stderr)
    if r.returncode == 0:
        check("older name kept", [s["name"] for s in json.loads(r.stdout)] == ["2", "Reef"], r.stdout)
    olddb = os.path.join(tmp, "old.db")
    ologs = ["log", "--journal", path]
    r = run(*ologs, "add", "note", "--system", "2", "--text", "which one?", "--time", "2026-01-01T00:00Z")
    check("older journal: change accepted", r.returncode == 0, r.stderr)
    r = run("log", "--journal", olddb, "--json", "list", "--system", "2")
    ev = json.loads(r.stdout) if r.returncode == 0 else []
    check("id 2 wins over the name '2'", len(ev) == 1 and ev[0].get("system_id") == 2, r.stdout)
    r = run("log", "--journal", olddb, "check")
    out = r.stdout.decode()
    check("check stays ok", r.returncode == 0, out)
    check("check notes the older name", "note: system 1" in out and "reads as the id" in out, out)

finish()
