#!/usr/bin/python3
"""The journal's files as a user meets them: an old JSON journal opens without loss (read in
place; copied into FILE.db on the first change, the JSON file byte for byte untouched, and
the user told); a journal reached through a symbolic link is written through it (the link
stays a link); a read-only journal is refused for changes with one clear line and still
reads; backup, restore and the integrity check work and say what they did; a damaged file is
reported, not overwritten; no temporary file is left anywhere.
Usage: check_store_files.py <tidewright binary>."""
import json
import os
import stat
import subprocess
import sys
import tempfile

binary = os.path.abspath(sys.argv[1])
root = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
demo = os.path.join(root, "assets", "demo", "demo_journal.json")
passed = failed = 0


def check(name, ok, detail=""):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print(f"FAIL {name} {detail}")


def run(*args, cwd):
    return subprocess.run([binary, *args], capture_output=True, cwd=cwd)


def export(journal, cwd):
    r = run("log", "--journal", journal, "export", "--format", "json", cwd=cwd)
    return json.loads(r.stdout) if r.returncode == 0 else None


with tempfile.TemporaryDirectory() as d:
    # An old JSON journal: reading creates nothing; the first change imports it and says so.
    original = open(demo, "rb").read()
    with open(os.path.join(d, "old.json"), "wb") as f:
        f.write(original)
    doc = json.loads(original)
    r = run("log", "--journal", "old.json", "list", "--last", "5", cwd=d)
    check("list of a JSON journal", r.returncode == 0 and len(r.stdout.splitlines()) == 5, r.stderr)
    r = run("demand", "--journal", "old.json", "--system", "1", cwd=d)
    check("demand of a JSON journal", r.returncode == 0 and b"demand" in r.stdout, r.stderr)
    check("reading a JSON journal creates no file", sorted(os.listdir(d)) == ["old.json"], os.listdir(d))
    r = run("log", "--journal", "old.json", "add", "note", "--system", "1", "--text", "first entry in the database", cwd=d)
    err = r.stderr.decode()
    check("first change on a JSON journal", r.returncode == 0, err)
    check("the user is told where the journal went", "old.db" in err and "kept unchanged" in err, err)
    check("the JSON journal is byte for byte untouched", open(os.path.join(d, "old.json"), "rb").read() == original)
    after = export("old.db", d)
    check("no history lost: every event and system is in the database",
          after is not None and after["events"][:-1] == doc["events"] and after["systems"] == doc["systems"]
          and len(after["events"]) == len(doc["events"]) + 1)
    r = run("log", "--journal", "old.json", "list", "--last", "1", cwd=d)
    check("--journal old.json now means old.db", b"first entry in the database" in r.stdout, r.stdout)

    # Backup, restore and the integrity check.
    r = run("log", "--journal", "old.db", "backup", "copy.db", cwd=d)
    check("backup to a database", r.returncode == 0 and b"backed up 3 systems" in r.stdout, r.stdout + r.stderr)
    r = run("log", "--journal", "old.db", "backup", "copy.json", cwd=d)
    check("backup to JSON", r.returncode == 0, r.stderr)
    check("the JSON backup is the export", json.load(open(os.path.join(d, "copy.json"))) == export("old.db", d))
    r = run("log", "--journal", "old.db", "backup", "copy.db", cwd=d)
    check("backup never overwrites", r.returncode != 0 and b"already exists" in r.stderr, r.stderr)
    before = export("old.db", d)
    r = run("log", "--journal", "old.db", "remove", "--id", str(before["events"][0]["id"]), cwd=d)
    check("remove an event", r.returncode == 0, r.stderr)
    r = run("log", "--journal", "old.db", "restore", "copy.db", cwd=d)
    check("restore from the database backup", r.returncode == 0 and b"kept in" in r.stdout, r.stdout + r.stderr)
    check("restore brings back every event", export("old.db", d) == before)
    r = run("log", "--journal", "old.db", "add", "note", "--system", "1", "--text", "x", cwd=d)
    r = run("log", "--journal", "old.db", "restore", "copy.json", cwd=d)
    check("restore from the JSON backup", r.returncode == 0 and export("old.db", d) == before, r.stderr)
    r = run("log", "--journal", "old.db", "check", cwd=d)
    demo_events = len(json.load(open(demo, encoding="utf-8"))["events"])
    check("check reports ok", r.returncode == 0 and b"ok:" in r.stdout and
          f"{demo_events + 1} events".encode() in r.stdout, r.stdout)  # the demo and the note added above
    r = run("log", "--journal", "old.db", "import", "copy.json", cwd=d)
    check("importing an export again adds nothing", r.returncode == 0 and b"imported 0 events" in r.stdout, r.stdout)

    # A JSON journal is read one event at a time: a bad record in the middle refuses the whole
    # import or restore, names the record, and changes nothing (no copy of the journal left either).
    bad = json.load(open(os.path.join(d, "copy.json"), encoding="utf-8"))
    middle = len(bad["events"]) // 2
    bad["events"][middle]["system_id"] = 999
    with open(os.path.join(d, "bad.json"), "w", encoding="utf-8") as f:
        json.dump(bad, f, indent=2)
    before = export("old.db", d)
    files_before = sorted(os.listdir(d))
    for command in ("import", "restore"):
        r = run("log", "--journal", "old.db", command, "bad.json", cwd=d)
        err = r.stderr.decode()
        check(f"{command} of a JSON journal with a bad record in the middle: refused and named",
              r.returncode != 0 and f"bad.json: events[{middle}]" in err and "nothing was" in err and err.count("\n") == 1, err)
        check(f"{command} of a JSON journal with a bad record: nothing changed",
              export("old.db", d) == before and sorted(os.listdir(d)) == files_before, sorted(os.listdir(d)))

    # A symbolic link: written through, still a link.
    os.mkdir(os.path.join(d, "real"))
    r = run("log", "--journal", "real/tank.db", "add", "system", "--name", "Nano", "--volume", "40", cwd=d)
    os.symlink("real/tank.db", os.path.join(d, "link.db"))
    r = run("log", "--journal", "link.db", "add", "note", "--text", "through the link", cwd=d)
    check("add through a symlink", r.returncode == 0, r.stderr)
    check("the link is still a link", os.path.islink(os.path.join(d, "link.db")))
    real = export("real/tank.db", d)
    check("the real journal has the entry", real is not None and real["events"][-1].get("text") == "through the link")

    # Read-only: refused with one clear line; still readable; nothing changed or created.
    ro = os.path.join(d, "real", "tank.db")
    os.chmod(ro, stat.S_IRUSR | stat.S_IRGRP | stat.S_IROTH)
    bytes_before = open(ro, "rb").read()
    r = run("log", "--journal", "real/tank.db", "add", "note", "--text", "refused", cwd=d)
    err = r.stderr.decode().strip()
    check("read-only journal: refused", r.returncode != 0 and "read-only" in err and err.count("\n") == 0, err)
    r = run("log", "--journal", "link.db", "list", cwd=d)
    check("read-only journal: still listed", r.returncode == 0 and b"through the link" in r.stdout, r.stderr)
    check("read-only journal: unchanged", open(ro, "rb").read() == bytes_before)
    check("read-only journal: nothing created beside it", sorted(os.listdir(os.path.join(d, "real"))) == ["tank.db"],
          os.listdir(os.path.join(d, "real")))
    os.chmod(ro, stat.S_IRUSR | stat.S_IWUSR)

    # A damaged database is reported, never overwritten.
    with open(os.path.join(d, "copy.db"), "r+b") as f:  # b-tree page headers of pages 3 to 40
        for page in range(2, 40):
            f.seek(4096 * page)
            f.write(b"\x0d\xff\xff\xff\xff\xff\xff\xff")
    damaged = open(os.path.join(d, "copy.db"), "rb").read()
    r = run("log", "--journal", "copy.db", "check", cwd=d)
    check("check finds the damage", r.returncode != 0 and (b"problem" in r.stdout or b"malformed" in r.stderr),
          r.stdout[-300:] + r.stderr)
    r = run("log", "--journal", "copy.db", "add", "note", "--system", "1", "--text", "x", cwd=d)
    check("a damaged database is not written", open(os.path.join(d, "copy.db"), "rb").read() == damaged)
    r = run("log", "--journal", "notes.txt", "list", cwd=d)
    check("a missing journal is named", r.returncode != 0 and b"notes.txt" in r.stderr, r.stderr)

    left = [f for f in os.listdir(d) + os.listdir(os.path.join(d, "real"))
            if ".tmp-" in f or f.endswith("-wal") or f.endswith("-shm")]
    check("no temporary files left", left == [], left)

print(f"{passed} passed, {failed} failed")
sys.exit(1 if failed else 0)
