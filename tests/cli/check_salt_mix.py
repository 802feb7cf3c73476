#!/usr/bin/python3
"""Salt mixes (issue 18): `chem --total-boron` replaces the salinity-scaled boron and says so
(refused out of range, naming the option and the range in the unit typed); `--mg-ca-correction`
is off by default, needs --magnesium and --calcium, and says when it is applied and where it
holds; the batch reads total_boron_umol_kg and magnesium_umol_kg columns. `buffer` takes the
same options: a hatchery or reef salt mix is dosed from its own boron and Mg/Ca.
Usage: check_salt_mix.py <tidewright>. Prints "N passed, M failed"."""
import csv
import io
import json

from cli_check import check, finish, run_text

base = ["chem", "--alkalinity", "2300", "--alkalinity-unit", "umol/kg", "--dic", "2000"]

# Without the new options: as before (no boron note, no correction).
rc, out, err = run_text(*base)
check("plain: runs", rc == 0, err)
check("plain: no boron note", "total boron" not in out, out)
check("plain: no correction", "Mg/Ca" not in out, out)
rc, out, err = run_text(*base, "--json")
plain = json.loads(out)
check("plain json: boron from salinity", "from salinity" in plain["boron_source"], plain["boron_source"])
check("plain json: no correction", plain["mg_ca_correction"] is None, plain["mg_ca_correction"])

# Measured boron equal to the scaled value: the same numbers; doubled: lower pH.
same = json.loads(run_text(*base, "--json", "--total-boron", str(plain["total_boron_umol_kg"]))[1])
check("boron = scaled: same pH", abs(same["ph_total"] - plain["ph_total"]) < 1e-9, (same["ph_total"], plain["ph_total"]))
rc, out, err = run_text(*base, "--total-boron", "831.4")
check("doubled boron: runs", rc == 0, err)
check("doubled boron: says so", "Note    total boron as measured, 831 umol/kg" in out, out)
doubled = json.loads(run_text(*base, "--json", "--total-boron", "831.4")[1])
check("doubled boron: pH lower", doubled["ph_total"] < plain["ph_total"] - 0.01, doubled["ph_total"])
check("doubled boron json: source", "as measured" in doubled["boron_source"], doubled["boron_source"])
# mg/L of boron: 9 mg/L / 10.81 g/mol / density 1.0233 kg/L = 813.6 umol/kg
mgl = json.loads(run_text(*base, "--json", "--total-boron", "9", "--total-boron-unit", "mg/L")[1])
check("boron in mg/L converted", abs(mgl["total_boron_umol_kg"] - 813.6) < 0.5, mgl["total_boron_umol_kg"])

# Refusals name the option and the range, in the unit typed.
rc, out, err = run_text(*base, "--total-boron", "5000")
check("boron out of range: refused", rc != 0 and out == "", (rc, out))
check("boron out of range: names option and range", "--total-boron" in err and "0 to 2000 umol/kg" in err, err)
rc, out, err = run_text(*base, "--total-boron", "40", "--total-boron-unit", "mg/L")
check("boron out of range in mg/L: range in mg/L", rc != 0 and "--total-boron" in err and "0 to 22.1 mg/L" in err, err)

# The Mg/Ca correction: asked for, it needs both ions; given them, it is applied and said.
rc, out, err = run_text(*base, "--mg-ca-correction", "--calcium", "480")
check("correction without magnesium: refused", rc != 0 and "--mg-ca-correction" in err and "magnesium" in err, err)
mix = ["--magnesium", "1100", "--calcium", "480"]
rc, out, err = run_text(*base, *mix)
check("magnesium alone: no correction", rc == 0 and "Mg/Ca" not in out, out + err)
rc, out, err = run_text(*base, *mix, "--mg-ca-correction")
check("correction: runs", rc == 0, err)
check("correction: said, with its range", "Mg/Ca correction of the constants applied" in out
      and "valid for salinity 30 to 40, 0 to 40 C" in out, out)
j = json.loads(run_text(*base, *mix, "--mg-ca-correction", "--json")[1])
check("correction json: factors", j["mg_ca_correction"] and 0.5 < j["mg_ca_correction"]["factors"]["k2"] < 1.5, j["mg_ca_correction"])
rc, out, err = run_text(*base, *mix, "--mg-ca-correction", "--salinity", "20")
check("correction below salinity 30: refused", rc != 0 and "--mg-ca-correction" in err and "salinity 30 to 40" in err, err)

# Batch: per-row boron and magnesium columns; the correction for every row with the flag.
table = ("id,alkalinity_umol_kg,dic_umol_kg,calcium_umol_kg,magnesium_umol_kg,total_boron_umol_kg\r\n"
         "a,2300,2000,11700,44300,\r\n"
         "b,2300,2000,11700,44300,831.4\r\n")
rc, out, err = run_text("chem", "--batch", "-", input=table.encode())
rows = list(csv.DictReader(io.StringIO(out)))
check("batch: runs", rc == 0 and len(rows) == 2, err)
check("batch: boron column used", rows and float(rows[1]["ph_total"]) < float(rows[0]["ph_total"]) - 0.01, rows)
rc, out, err = run_text("chem", "--batch", "-", "--mg-ca-correction", input=table.encode())
corrected = list(csv.DictReader(io.StringIO(out)))
check("batch correction: runs", rc == 0 and len(corrected) == 2, err)
check("batch correction: said in warnings", corrected and "Mg/Ca correction" in corrected[0]["warnings"], corrected)
rc, out, err = run_text("chem", "--batch", "-", "--total-boron", "500", input=table.encode())
check("batch with --total-boron: refused, pointing at the column", rc != 0 and "total_boron_umol_kg" in err, err)

