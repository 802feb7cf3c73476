#!/usr/bin/python3
"""Writes assets/demo/demo_journal.json: an INVENTED demo journal (nothing here is real).

Three systems over 120 days, generated from a simple mass balance so that the consumption
estimator can recover the demand that was put in:

  level(t) falls at a constant daily demand between events; a dose adds its chemistry
  instantly; a water change mixes in new water (c <- c (1 - f) + f c_new); plain top-off
  replaces evaporation and changes nothing; limewater top-off adds Ca(OH)2.

Test results are the true level plus Gaussian kit noise (alkalinity sd 0.2 dKH, calcium
10 mg/L, magnesium 25 mg/L; common practice for hobby kits), rounded to the kit's step.
Two deliberate outliers (misread kits) are included, each with a note and a retest.
The dosing pumps of the reef and the grow-out rack (and the rack's limewater auto top-off)
run on standing dose schedules, changed when the keeper adjusts them; their doses change the
simulated water but are not logged one by one, as a keeper with pumps would not log them.

Chemistry (same constants as the core): IUPAC molar masses Na2CO3 105.988, CaCl2.2H2O
147.008, MgCl2.6H2O 203.295, Ca(OH)2 74.092 g/mol, Ca 40.078, Mg 24.305; 1 dKH =
20/56.077 meq/L (facts.md 5); saturated limewater 1.50 g/L (Bates et al. 1956).

Deterministic: fixed seed, no clock. Run: /usr/bin/python3 assets/demo/make_demo_journal.py
"""
import json
import os
import random
import sys

SEED = 20261201
START = 1785542400  # 2026-08-01T00:00:00Z
DAYS = 120
MEQ_PER_DKH = 20.0 / 56.077
M_NA2CO3, M_CACL2_2H2O, M_MGCL2_6H2O, M_CAOH2 = 105.988, 147.008, 203.295, 74.092
M_CA, M_MG = 40.078, 24.305
LIMEWATER_G_PER_L = 1.50

# What each dose adds per gram of compound, per litre of tank: (dKH, Ca mg/L, Mg mg/L).
def per_gram(compound, volume_l):
    if compound == "sodium_carbonate":
        return (2.0 / M_NA2CO3 * 1000.0 / MEQ_PER_DKH / volume_l, 0.0, 0.0)
    if compound == "calcium_chloride_dihydrate":
        return (0.0, M_CA / M_CACL2_2H2O * 1000.0 / volume_l, 0.0)
    if compound == "magnesium_chloride_hexahydrate":
        return (0.0, 0.0, M_MG / M_MGCL2_6H2O * 1000.0 / volume_l)
    if compound == "calcium_hydroxide":
        return (2.0 / M_CAOH2 * 1000.0 / MEQ_PER_DKH / volume_l, M_CA / M_CAOH2 * 1000.0 / volume_l, 0.0)
    raise ValueError(compound)


