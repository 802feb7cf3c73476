#!/usr/bin/python3
"""Estimates that know what they do not know (issue 14), on the command line: a parameter whose
last test is beyond its useful horizon is reported stale with its date, not estimated, and
`plan --journal` refuses it unless --accept-stale; no level, forecast or band is ever below
zero, even a year ahead; the Ca:alkalinity reading says "inconclusive" when the data cannot
tell; outliers are summarised on one line and listed with --outliers; doses after the last test
with no known strength are named, not dropped silently.
Usage: check_estimates.py <tidewright>. Prints "N passed, M failed"."""
import json
import os
import tempfile
import time

from cli_check import check, finish, run, run_text

DAY = 86400
NOW = time.time()


def stamp(days_ago):
    return time.strftime("%Y-%m-%dT%H:%MZ", time.gmtime(NOW - days_ago * DAY))


def date(days_ago):
    return time.strftime("%Y-%m-%d", time.gmtime(NOW - days_ago * DAY))


with tempfile.TemporaryDirectory() as tmp:
    db = os.path.join(tmp, "j.db")
    log = ["log", "--journal", db]
    # Invented data. "Old calcium": calcium last tested 900 days ago, alkalinity tested daily.
    run(*log, "add", "system", "--name", "Old calcium", "--volume", "200")
    for days, ca in ((905, 430), (900, 410)):
        run(*log, "add", "test", "--system", "Old calcium", "--parameter", "calcium", "--value", str(ca),
            "--time", stamp(days))
    for k in range(8):
        run(*log, "add", "test", "--system", "Old calcium", "--parameter", "alkalinity",
            "--value", f"{9.0 - 0.25 * k:.2f}", "--time", stamp(8 - k))

    code, out, err = run_text("demand", "--journal", db, "--system", "Old calcium", "--days", "365")
    check("demand runs", code == 0, err)
    ca_line = next((l for l in out.splitlines() if l.strip().startswith("calcium")), "")
    check("old calcium is stale, with its date", "stale" in ca_line and date(900) in ca_line, ca_line)
    check("old calcium is not estimated", "demand" not in ca_line and "level" not in ca_line, ca_line)
    code, out, err = run_text("demand", "--journal", db, "--system", "Old calcium", "--days", "365", "--json")
    doc = json.loads(out) if code == 0 else {"systems": []}
    params = doc["systems"][0]["parameters"] if doc["systems"] else {}
    check("JSON marks calcium stale", params.get("calcium", {}).get("stale") is True, params.get("calcium"))
    forecast = params.get("alkalinity", {}).get("forecast", [])
    check("a year of alkalinity forecast", len(forecast) == 365, len(forecast))
    lows = [min(p.get("level", 0), p.get("low95", 0)) for p in forecast]
    check("no forecast level or band below zero, a year ahead", forecast and min(lows) >= 0.0, min(lows) if lows else None)
    check("the falling alkalinity does reach zero (the bound is what holds it)",
          forecast and min(p.get("level", 1) for p in forecast) == 0.0, forecast[-1] if forecast else None)

    # plan --journal refuses the stale calcium unless told.
    plan_in = os.path.join(tmp, "plan.json")
    with open(plan_in, "w") as f:
        json.dump({"additives": [{"compound": "sodium_carbonate"}]}, f)
    code, out, err = run_text("plan", plan_in, "--journal", db, "--system", "Old calcium")
    check("plan refuses the stale level", code == 1 and "calcium" in err and "--accept-stale" in err, err)
    check("plan's refusal is one line", err.strip().count("\n") == 0, err)
    code, out, err = run_text("plan", plan_in, "--journal", db, "--system", "Old calcium", "--accept-stale")
    check("--accept-stale plans, and flags it", code in (0, 3) and "older than the 30-day horizon" in out, err)
    ca_basis = next((l for l in out.splitlines() if l.strip().startswith("calcium ") and "last test" in l), "")
    check("an accepted stale level is its last test's, not extrapolated to nothing",
          "stale (not carried to now)" in ca_basis and not ca_basis.strip().startswith("calcium 0 "), ca_basis)

    # "Noisy calcium": alkalinity falling, calcium flat within its kit's noise, one wild
    # alkalinity reading, and a dose of unknown strength after the last test.
    run(*log, "add", "system", "--name", "Noisy calcium", "--volume", "300")
    alk = [8.9, 8.7, 8.5, 8.3, 12.9, 7.9, 7.7, 7.5, 7.3, 7.1]
    ca = [425, 431, 418, 429, 421, 433, 419, 427, 424, 422]
    for k in range(10):
        t = 10 - k
        run(*log, "add", "test", "--system", "Noisy calcium", "--parameter", "alkalinity", "--value", str(alk[k]),
            "--time", stamp(t))
        run(*log, "add", "test", "--system", "Noisy calcium", "--parameter", "calcium", "--value", str(ca[k]),
            "--time", stamp(t - 0.01))
    r = run(*log, "add", "dose", "--system", "Noisy calcium", "--additive", "sodium_carbonate", "--amount", "20",
            "--unit", "mL", "--time", stamp(0.5))
    check("setup: a dose without its strength is logged", r.returncode == 0, r.stderr)

    code, out, err = run_text("demand", "--journal", db, "--system", "Noisy calcium")
    check("demand of the noisy system", code == 0, err)
    ratio = next((l for l in out.splitlines() if "Ca:alkalinity" in l), "")
    check("Ca:alkalinity says inconclusive", "Inconclusive" in ratio, ratio)
    check("Ca:alkalinity does not claim they fall together", "fall together" not in ratio, ratio)
    summary = [l for l in out.splitlines() if "flagged as outlier" in l]
    check("outliers summarised on one line", len(summary) == 1 and "--outliers lists them" in summary[0], out)
    check("the summary names the wild reading", summary and "12.9" in summary[0], summary)
    check("no outlier listed without --outliers", not any(l.strip().startswith("outlier ") for l in out.splitlines()))
    check("the unknown-strength dose is named", "leaves out 1 dose" in out, out)
    code, out, err = run_text("demand", "--journal", db, "--system", "Noisy calcium", "--outliers")
    listed = [l for l in out.splitlines() if l.strip().startswith("outlier ")]
    check("--outliers lists each flagged test", len(listed) >= 1 and date(6) in listed[0], out)
    code, out, err = run_text("demand", "--journal", db, "--system", "Noisy calcium", "--json")
    doc = json.loads(out) if code == 0 else {"systems": [{}]}
    sysj = doc["systems"][0]
    check("JSON: the ratio's verdict", sysj.get("calcium_alkalinity", {}).get("verdict") == "inconclusive",
          sysj.get("calcium_alkalinity"))
    check("JSON: outliers listed", len(sysj.get("parameters", {}).get("alkalinity", {}).get("outliers", [])) >= 1)

finish()
