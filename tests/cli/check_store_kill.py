#!/usr/bin/python3
"""A writer killed with SIGKILL at random moments never corrupts the journal database nor
loses a committed entry, and an import is all or nothing. Each round starts one writer
(`log add note`, or `log import` of 30 CSV rows, in turn) and kills it after a random delay
up to about its normal run time; then Python's sqlite3 checks the file (integrity_check and
foreign keys) and that every entry committed so far is there, and that each import is there
entirely or not at all. Usage: check_store_kill.py <tidewright binary>.
TW_KILL_ROUNDS (default 200) sets the number of rounds; the seed is printed for a rerun
(TW_KILL_SEED)."""
import os
import random
import signal
import sqlite3
import subprocess
import sys
import tempfile
import time

binary = os.path.abspath(sys.argv[1])
rounds = int(os.environ.get("TW_KILL_ROUNDS", "200"))
seed = int(os.environ.get("TW_KILL_SEED", str(random.SystemRandom().randrange(1 << 30))))
rng = random.Random(seed)
ROWS = 30
passed = failed = 0


def check(name, ok, detail=""):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print(f"FAIL {name} {detail}")


def command(i):
    if i % 2 == 0:
        return [binary, "log", "--journal", "j.db", "add", "note", "--system", "Reef", "--text", f"note {i}"]
    return [binary, "log", "--journal", "j.db", "import", f"batch{i}.csv"]


with tempfile.TemporaryDirectory() as d:
    r = subprocess.run([binary, "log", "--journal", "j.db", "add", "system", "--name", "Reef", "--volume", "300"],
                       capture_output=True, cwd=d)
    check("add system", r.returncode == 0, r.stderr)
    for i in range(1, rounds, 2):
        with open(os.path.join(d, f"batch{i}.csv"), "w") as f:
            f.write("time,note\n")
            for k in range(ROWS):
                f.write(f"2025-{1 + k % 12:02d}-{1 + k % 28:02d} {k % 24:02d}:{k % 60:02d},batch {i} row {k}\n")
    # How long a writer normally takes: the kills land anywhere from the start to the end.
    durations = {}
    for kind, i in (("add", rounds), ("import", rounds + 1)):
        if kind == "import":
            with open(os.path.join(d, f"batch{i}.csv"), "w") as f:
                f.write("time,note\n")
                for k in range(ROWS):
                    f.write(f"2024-{1 + k % 12:02d}-{1 + k % 28:02d} {k % 24:02d}:{k % 60:02d},timing row {k}\n")
        t = time.monotonic()
        subprocess.run(command(i), capture_output=True, cwd=d)
        durations[kind] = time.monotonic() - t
    committed_notes, committed_batches = {f"note {rounds}"}, set()
    killed = finished = 0
    for i in range(rounds):
        kind = "add" if i % 2 == 0 else "import"
        p = subprocess.Popen(command(i), cwd=d, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE)
        time.sleep(rng.uniform(0, 1.3 * durations[kind]))
        p.send_signal(signal.SIGKILL)
        rc = p.wait()
        err = p.stderr.read().decode().strip()
        p.stderr.close()
        if rc == 0:
            finished += 1
            if kind == "add":
                committed_notes.add(f"note {i}")
            else:
                committed_batches.add(i)
        elif rc == -signal.SIGKILL:
            killed += 1
        else:
            check(f"round {i}: the writer ends by itself with 0 or is killed", False, f"exit {rc}: {err}")
        db = sqlite3.connect(os.path.join(d, "j.db"))
        try:
            check(f"round {i}: integrity_check", db.execute("PRAGMA integrity_check").fetchone()[0] == "ok")
            check(f"round {i}: foreign keys", db.execute("PRAGMA foreign_key_check").fetchall() == [])
            notes = {t for (t,) in db.execute("SELECT note FROM events WHERE note LIKE 'note %'")}
            if kind == "add" and f"note {i}" in notes:
                committed_notes.add(f"note {i}")  # committed before the kill: it must stay
            missing = committed_notes - notes
            check(f"round {i}: every committed note is there", not missing, sorted(missing)[:3])
            if kind == "import":
                n = db.execute("SELECT count(*) FROM events WHERE note LIKE ?", (f"batch {i} row %",)).fetchone()[0]
                check(f"round {i}: the import is all or nothing", n in (0, ROWS), f"{n} of {ROWS} rows")
                if n == ROWS:
                    committed_batches.add(i)
            for b in committed_batches:
                n = db.execute("SELECT count(*) FROM events WHERE note LIKE ?", (f"batch {b} row %",)).fetchone()[0]
                if n != ROWS:
                    check(f"round {i}: committed import {b} is still whole", False, f"{n} rows")
        finally:
            db.close()
    r = subprocess.run([binary, "log", "--journal", "j.db", "check"], capture_output=True, cwd=d)
    check("log check after every kill says ok", r.returncode == 0 and b"ok:" in r.stdout, r.stdout + r.stderr)
    r = subprocess.run([binary, "log", "--journal", "j.db", "add", "note", "--system", "Reef", "--text", "after"],
                       capture_output=True, cwd=d)
    check("the journal takes new entries after the kills", r.returncode == 0, r.stderr)
    left = sorted(f for f in os.listdir(d) if not f.endswith(".csv"))
    check("no temporary files left", left == ["j.db"], left)

print(f"kill: {rounds} rounds (seed {seed}; add {durations['add']*1000:.0f} ms, import {durations['import']*1000:.0f} ms unkilled): {killed} writers killed mid-way, {finished} finished first; "
      f"{len(committed_notes)} notes and {len(committed_batches)} imports of {ROWS} rows committed and kept")
print(f"{passed} passed, {failed} failed")
sys.exit(1 if failed else 0)