class Sim:
    """One system: true levels, a demand per day, and the events it logs."""

    def __init__(self, journal, system, demand, start_levels, rng):
        self.sys, self.rng = system, rng
        self.demand = demand  # (dKH/day, mg/L/day, mg/L/day)
        self.level = list(start_levels)
        self.t = START

    def advance(self, t):
        dt = (t - self.t) / 86400.0
        assert dt >= 0
        for i in range(3):
            self.level[i] -= self.demand[i] * dt
        self.t = t

    def apply(self, t, payload):
        """Changes the true levels for one event (called in time order)."""
        v = self.sys["volume_l"]
        kind = payload["type"]
        if kind == "dose" and payload["additive"] != "limewater":
            grams = payload["amount"] if payload["amount_unit"] == "g" else \
                payload["amount"] / 1000.0 * payload["stock_g_per_l"]
            eff = per_gram(payload["additive"], v)
            for i in range(3):
                self.level[i] += eff[i] * grams
        elif kind == "water_change":
            f = payload["volume_l"] / v
            nw = payload["new_water"]
            for i, key in enumerate(("alkalinity_dkh", "calcium_mg_l", "magnesium_mg_l")):
                self.level[i] = self.level[i] * (1 - f) + f * nw[key]
        elif kind == "dose" and payload["additive"] == "limewater":  # saturated, by the mL
            eff = per_gram("calcium_hydroxide", v)
            grams = payload["amount"] / 1000.0 * LIMEWATER_G_PER_L
            for i in range(3):
                self.level[i] += eff[i] * grams
        elif kind == "top_off" and payload["kind"] == "limewater":
            eff = per_gram("calcium_hydroxide", v)
            grams = payload["volume_l"] * LIMEWATER_G_PER_L
            for i in range(3):
                self.level[i] += eff[i] * grams

    def test(self, t, parameter, sd, step, unit, kit, misread=None):
        idx = {"alkalinity": 0, "calcium": 1, "magnesium": 2}[parameter]
        value = self.level[idx] + self.rng.gauss(0.0, sd)
        if misread is not None:
            value = misread
        value = round(round(value / step) * step, 2)
        return {"type": "test", "parameter": parameter, "value": value, "unit": unit,
                "precision": sd, "kit": kit}


def hhmm(day, h, m=0):
    return START + day * 86400 + h * 3600 + m * 60


def run(j, sim, items):
    """Logs items (time, payload) in time order; a callable payload is called with the time
    and returns the payload (so a test reads the level at its own time). A payload with
    "_unlogged" changes the water without being logged (a pump dosing on its schedule); one
    with "_missed" is logged but changes nothing (a scheduled dose that was not given)."""
    for t, p in sorted(items, key=lambda e: e[0]):
        sim.advance(t)
        if callable(p):
            p = p(t)
        if p is None:
            continue
        after = p.pop("_after", None)
        if not p.pop("_missed", False):
            sim.apply(t, p)
        if not p.pop("_unlogged", False):
            e = j.event(sim.sys, t, p)
            if after:
                after(e)


class Schedules:
    """The standing schedules of one system's pumps: started, changed (the old one stopped and
    a new one started at the same time) and the doses they give, which change the water but
    are not logged one by one."""

    def __init__(self, j, sim):
        self.j, self.sim, self.current = j, sim, {}

    def set(self, items, t, key, **schedule):
        """From time t the pump `key` runs `schedule` (stops the previous one at t)."""
        def make(_t):
            old = self.current.get(key)
            if old is not None:
                old["stop"] = iso(t - 1)

            def remember(e):
                self.current[key] = e
            return {"type": "schedule", "calibration": 1.0, **schedule, "_after": remember}
        items.append((t - 1, make))  # a second before its first dose, so it runs first

    def doses(self, items, day, key, hours, minute=0, missed_hour=None):
        """The pump's doses of this day as unlogged water changes (a missed one is logged
        as missed against the schedule, and gives nothing)."""
        def make(missed):
            def build(_t):
                e = self.current[key]
                payload = {"type": "dose", "additive": e["additive"], "amount": e["amount"],
                           "amount_unit": e["amount_unit"]}
                if "stock_g_per_l" in e:
                    payload["stock_g_per_l"] = e["stock_g_per_l"]
                if missed:
                    payload.update({"mark": "missed", "schedule_id": e["id"], "_missed": True})
                else:
                    payload["_unlogged"] = True
                return payload
            return build
        for h in hours:
            if h == missed_hour:
                items.append((hhmm(day, h, minute + 40), make(True)))
            else:
                items.append((hhmm(day, h, minute), make(False)))


