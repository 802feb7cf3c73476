#!/usr/bin/python3
"""Generate the demo plan's iCalendar with the tidewright CLI and parse it with python3-icalendar
(an outside RFC 5545 parser): event count equals the plan's dose count (from --json), every hand
dose has a VALARM, lines are CRLF-terminated and at most 75 octets (RFC 5545 3.1); by default
only hand doses; UIDs differ between systems. Prints "N passed, M failed"."""
import json
import os
import subprocess
import sys
import tempfile

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


def ics_of(path, *extra):
    return subprocess.run([binary, "plan", path, "--ics", "--dtstamp", "20261201T120000Z", *extra], capture_output=True,
                          check=True).stdout


def lines_of(ics):
    return ics.split(b"\r\n")


plan = json.loads(subprocess.run([binary, "plan", demo, "--json"], capture_output=True, check=True).stdout)
hand_count = sum(1 for d in plan["doses"] if "hand" in json.dumps(d))
ics_all = ics_of(demo, "--ics-all-doses")
ics_hand = ics_of(demo)
for label, ics in [("all doses", ics_all), ("hand doses", ics_hand)]:
    lines = lines_of(ics)
    check(f"{label}: crlf", b"\n" not in ics.replace(b"\r\n", b""))
    # RFC 5545 3.1: a content line is at most 75 octets, excluding the line break.
    check(f"{label}: every line at most 75 octets", all(len(l) <= 75 for l in lines), max(len(l) for l in lines))
ics = ics_all
cal = icalendar.Calendar.from_ical(ics)
events = [c for c in cal.walk() if c.name == "VEVENT"]
check("event count (all doses)", len(events) == len(plan["doses"]), f"{len(events)} vs {len(plan['doses'])}")
check("uids unique", len({str(e["UID"]) for e in events}) == len(events))
check("dtstamp", all("DTSTAMP" in e for e in events))
hand = [e for e in events if "(hand)" in str(e["SUMMARY"])]
alarms = [e for e in events if any(s.name == "VALARM" for s in e.subcomponents)]
check("hand doses exist", len(hand) > 0)
check("alarm per hand dose", len(alarms) == len(hand), f"{len(alarms)} alarms, {len(hand)} hand doses")
check("unfolded text intact", all("total scale" in str(e["DESCRIPTION"]) for e in events))
hand_cal = icalendar.Calendar.from_ical(ics_hand)
hand_events = [c for c in hand_cal.walk() if c.name == "VEVENT"]
check("default: hand doses only", len(hand_events) == len(hand) and
      all("(hand)" in str(e["SUMMARY"]) for e in hand_events), f"{len(hand_events)} events, {len(hand)} hand doses")
check("default: fewer events than all doses", len(hand_events) < len(events))
# The same plan for a second system (its name with two-octet letters, so folds meet UTF-8): no UID in common.
with open(demo) as f:
    doc = json.load(f)
doc["system"]["name"] = "R\u00e9cif \u00e9tag\u00e8re " * 6
with tempfile.TemporaryDirectory() as d:
    other = os.path.join(d, "other.json")
    with open(other, "w") as f:
        json.dump(doc, f)
    ics_other = ics_of(other, "--ics-all-doses")
other_events = [c for c in icalendar.Calendar.from_ical(ics_other).walk() if c.name == "VEVENT"]
check("UIDs unique per system", not ({str(e["UID"]) for e in events} & {str(e["UID"]) for e in other_events}))
check("UTF-8 name: every line at most 75 octets", all(len(l) <= 75 for l in lines_of(ics_other)),
      max(len(l) for l in lines_of(ics_other)))
check("UTF-8 name: lines are whole UTF-8", all(l.decode("utf-8", "strict") is not None for l in lines_of(ics_other)))
check("UTF-8 name survives unfolding", "R\u00e9cif" in str(other_events[0]["DESCRIPTION"]))
bad = subprocess.run([binary, "plan", demo, "--ics", "--dtstamp", "yesterday"], capture_output=True)
check("bad dtstamp refused", bad.returncode != 0 and b"dtstamp" in bad.stderr)
print(f"{passed} passed, {failed} failed")
sys.exit(1 if failed else 0)