# buffer: the same options, the same rules.
flow = ["buffer", "flow", "--salinity", "35", "--temperature", "25", "--alkalinity", "2300", "--ph", "7.9",
        "--ph-scale", "total", "--target-omega", "3", "--flow", "10", "--json"]
plain_flow = json.loads(run_text(*flow)[1])
dose = lambda j: j["treatment"]["added_alkalinity_umol_kg"]
check("buffer: boron from salinity by default", "from salinity" in plain_flow["salt_mix"]["boron_source"], plain_flow["salt_mix"])
same_flow = json.loads(run_text(*flow, "--total-boron", str(plain_flow["salt_mix"]["total_boron_umol_kg"]))[1])
check("buffer: boron = scaled, same dose", abs(dose(same_flow) - dose(plain_flow)) < 1e-6, (dose(same_flow), dose(plain_flow)))
doubled_flow = json.loads(run_text(*flow, "--total-boron", "831.4")[1])
check("buffer: doubled boron, a different dose, said", abs(dose(doubled_flow) - dose(plain_flow)) > 1
      and "as measured" in doubled_flow["salt_mix"]["boron_source"], (dose(doubled_flow), dose(plain_flow)))
rc, out, err = run_text(*flow[:-1], "--total-boron", "831.4")
check("buffer text: the header says the boron used", rc == 0 and "total boron as measured, 831 umol/kg" in out, out)
mgca = json.loads(run_text(*flow, "--calcium", "470", "--magnesium", "1150", "--mg-ca-correction")[1])
check("buffer: Mg/Ca correction applied and said", mgca["salt_mix"]["mg_ca_correction"] is True
      and any("Mg/Ca correction" in w for w in mgca["treatment"].get("warnings", []) + mgca["warnings"]), mgca["warnings"])
rc, out, err = run_text(*flow, "--magnesium", "1150", "--mg-ca-correction")
check("buffer: correction without calcium refused, naming the option", rc != 0 and "--mg-ca-correction" in err and out == "", err)
rc, out, err = run_text(*flow, "--total-boron", "50", "--total-boron-unit", "mg/L")
check("buffer: boron out of range refused in mg/L", rc != 0 and "--total-boron 50 mg/L" in err and "22.1 mg/L" in err, err)
line = ["buffer", "line", "--salinity", "30", "--temperature", "15", "--k1k2", "millero2010", "--alkalinity", "2100",
        "--dic", "1950", "--target-omega", "1.5", "--mix-fraction", "0.25", "--mix-salinity", "0",
        "--mix-temperature", "15", "--mix-alkalinity", "800", "--mix-dic", "850", "--total-boron", "712.74", "--json"]
rc, out, err = run_text(*line)
mixed = json.loads(out) if rc == 0 else {}
# Mass fraction of fresh water 0.245753 (tests/unit/hatchery/test_hatchery_line.cpp, by hand):
# 712.74 x (1 - 0.245753) = 537.58 umol/kg at the tanks.
check("buffer line: measured boron mixed by mass", rc == 0 and abs(mixed["salt_mix"]["total_boron_umol_kg"] - 537.58) < 0.05
      and any("measured boron mixed by mass" in n for n in mixed["notes"]), (err, mixed.get("salt_mix")))

# Their uncertainty: a measured boron and a magnesium the correction reads are sources of their
# own (5 % of the boron and the magnesium kit's 25 mg/L by default), set by options in the unit
# typed, refused outside their range.
reef = ["chem", "--alkalinity", "8", "--ph", "8.1", "--ph-scale", "nbs", "--calcium", "420", "--magnesium", "1320",
        "--mg-ca-correction", "--total-boron", "6.5", "--total-boron-unit", "mg/L", "--uncertainty"]
rc, out, err = run_text(*reef)
check("uncertainty: boron and magnesium listed in the unit typed", rc == 0 and "magnesium 25 mg/L" in out
      and "total boron 0.325 mg/L" in out, out + err)
rc, out, err = run_text(*reef, "--json")
names = [s["name"] for s in json.loads(out)["uncertainty"]["sources"]] if rc == 0 else []
check("uncertainty json: both sources", "magnesium_umol_kg" in names and "total_boron_umol_kg" in names, names)
rc, out, err = run_text(*reef, "--total-boron-precision", "5")
check("boron precision out of range: refused in mg/L", rc != 0 and out == ""
      and "--total-boron-precision 5 mg/L" in err and "0 to 3.25 mg/L" in err, err)
rc, out, err = run_text(*reef, "--magnesium-precision", "300")
check("magnesium precision out of range: refused with the range", rc != 0 and "0 to 200 mg/L" in err, err)
rc, out, err = run_text("chem", "--alkalinity", "8", "--ph", "8.1", "--ph-scale", "nbs", "--magnesium-precision", "30")
check("magnesium precision without the correction: refused", rc != 0 and "--mg-ca-correction" in err, err)

finish()