def reef(j, rng):
    sys_ = j.system(
        name="Living room reef", kind="reef_display", volume_l=380.0,
        volume_parts={"display_l": 300.0, "sump_l": 110.0, "rock_displacement_l": 30.0},
        default_salinity=35.0, default_temperature_c=25.5,
        targets={"alkalinity_dkh": 8.0, "calcium_mg_l": 430.0, "magnesium_mg_l": 1320.0})
    sim = Sim(j, sys_, (1.1, 7.5, 1.5), (8.0, 430.0, 1320.0), rng)
    pump = {"alk_ml": 95.0, "ca_ml": 40.0}  # per day; the keeper adjusts them
    recent = {"alkalinity": [], "calcium": []}

    def test(parameter, sd, step, unit, kit, misread=None):
        def make(t):
            r = sim.test(t, parameter, sd, step, unit, kit, misread)
            if misread is None and parameter in recent:
                recent[parameter].append(r["value"])
            return r
        return make

    sched = Schedules(j, sim)

    def set_pumps(items, day):
        sched.set(items, hhmm(day, 6) + 1, "alk", device="pump 1", additive="sodium_carbonate",
                  amount=round(pump["alk_ml"] / 2, 1), amount_unit="mL", stock_g_per_l=80.0,
                  stock_name="soda ash 80 g/L", doses_per_day=2)
        sched.set(items, hhmm(day, 6, 5) + 1, "ca", device="pump 2", additive="calcium_chloride_dihydrate",
                  amount=round(pump["ca_ml"] / 2, 1), amount_unit="mL", stock_g_per_l=250.0,
                  stock_name="calcium chloride 250 g/L", doses_per_day=2)

    for day in range(DAYS):
        items = []
        # The keeper adjusts the pumps every 14 days from the last tests.
        if day % 14 == 0 and day > 0:
            alk = recent["alkalinity"][-4:]
            ca = recent["calcium"][-3:]
            if alk and sum(alk) / len(alk) < 7.5:
                pump["alk_ml"] += 10
            elif alk and sum(alk) / len(alk) < 7.8:
                pump["alk_ml"] += 5
            elif alk and sum(alk) / len(alk) > 8.2:
                pump["alk_ml"] -= 5
            if ca and sum(ca) / len(ca) < 420:
                pump["ca_ml"] += 3
            elif ca and sum(ca) / len(ca) > 440:
                pump["ca_ml"] -= 3
            items.append((hhmm(day, 5, 30), {"type": "note", "text":
                          f"pumps set to {pump['alk_ml']:g} mL/day carbonate and {pump['ca_ml']:g} mL/day calcium"}))
        # Two pumps on standing schedules, each dosing half its daily volume at 06:00 and 18:00;
        # the schedules change when the keeper adjusts the pumps. The pump doses are not logged
        # one by one (the schedule says what they do); one evening dose was missed.
        if day % 14 == 0:
            set_pumps(items, day)
        sched.doses(items, day, "alk", (6, 18), 0, missed_hour=18 if day == 60 else None)
        sched.doses(items, day, "ca", (6, 18), 5)
        items.append((hhmm(day, 8, 30), {"type": "top_off", "volume_l": round(rng.uniform(3.0, 4.2), 1),
                                         "kind": "plain"}))
        if day % 7 == 6:  # weekly 10 % water change and a magnesium dose
            items.append((hhmm(day, 10), {"type": "water_change", "volume_l": 38.0,
                                          "new_water": {"alkalinity_dkh": 7.6, "calcium_mg_l": 425.0,
                                                        "magnesium_mg_l": 1290.0, "salinity": 35.0}}))
            items.append((hhmm(day, 10, 30), {"type": "dose", "additive": "magnesium_chloride_hexahydrate",
                                              "amount": 32.0, "amount_unit": "g"}))
        if rng.random() < 0.55 or day == 46:  # evening tests every 1-3 days
            t = hhmm(day, 19, rng.randrange(0, 50))
            if day == 46:  # a misread kit, noted and retested
                items.append((t, test("alkalinity", 0.2, 0.1, "dKH", "hobby titration kit", 10.9)))
                items.append((t + 600, {"type": "note",
                                        "text": "alkalinity 10.9 looks wrong (syringe misread?); retested"}))
                items.append((t + 1800, test("alkalinity", 0.2, 0.1, "dKH", "hobby titration kit")))
            else:
                items.append((t, test("alkalinity", 0.2, 0.1, "dKH", "hobby titration kit")))
            if day % 3 == 0:
                items.append((t + 900, test("calcium", 10.0, 5.0, "mg/L", "hobby calcium kit")))
            if day % 7 == 2:
                items.append((t + 1200, test("magnesium", 25.0, 10.0, "mg/L", "hobby magnesium kit")))
                items.append((t + 1300, {"type": "test", "parameter": "ph", "value": round(rng.gauss(8.15, 0.05), 2),
                                         "unit": "pH", "ph_scale": "nbs", "precision": 0.05,
                                         "kit": "handheld meter"}))
                items.append((t + 1400, {"type": "test", "parameter": "salinity",
                                         "value": round(rng.gauss(35.0, 0.3), 1), "unit": "psu",
                                         "precision": 0.5, "kit": "refractometer"}))
                items.append((t + 1500, {"type": "test", "parameter": "temperature",
                                         "value": round(rng.gauss(25.5, 0.2), 1), "unit": "C"}))
        if day == 20:
            items.append((hhmm(day, 20), {"type": "note", "text": "added three new frags to the rock work"}))
        if day == 75:
            items.append((hhmm(day, 20), {"type": "note", "text": "recalibrated both dosing pumps"}))
        run(j, sim, items)


