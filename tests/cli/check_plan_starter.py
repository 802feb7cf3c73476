#!/usr/bin/python3
"""A plan input without hand-written JSON (issue 14): `plan --starter FILE --journal J --system S`
writes a commented plan input from the system's journal (levels and consumption by the core's
rule, the running schedules as the additives); `plan FILE` and the command written in its
comments make a plan from it; bad uses are refused on one line naming the option.
Usage: check_plan_starter.py <tidewright>. Prints "N passed, M failed"."""
import os
import re
import shlex
import tempfile
import time

from cli_check import binary, check, finish, run, run_text


def stamp(seconds_ago):
    return time.strftime("%Y-%m-%dT%H:%MZ", time.gmtime(time.time() - seconds_ago))


DAY = 86400
with tempfile.TemporaryDirectory() as tmp:
    db = os.path.join(tmp, "farm journal.db")  # a space: the written command must quote it
    log = ["log", "--journal", db]
    run(*log, "add", "system", "--name", "Frag rack 3", "--volume", "250")
    # Invented readings: alkalinity falling about 0.3 dKH a day against a small pump schedule.
    for days, alk, ca in ((6, 8.6, 440), (4, 8.1, 436), (2, 7.7, 431), (0.1, 7.3, 427)):
        run(*log, "add", "test", "--parameter", "alkalinity", "--value", str(alk), "--time", stamp(days * DAY))
        run(*log, "add", "test", "--parameter", "calcium", "--value", str(ca), "--time", stamp(days * DAY + 60))
    run(*log, "add", "test", "--parameter", "magnesium", "--value", "1310", "--time", stamp(DAY))
    r = run(*log, "schedule", "start", "--device", "left doser", "--additive", "sodium_carbonate", "--amount", "2",
            "--unit", "mL", "--stock-g-per-l", "90", "--per-day", "8", "--time", stamp(7 * DAY))
    check("setup: schedule started", r.returncode == 0, r.stderr)

    starter = os.path.join(tmp, "start.json")
    code, out, err = run_text("plan", "--starter", starter, "--journal", db, "--system", "Frag rack 3")
    check("starter written", code == 0 and os.path.exists(starter), err)
    check("starter says where it wrote", "wrote" in err and "Frag rack 3" in err, err)
    text = open(starter).read() if os.path.exists(starter) else ""
    comments = [l for l in text.splitlines() if l.startswith("//")]
    check("starter opens with comments", text.startswith("// Plan input for \"Frag rack 3\""), text[:200])
    check("comments name the schedule as the source", any("schedules running now" in l for l in comments), comments)
    check("comments say where the alkalinity came from", any("alkalinity" in l.lower() for l in comments), comments)
    check("the schedule's device is the delivery", '"left doser"' in text, text)
    check("the schedule's strength is kept", re.search(r'"grams_per_l":\s*90', text) is not None, text)
    check("the system's volume", re.search(r'"volume_l":\s*250', text) is not None, text)

    # The plan from the numbers as written, and from the journal again.
    code, out, err = run_text("plan", starter)
    check("plan from the starter as written", code in (0, 3) and "day" in out.lower(), err)
    code, out, err = run_text("plan", starter, "--journal", db, "--system", "Frag rack 3")
    check("plan from the starter with --journal", code in (0, 3) and "state and demand from the journal" in out, err + out)

    # --at: the journal read as at a moment, not now: the same moment gives the same plan, an
    # earlier one (before the last day's tests) other levels; a time that is not one is refused.
    at = stamp(DAY // 2)
    first = run_text("plan", starter, "--journal", db, "--system", "Frag rack 3", "--json", "--at", at)
    again = run_text("plan", starter, "--journal", db, "--system", "Frag rack 3", "--json", "--at", at)
    check("--at: the same moment, the same plan", first[0] in (0, 3) and first[1] == again[1], first[2])
    earlier = run_text("plan", starter, "--journal", db, "--system", "Frag rack 3", "--json", "--at", stamp(3 * DAY))
    check("--at: an earlier moment, other levels", earlier[0] in (0, 3) and earlier[1] != first[1], earlier[2])
    code, out, err = run_text("plan", starter, "--journal", db, "--system", "Frag rack 3", "--at", "2026-02-30T08:00Z")
    check("--at: a date that does not exist is refused naming --at", code != 0 and err.startswith("tidewright: --at:"), err)

    # The command in the comments runs as written (path with a space quoted).
    cmd = next((l.split("//", 1)[1].strip() for l in comments if "--journal" in l and "tidewright plan" in l), "")
    args = shlex.split(cmd)
    check("comment gives a runnable command", args[:2] == ["tidewright", "plan"], cmd)
    if args[:2] == ["tidewright", "plan"]:
        r = run(*args[1:])
        check("the comment's command makes a plan", r.returncode in (0, 3), r.stderr.decode())

    # To stdout.
    code, out, err = run_text("plan", "--starter", "-", "--journal", db, "--system", "1")
    check("starter to stdout", code == 0 and out.startswith("//") and '"additives"' in out, err)

    # A system with nothing logged: the starting pair, targets as levels.
    run(*log, "add", "system", "--name", "Empty QT", "--volume", "40")
    code, out, err = run_text("plan", "--starter", "-", "--journal", db, "--system", "Empty QT")
    check("empty system: starting pair", code == 0 and "starting pair" in out and "sodium_carbonate" in out, err)
    check("empty system: no test said", "no test in the journal" in out, out[:800])

    # Refusals: one line, naming the option; nothing written.
    def refused(name, args, *words):
        code, out, err = run_text(*args)
        line = err.strip()
        check(f"{name}: refused", code != 0 and line.count("\n") == 0, err)
        for w in words:
            check(f"{name}: says {w!r}", w in line, line)

    other = os.path.join(tmp, "other.json")
    refused("starter without journal", ["plan", "--starter", other], "--starter", "--journal")
    refused("starter of an unknown system", ["plan", "--starter", other, "--journal", db, "--system", "Nope"], "Nope")
    check("nothing written for a refusal", not os.path.exists(other))
    refused("starter and an input file", ["plan", starter, "--starter", other, "--journal", db, "--system", "1"],
            "--starter")
    refused("no input at all", ["plan"], "input", "--starter")
    refused("starter to an empty path", ["plan", "--starter", "", "--journal", db, "--system", "1"], "--starter")

finish()
