#!/usr/bin/python3
"""Units in listings (issue 14): a gallon system lists water changes and top-offs in gallons
("water change 2.00 gal", not "7.57082 L"), a litre system in litres; JSON shows no float noise
(2300, not 2300.000000000001). Usage: check_volume_units.py <tidewright>. Prints "N passed,
M failed"."""
import json
import os
import re
import subprocess
import sys
import tempfile

from cli_check import binary, check, finish, run


noise = re.compile(r"\d\.\d*(0{8,}|9{8,})\d")
with tempfile.TemporaryDirectory() as tmp:
    db = os.path.join(tmp, "j.db")
    log = ["log", "--journal", db]
    run(*log, "add", "system", "--name", "Garage", "--volume", "607.6", "--volume-unit", "gal")
    run(*log, "add", "system", "--name", "Nano", "--volume", "60")
    r = run(*log, "add", "water-change", "--system", "Garage", "--volume", "2", "--time", "2026-01-01T00:00Z")
    check("add prints gallons", "water change 2.00 gal" in r.stdout.decode(), r.stdout + r.stderr)
    run(*log, "add", "top-off", "--system", "Garage", "--volume", "0.5", "--time", "2026-01-01T01:00Z")
    run(*log, "add", "water-change", "--system", "Nano", "--volume", "6", "--time", "2026-01-01T02:00Z")
    out = run(*log, "list").stdout.decode()
    check("list: water change in gal", "Garage                water change 2.00 gal" in out, out)
    check("list: top-off in gal", "top-off 0.50 gal plain" in out, out)
    check("list: no litres noise", "7.57082" not in out, out)
    check("list: litre system in L", "Nano                  water change 6 L" in out, out)
    out = run(*log, "systems").stdout.decode()
    check("systems: gallon volume", "607.60 gal net" in out, out)
    for what in (["export", "--format", "json"], ["--json", "list"], ["--json", "systems"]):
        text = run(*log, *what).stdout.decode()
        json.loads(text)
        check(f"{' '.join(what)}: no float noise", not noise.search(text), noise.search(text))
    doc = json.loads(run(*log, "export", "--format", "json").stdout)
    check("litres stored to 12 digits", doc["systems"][0]["volume_l"] == 2300.01619996, doc["systems"][0])

finish()