def grow_out(j, rng):
    sys_ = j.system(
        name="Grow-out rack 1", kind="coral_grow_out", volume_l=1150.0, default_salinity=35.0,
        default_temperature_c=25.0,
        targets={"alkalinity_dkh": 8.5, "calcium_mg_l": 440.0, "magnesium_mg_l": 1350.0})
    # Demand higher than the display: alkalinity 1.8 dKH/day, calcium 12.5 mg/L/day,
    # magnesium 2.5 mg/L/day. Saturated limewater top-off covers part of it.
    sim = Sim(j, sys_, (1.8, 12.5, 2.5), (8.5, 440.0, 1350.0), rng)
    pump = {"alk_ml": 215.0, "ca_ml": 118.0}
    recent = []

    def test(*a):
        def make(t):
            r = sim.test(t, *a)
            if a[0] == "alkalinity":
                recent.append(r["value"])
            return r
        return make

    sched = Schedules(j, sim)

    def set_alk(items, day):
        sched.set(items, hhmm(day, 0) + 1, "alk", device="alkalinity pump", additive="sodium_carbonate",
                  amount=round(pump["alk_ml"] / 4, 1), amount_unit="mL", stock_g_per_l=120.0,
                  stock_name="soda ash 120 g/L", doses_per_day=4)

    for day in range(DAYS):
        items = []
        if day == 0:
            # Calcium pump and the limewater top-off (an auto top-off: 250 mL an hour, 6 L a
            # day) run on standing schedules for the whole time.
            set_alk(items, 0)
            sched.set(items, hhmm(0, 0, 10) + 1, "ca", device="calcium pump",
                      additive="calcium_chloride_dihydrate", amount=round(pump["ca_ml"] / 4, 1),
                      amount_unit="mL", stock_g_per_l=300.0, stock_name="calcium chloride 300 g/L",
                      doses_per_day=4)
            sched.set(items, hhmm(0, 0, 20) + 1, "lime", device="auto top-off", additive="limewater",
                      amount=250.0, amount_unit="mL", stock_name="saturated limewater", doses_per_day=24)
        if day % 10 == 0 and len(recent) >= 3:  # farm staff adjust the alkalinity pump
            mean = sum(recent[-4:]) / len(recent[-4:])
            step = 10.0 if abs(mean - 8.5) > 0.2 else 0.0
            if step:
                pump["alk_ml"] += step if mean < 8.5 else -step
                items.append((hhmm(day, 0, 0) - 60, {"type": "note", "text":
                              f"alkalinity pump set to {pump['alk_ml']:g} mL/day"}))
                set_alk(items, day)
        sched.doses(items, day, "alk", (0, 6, 12, 18), 0)
        sched.doses(items, day, "ca", (0, 6, 12, 18), 10)
        sched.doses(items, day, "lime", range(24), 20)
        if day % 7 == 3:
            items.append((hhmm(day, 9, 30), {"type": "dose", "additive": "magnesium_chloride_hexahydrate",
                                             "amount": 160.0, "amount_unit": "g"}))
        if day % 14 == 10:
            items.append((hhmm(day, 11), {"type": "water_change", "volume_l": 170.0,
                                          "new_water": {"alkalinity_dkh": 7.8, "calcium_mg_l": 430.0,
                                                        "magnesium_mg_l": 1300.0, "salinity": 35.0}}))
        if day % 2 == 0 or rng.random() < 0.3:
            t = hhmm(day, 15, rng.randrange(0, 40))
            items.append((t, test("alkalinity", 0.2, 0.1, "dKH", "digital titrator")))
            if day == 80:  # a misread kit
                items.append((t + 600, test("calcium", 10.0, 5.0, "mg/L", "hobby calcium kit", 520.0)))
                items.append((t + 900, {"type": "note", "text": "calcium 520 must be a misread colour change"}))
            else:
                items.append((t + 600, test("calcium", 10.0, 5.0, "mg/L", "hobby calcium kit")))
            if day % 6 == 0:
                items.append((t + 1200, test("magnesium", 25.0, 10.0, "mg/L", "hobby magnesium kit")))
        if day == 40:
            items.append((hhmm(day, 17), {"type": "note", "text": "moved 40 fragments to the sales tank"}))
        run(j, sim, items)


