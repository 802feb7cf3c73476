#!/usr/bin/python3
"""The journal database under concurrent use, as a farm's scripts and people would meet it:
20 processes adding entries and importing CSV files into one journal at the same moment lose
nothing (every command exits 0, and the count and every note's text are checked afterwards,
through the program's own JSON export and through Python's sqlite3), and `log check` reports
the database sound. Usage: check_store_concurrency.py <tidewright binary>.
TW_CONCURRENT_ADDS (default 4) sets how many entries each adding process writes in a row."""
import json
import os
import sqlite3
import subprocess
import sys
import tempfile
import threading

binary = os.path.abspath(sys.argv[1])
adds_each = int(os.environ.get("TW_CONCURRENT_ADDS", "4"))
passed = failed = 0


def check(name, ok, detail=""):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print(f"FAIL {name} {detail}")


def run(*args, cwd):
    return subprocess.run([binary, "log", "--journal", "farm.db", *args], capture_output=True, cwd=cwd)


ADDERS, IMPORTERS, ROWS = 14, 6, 50
with tempfile.TemporaryDirectory() as d:
    for name in ("Rack A", "Rack B"):
        r = run("add", "system", "--name", name, "--volume", "800", cwd=d)
        check(f"add system {name}", r.returncode == 0, r.stderr)
    for i in range(IMPORTERS):
        with open(os.path.join(d, f"batch{i}.csv"), "w") as f:
            f.write("time,system,note\n")
            for k in range(ROWS):
                f.write(f"2026-0{1 + i % 9}-{1 + k % 28:02d} {k % 24:02d}:{i:02d},Rack B,import {i} row {k}\n")

    results = []
    lock = threading.Lock()

    def adder(i):
        for k in range(adds_each):
            r = run("add", "note", "--system", "Rack A", "--text", f"adder {i} entry {k}", cwd=d)
            with lock:
                results.append((f"adder {i} entry {k}", r))

    def importer(i):
        r = run("import", f"batch{i}.csv", cwd=d)
        with lock:
            results.append((f"import {i}", r))

    threads = [threading.Thread(target=adder, args=(i,)) for i in range(ADDERS)]
    threads += [threading.Thread(target=importer, args=(i,)) for i in range(IMPORTERS)]
    for t in threads:
        t.start()
    for t in threads:
        t.join()
    for what, r in results:
        check(f"{what} exits 0", r.returncode == 0, r.stderr.decode().strip())

    expected = {f"adder {i} entry {k}" for i in range(ADDERS) for k in range(adds_each)}
    expected |= {f"import {i} row {k}" for i in range(IMPORTERS) for k in range(ROWS)}
    r = run("export", "--format", "json", cwd=d)
    check("export after the rush", r.returncode == 0, r.stderr)
    doc = json.loads(r.stdout) if r.returncode == 0 else {"events": []}
    texts = [e.get("text") for e in doc["events"]]
    check("count: every entry of every process is there, once", len(texts) == len(expected) and set(texts) == expected,
          f"{len(texts)} events, {len(set(texts) & expected)} of {len(expected)} expected texts")
    ids = [e["id"] for e in doc["events"]]
    check("ids are unique", len(ids) == len(set(ids)))
    check("next_id is above every id", doc.get("next_id", 0) > max(ids or [0]))
    db = sqlite3.connect(os.path.join(d, "farm.db"))
    rows = db.execute("SELECT note FROM events").fetchall()
    check("sqlite3 sees the same entries", sorted(t for (t,) in rows) == sorted(expected))
    check("sqlite3 integrity_check", db.execute("PRAGMA integrity_check").fetchone()[0] == "ok")
    db.close()
    r = run("check", cwd=d)
    check("log check says ok", r.returncode == 0 and b"ok:" in r.stdout, r.stdout + r.stderr)
    left = sorted(f for f in os.listdir(d) if not f.endswith(".csv"))
    check("nothing left beside the journal", left == ["farm.db"], left)

print(f"concurrency: {ADDERS} adding processes x {adds_each} entries + {IMPORTERS} importing processes x {ROWS} rows at once")
print(f"{passed} passed, {failed} failed")
sys.exit(1 if failed else 0)
