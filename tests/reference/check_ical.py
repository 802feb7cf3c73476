#!/usr/bin/python3
"""Generate the demo plan's iCalendar with the tidewright CLI and parse it with python3-icalendar
(an outside RFC 5545 parser): event count equals the plan's dose count (from --json), every hand
dose has a VALARM, lines are CRLF-terminated and at most 75 octets. Prints "N passed, M failed"."""
import json
import os
import subprocess
import sys

import icalendar

binary = sys.argv[1]
demo = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "..", "assets", "demo", "demo_plan.json")
passed = failed = 0


def check(name, ok, detail=""):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print(f"FAIL {name} {detail}")


ics = subprocess.run([binary, "plan", demo, "--ics", "--dtstamp", "20261201T120000Z"], capture_output=True, check=True).stdout
plan = json.loads(subprocess.run([binary, "plan", demo, "--json"], capture_output=True, check=True).stdout)
lines = ics.split(b"\r\n")
check("crlf", b"\n" not in ics.replace(b"\r\n", b""))
check("fold<=75", all(len(l) <= 75 for l in lines), max(len(l) for l in lines))
cal = icalendar.Calendar.from_ical(ics)
events = [c for c in cal.walk() if c.name == "VEVENT"]
check("event count", len(events) == len(plan["doses"]), f"{len(events)} vs {len(plan['doses'])}")
check("uids unique", len({str(e["UID"]) for e in events}) == len(events))
check("dtstamp", all("DTSTAMP" in e for e in events))
hand = [e for e in events if "(hand)" in str(e["SUMMARY"])]
alarms = [e for e in events if any(s.name == "VALARM" for s in e.subcomponents)]
check("hand doses exist", len(hand) > 0)
check("alarm per hand dose", len(alarms) == len(hand), f"{len(alarms)} alarms, {len(hand)} hand doses")
check("unfolded text intact", all("total scale" in str(e["DESCRIPTION"]) for e in events))
bad = subprocess.run([binary, "plan", demo, "--ics", "--dtstamp", "yesterday"], capture_output=True)
check("bad dtstamp refused", bad.returncode != 0 and b"dtstamp" in bad.stderr)
print(f"{passed} passed, {failed} failed")
sys.exit(1 if failed else 0)