def larval(j, rng):
    sys_ = j.system(
        name="Larval culture C", kind="larval_culture", volume_l=500.0, default_salinity=32.0,
        default_temperature_c=20.0, targets={"alkalinity_dkh": 7.0},
        units={"alkalinity": "dKH", "calcium_magnesium": "mg/L", "temperature": "C",
               "ph_scale": "total", "volume": "L"})
    # Static culture: 80 % drain and refill with intake water every 3 days, then sodium
    # carbonate raises alkalinity. Demand (larval shell growth) 0.25 dKH/day, Ca 1.8 mg/L/day.
    sim = Sim(j, sys_, (0.25, 1.8, 0.0), (7.0, 395.0, 1210.0), rng)
    test = lambda *a: (lambda t: sim.test(t, *a))

    def buffer_dose(t):  # grams of Na2CO3 to bring alkalinity back to 7.2 dKH
        rise = 7.2 - sim.level[0]
        grams = round(max(0.1, rise / per_gram("sodium_carbonate", 500.0)[0]), 1)
        return {"type": "dose", "additive": "sodium_carbonate", "amount": grams, "amount_unit": "g"}

    for day in range(DAYS):
        items = []
        if day % 3 == 0:
            items.append((hhmm(day, 7), {"type": "water_change", "volume_l": 400.0,
                                         "new_water": {"alkalinity_dkh": round(rng.gauss(6.15, 0.1), 2),
                                                       "calcium_mg_l": 390.0, "magnesium_mg_l": 1200.0,
                                                       "salinity": 32.0}}))
            items.append((hhmm(day, 7, 30), buffer_dose))
        t = hhmm(day, 12, rng.randrange(0, 30))
        items.append((t, test("alkalinity", 0.15, 0.05, "dKH", "lab titration")))
        items.append((t + 300, {"type": "test", "parameter": "ph", "value": round(rng.gauss(7.95, 0.03), 3),
                                "unit": "pH", "ph_scale": "total", "precision": 0.01,
                                "kit": "spectrophotometric"}))
        if day % 4 == 1:
            items.append((t + 600, test("calcium", 10.0, 5.0, "mg/L", "lab titration")))
        if day % 3 == 0:
            items.append((t + 900, {"type": "test", "parameter": "temperature",
                                    "value": round(rng.gauss(20.0, 0.3), 1), "unit": "C"}))
        if day in (0, 33, 66, 99):
            items.append((hhmm(day, 8), {"type": "note", "text": "new larval batch stocked after drain-down"}))
        run(j, sim, items)


