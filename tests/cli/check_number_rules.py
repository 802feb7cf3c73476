#!/usr/bin/python3
"""Issue 14's small refusals, as a user meets them: one number rule on the command line (no hex,
inf or nan), --value nan says "not a number", an empty --out is refused, mix --raise with and
without --grams-per-l, --dtstamp month 13, a refused dose prints its error first.
Usage: check_number_rules.py <tidewright binary>. Prints "N passed, M failed"."""
import os
import subprocess
import sys
import tempfile

from cli_check import binary, check, finish, run_text
demo_plan = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "..", "assets", "demo", "demo_plan.json")


run = run_text


def refused(name, args, *words, cwd=None):
    rc, out, err = run(*args, cwd=cwd)
    check(f"{name}: non-zero exit", rc != 0, f"exit {rc}")
    check(f"{name}: one line", err.strip().count("\n") == 0 and err.strip() != "", repr(err))
    for w in words:
        check(f"{name}: says {w!r}", w in err, repr(err))
    return out


chem = ["chem", "--ph", "8.1", "--ph-scale", "nbs"]
for bad in ["0x10", "inf", "-inf", "nan", "1e999", "8,2", " 8"]:
    refused(f"chem --alkalinity {bad!r}", [*chem, "--alkalinity", bad], "--alkalinity", "not a number")
rc, out, err = run(*chem, "--alkalinity", "8e0")
check("a plain exponent still reads", rc == 0, err)

d = tempfile.mkdtemp()
j = os.path.join(d, "j.db")
run("log", "--journal", j, "add", "system", "--name", "Reef", "--volume", "300")
refused("--value nan", ["log", "--journal", j, "add", "test", "--parameter", "alkalinity", "--value", "nan"],
        "--value", "not a number")
rc, out, err = run("log", "--journal", j, "add", "test", "--parameter", "alkalinity", "--value", "nan")
check("--value nan: no 'range is 0 to 0'", "0 to 0" not in err, err)
refused("--last 1e3", ["log", "--journal", j, "list", "--last", "1e3"], "--last", "whole number")

out = refused("chem --out ''", [*chem, "--alkalinity", "8", "--json", "--out", ""], "--out", "empty")
check("chem --out '': nothing printed as if it worked", out == "", out)
refused("log export --output ''", ["log", "--journal", j, "export", "--output", ""], "--output", "empty")

mix = ["mix", "--compound", "sodium_carbonate"]
err = refused("mix --raise 0", [*mix, "--raise", "0"], "--raise", "accepted range")
check("mix --raise 0 does not talk about --grams-per-l", "--grams-per-l" not in err, err)
refused("mix --raise with --grams-per-l", [*mix, "--raise", "0.1", "--grams-per-l", "50"], "--raise", "--grams-per-l",
        "not both")
rc, out, err = run(*mix, "--raise", "0.1")
check("mix --raise alone gives a recipe", rc == 0 and "dissolve" in out, err)

refused("--dtstamp month 13", ["plan", demo_plan, "--ics", "--dtstamp", "20261301T120000Z"], "--dtstamp", "month 01 to 12")
rc, out, err = run("plan", demo_plan, "--ics", "--dtstamp", "20261231T235959Z")
check("--dtstamp 31 December is fine", rc == 0 and "DTSTAMP:20261231T235959Z" in out, err)

# A refused dose: the error is the first line on stderr, no caution lines before it.
rc, out, err = run("log", "--journal", j, "add", "dose", "--additive", "sodium_hydroxide", "--amount", "-5", "--unit", "g")
first = err.splitlines()[0] if err else ""
check("refused dose: exit 1", rc == 1, err)
check("refused dose: its error first", first.startswith("tidewright:") and "amount" in first, repr(err))
check("refused dose: no caution lines", "caution" not in err, repr(err))
rc, out, err = run("log", "--journal", j, "add", "dose", "--additive", "sodium_hydroxide", "--amount", "5", "--unit", "g")
check("accepted caustic dose still warns after it is added", rc == 0 and "added" in out and "caution" in err, out + err)

finish()
