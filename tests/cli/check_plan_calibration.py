#!/usr/bin/python3
"""A pump's calibration in the plan input (issue 15): "calibration" per additive is what the pump
delivers per amount set. The plan's doses stay what reaches the tank ("amount"); the outputs add
what to set on the pump ("amount_set" = amount / calibration) without moving the columns that
were there; --adopt writes the calibration into the schedules; out of 0.5..1.5 it is refused
naming the field and the range.
Usage: check_plan_calibration.py <tidewright>. Prints "N passed, M failed"."""
import csv
import io
import json
import os
import tempfile

from cli_check import check, finish, run, run_text

HERE = os.path.dirname(os.path.abspath(__file__))
with open(os.path.join(HERE, "..", "..", "assets", "demo", "demo_plan.json")) as f:
    DEMO = json.load(f)


def with_calibration(value):
    doc = json.loads(json.dumps(DEMO))
    doc["additives"][0]["calibration"] = value
    return doc


with tempfile.TemporaryDirectory() as tmp:
    def write(doc, name):
        path = os.path.join(tmp, name)
        with open(path, "w") as out:
            json.dump(doc, out)
        return path

    plain = write(DEMO, "plain.json")
    weak = write(with_calibration(0.9), "weak.json")

    code, out, err = run_text("plan", weak, "--json")
    check("plan with calibration 0.9 made", code in (0, 3), err)
    plan = json.loads(out) if out.startswith("{") else {}
    doses = plan.get("doses", [])
    pump1 = [d for d in doses if d["additive"].startswith("Alkalinity stock")]
    check("pump 1 doses", len(pump1) > 0, str(len(doses)))
    check("amount_set = amount / 0.9 on pump 1",
          all(abs(d["amount_set"] - d["amount"] / 0.9) < 1e-9 for d in pump1), str(pump1[:2]))
    others = [d for d in doses if not d["additive"].startswith("Alkalinity stock")]
    check("amount_set = amount on the true pumps", all(abs(d["amount_set"] - d["amount"]) < 1e-12 for d in others))
    check("pump 1 never set above its largest dose (15 mL)", all(d["amount_set"] <= 15 + 1e-9 for d in pump1),
          str(max((d["amount_set"] for d in pump1), default=0)))
    check("the input carries the calibration", plan.get("input", {}).get("additives", [{}])[0].get("calibration") == 0.9)
    check("the input of a true pump leaves it out",
          "calibration" not in json.loads(run_text("plan", plain, "--json")[1])["input"]["additives"][0])

    code, out, err = run_text("plan", weak, "--csv")
    rows = list(csv.reader(io.StringIO(out)))
    header = rows[0] if rows else []
    check("CSV keeps its columns and adds amount_set last",
          header[:5] == ["day", "time", "additive", "device", "amount"] and header[-1] == "amount_set", str(header))
    first = next((r for r in rows[1:] if r[3] == "pump 1"), None)
    check("CSV amount_set of pump 1", first is not None and abs(float(first[-1]) - float(first[4]) / 0.9) < 1e-3,
          str(first))

    code, out, err = run_text("plan", weak, "--text")
    check("text day table adds what to set on pump 1", "set on pump 1 (mL)" in out, out[:400])
    code, out, err = run_text("plan", plain, "--text")
    check("text day table of true pumps unchanged", "set on" not in out)

    for bad, words in ((2.0, ["additives[0].calibration", "0.5", "1.5"]), (0.2, ["additives[0].calibration", "0.5"]),
                       ("strong", ["additives[0].calibration", "number"])):
        code, out, err = run_text("plan", write(with_calibration(bad), "bad.json"))
        check(f"calibration {bad!r} refused", code != 0 and code != 3 and all(w in err for w in words), err)
        check(f"calibration {bad!r} on one line", err.count("\n") <= 1, err)

    # --adopt writes the calibration and the amount to set into the journal's schedules.
    db = os.path.join(tmp, "journal.db")
    r = run("log", "--journal", db, "add", "system", "--name", "Living room reef", "--volume", "380")
    check("setup: system", r.returncode == 0, r.stderr)
    code, out, err = run_text("plan", weak, "--journal", db, "--system", "Living room reef", "--adopt",
                              "--accept-stale")
    adopted = [l for l in err.splitlines() if l.startswith("adopted:")]
    check("adopted schedules", len(adopted) > 0, err)
    check("pump 1's schedules carry calibration 0.9",
          all("calibration 0.9" in l for l in adopted if "pump 1" in l) and any("pump 1" in l for l in adopted), err)
    check("pump 2's schedules do not", all("calibration" not in l for l in adopted if "pump 2" in l), err)

finish()