class Journal:
    N_SYSTEMS = 3  # systems get ids 1..3, events ids from 4 on

    def __init__(self):
        self.next_system_id = 1
        self.next_id = self.N_SYSTEMS + 1
        self.systems = []
        self.events = []

    def system(self, **kw):
        assert self.next_system_id <= self.N_SYSTEMS
        s = {"id": self.next_system_id, "name": kw["name"], "kind": kw["kind"], "volume_l": kw["volume_l"],
             "default_salinity": kw["default_salinity"], "default_temperature_c": kw["default_temperature_c"],
             "units": kw.get("units", {"alkalinity": "dKH", "calcium_magnesium": "mg/L", "temperature": "C",
                                       "ph_scale": "nbs", "volume": "L"}),
             "targets": kw.get("targets", {})}
        if "volume_parts" in kw:
            s["volume_parts"] = kw["volume_parts"]
        self.next_system_id += 1
        self.systems.append(s)
        return s

    def event(self, system, t, payload):
        e = {"id": self.next_id, "system_id": system["id"], "time": iso(t)}
        e.update(payload)
        self.next_id += 1
        self.events.append((t, e))
        return e


def iso(t):
    days, rem = divmod(t, 86400)
    y, m, d = civil_from_days(days)
    return f"{y:04d}-{m:02d}-{d:02d}T{rem // 3600:02d}:{rem // 60 % 60:02d}:{rem % 60:02d}Z"


def civil_from_days(z):  # Hinnant's civil_from_days (public domain algorithm)
    z += 719468
    era = (z if z >= 0 else z - 146096) // 146097
    doe = z - era * 146097
    yoe = (doe - doe // 1460 + doe // 36524 - doe // 146096) // 365
    y = yoe + era * 400
    doy = doe - (365 * yoe + yoe // 4 - yoe // 100)
    mp = (5 * doy + 2) // 153
    d = doy - (153 * mp + 2) // 5 + 1
    m = mp + 3 if mp < 10 else mp - 9
    return (y + (1 if m <= 2 else 0), m, d)


def main():
    rng = random.Random(SEED)
    j = Journal()
    reef(j, rng)
    grow_out(j, rng)
    larval(j, rng)
    events = [e for _, e in sorted(j.events, key=lambda te: (te[0], te[1]["id"]))]
    doc = {
        "format": "tidewright-journal",
        "schema_version": 3,
        "description": ("INVENTED DEMO DATA: three made-up systems over 120 days, generated by "
                        "assets/demo/make_demo_journal.py from a simple mass balance (reef demand "
                        "1.1 dKH, 7.5 mg/L Ca, 1.5 mg/L Mg per day; grow-out rack 1.8, 12.5, 2.5; "
                        "larval culture 0.25 dKH and 1.8 mg/L Ca) with kit noise and two misread "
                        "tests. The reef's and the rack's pumps run on standing dose schedules (their "
                        "doses are not logged one by one; one missed dose is). Nothing here was measured. Hatchery work produces food: follow "
                        "local codes and licensed practice."),
        "next_id": j.next_id,
        "systems": j.systems,
        "events": events,
    }
    out = os.path.join(os.path.dirname(os.path.abspath(__file__)), "demo_journal.json")
    if len(sys.argv) > 1:
        out = sys.argv[1]
    with open(out, "w", encoding="utf-8") as f:
        f.write(json.dumps(doc, indent=2, sort_keys=True, ensure_ascii=False) + "\n")
    print(f"wrote {out}: {len(j.systems)} systems, {len(events)} events")


if __name__ == "__main__":
    main()
