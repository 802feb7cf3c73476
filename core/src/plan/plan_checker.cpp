// Independent plan checker: replays a list of doses from the input's starting state with its
// own, deliberately plain code (no planner function is called), solving each dose's effect with
// the carbonate engine directly, and lists every limit exceeded. Omega aragonite is computed
// here from its definition, [Ca][CO3]/K*sp (facts.md 1), with the current calcium.
// Also: what a missed or doubled dose does to the water.
#include <algorithm>
#include <cmath>
#include <cstdint>

#include <fmt/format.h>

#include "plan_internal.hpp"
#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/seawater/seawater.hpp"
#include "tidewright/common/units.hpp"

namespace tw::plan {

namespace {

namespace cb = tw::carbonate;

// Numerical slack: the planner and this checker follow the same model in different code, so
// their states agree to rounding; anything past these is a real excess.
constexpr double kTolPh = 1e-7, kTolOmega = 1e-7, kTolLevel = 1e-7;

struct Tank {
  double alk_umol_kg, dic_umol_kg, ca_mg_l, mg_mg_l;
};

}  // namespace

CheckReport check_doses(const PlanInput& in, const std::vector<PlannedDose>& doses) {
  CheckReport rep;
  if (auto s = detail::validate_input(in); !s) {
    rep.other.push_back("input: " + s.error().message);
    return rep;
  }
  const double volume = in.system.volume_l;
  const double density = seawater::density_kg_per_l(in.system.salinity, in.system.temperature_c);
  const double kg = volume * density;
  cb::Conditions cond;
  cond.salinity = in.system.salinity;
  cond.temperature_c = in.system.temperature_c;
  auto k = cb::compute_constants(cond);
  if (!k) {
    rep.other.push_back("constants: " + k.error().message);
    return rep;
  }
  const double umol_per_dkh = units::kMeqPerLPerDKH * 1000.0 / density;  // 1 dKH = 0.35665 meq/L (facts.md 5)
  Tank t{in.system.alkalinity_dkh * umol_per_dkh, 0, in.system.calcium_mg_l, in.system.magnesium_mg_l};
  if (in.system.ph_total) {
    auto st = cb::solve(*k, {{cb::Quantity::Alkalinity, t.alk_umol_kg}, {cb::Quantity::PH, *in.system.ph_total},
                             cb::PhScale::Total});
    if (!st) {
      rep.other.push_back(st.error().message);
      return rep;
    }
    t.dic_umol_kg = st->dic_umol_kg;
  } else {
    auto st = cb::equilibrate_with_air(*k, t.alk_umol_kg, in.system.air_co2_ppm);
    if (!st) {
      rep.other.push_back(st.error().message);
      return rep;
    }
    t.dic_umol_kg = st->dic_umol_kg;
  }

  auto state_of = [&](const Tank& x, WaterState& out) -> bool {
    auto st = cb::solve_alkalinity_dic(*k, x.alk_umol_kg, x.dic_umol_kg);
    if (!st) return false;
    out.alkalinity_dkh = x.alk_umol_kg / umol_per_dkh;
    out.calcium_mg_l = x.ca_mg_l;
    out.magnesium_mg_l = x.mg_mg_l;
    out.ph_total = st->ph_total;
    const double ca_mol_kg = x.ca_mg_l / 40.078 / 1000.0 / density;
    out.omega_aragonite = ca_mol_kg * st->co3_umol_kg * 1e-6 / k->ksp_aragonite;
    out.dic_umol_kg = x.dic_umol_kg;
    return true;
  };
  // Demand for `h` hours then gas exchange (the model documented in plan.hpp).
  auto pass_time = [&](Tank& x, double h) -> bool {
    if (h <= 0) return true;
    const double take = in.demand.alkalinity_meq_per_day * 1e3 * (h / 24.0) / kg;  // umol/kg
    x.alk_umol_kg = std::max(50.0, x.alk_umol_kg - take);
    x.dic_umol_kg = std::max(10.0, x.dic_umol_kg - take / 2.0);
    x.ca_mg_l = std::max(0.0, x.ca_mg_l - in.demand.calcium_mg_per_day * (h / 24.0) / volume);
    x.mg_mg_l = std::max(0.0, x.mg_mg_l - in.demand.magnesium_mg_per_day * (h / 24.0) / volume);
    auto eq = cb::equilibrate_with_air(*k, x.alk_umol_kg, in.system.air_co2_ppm);
    if (!eq) return false;
    const double f = in.gas_exchange_hours > 0 ? std::exp(-h / in.gas_exchange_hours) : 0.0;
    x.dic_umol_kg = eq->dic_umol_kg * (1.0 - f) + x.dic_umol_kg * f;
    return true;
  };

  const Limits& lim = in.limits;
  std::vector<std::size_t> order(doses.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
    return doses[a].day != doses[b].day ? doses[a].day < doses[b].day : doses[a].minute < doses[b].minute;
  });
  rep.after.assign(doses.size(), WaterState{});
  std::vector<double> given_total(in.deliveries.size(), 0.0);
  double clock_h = 0;
  std::size_t next = 0;
  auto violate = [&](std::size_t dose, int day, LimitId id, double value, double allowed) {
    rep.violations.push_back({dose, day, id, value, allowed,
                              fmt::format("day {}: {} reached {:.6g}, limit {:g}", day, limit_spec(id).key, value,
                                          allowed)});
  };
  for (int day = 1; day <= in.horizon_days; ++day) {
    const double day_alk0 = t.alk_umol_kg / umol_per_dkh, day_ca0 = t.ca_mg_l, day_mg0 = t.mg_mg_l;
    std::vector<double> given_today(in.deliveries.size(), 0.0);
    double limewater_ml = 0;
    // The model steps at every slot of every delivery (plan.hpp), dosed or not.
    std::vector<int> ticks;
    for (const Delivery& dv : in.deliveries) {
      const double window = (dv.last_hour - dv.first_hour + 1) * 60.0;
      for (int j = 0; j < dv.doses_per_day; ++j) {
        ticks.push_back(static_cast<int>(std::floor(dv.first_hour * 60.0 + (j + 0.5) * window / dv.doses_per_day)));
      }
    }
    std::sort(ticks.begin(), ticks.end());
    std::size_t tick = 0;
    while (next < order.size() && doses[order[next]].day == day) {
      const std::size_t idx = order[next++];
      const PlannedDose& d = doses[idx];
      if (d.delivery >= in.deliveries.size() || d.minute < 0 || d.minute >= 1440 || !(d.amount > 0)) {
        rep.other.push_back(fmt::format("dose {} is malformed", idx));
        continue;
      }
      const Delivery& dv = in.deliveries[d.delivery];
      while (tick < ticks.size() && ticks[tick] <= d.minute) {
        const double h = (day - 1) * 24.0 + ticks[tick] / 60.0;
        if (!pass_time(t, h - clock_h)) rep.other.push_back("carbonate solve failed");
        clock_h = h;
        ++tick;
      }
      if (std::abs(clock_h - ((day - 1) * 24.0 + d.minute / 60.0)) > 1e-9) {
        rep.other.push_back(fmt::format("dose {} at minute {} is not at a slot of any delivery", idx, d.minute));
      }
      if (d.minute < dv.first_hour * 60 || d.minute >= (dv.last_hour + 1) * 60) {
        rep.other.push_back(fmt::format("dose {} at minute {} is outside the allowed hours", idx, d.minute));
      }
      if (d.amount > dv.max_dose * (1 + 1e-12) || d.amount < dv.min_dose * (1 - 1e-12)) {
        rep.other.push_back(fmt::format("dose {} of {:g} is outside the pump's {:g}..{:g}", idx, d.amount, dv.min_dose,
                                        dv.max_dose));
      }
      given_today[d.delivery] += d.amount;
      given_total[d.delivery] += d.amount;
      if (dv.additive.limewater) limewater_ml += d.amount;
      // The dose itself: straight from the additive's chemistry per unit.
      const auto& u = dv.additive.per_unit;
      t.alk_umol_kg += u.alkalinity_eq * d.amount * 1e6 / kg;
      t.dic_umol_kg += u.dic_mol * d.amount * 1e6 / kg;
      t.ca_mg_l += u.calcium_mol * d.amount * 40.078e3 / volume;
      t.mg_mg_l += u.magnesium_mol * d.amount * 24.305e3 / volume;
      WaterState s;
      if (!state_of(t, s)) {
        rep.other.push_back("carbonate solve failed");
        continue;
      }
      rep.after[idx] = s;
      rep.max_ph_total = std::max(rep.max_ph_total, s.ph_total);
      rep.max_omega_aragonite = std::max(rep.max_omega_aragonite, s.omega_aragonite);
      if (s.ph_total > lim.get(LimitId::PhAfterDose) + kTolPh) violate(idx, day, LimitId::PhAfterDose, s.ph_total, lim.get(LimitId::PhAfterDose));
      if (s.omega_aragonite > lim.get(LimitId::OmegaAragoniteAfterDose) + kTolOmega) {
        violate(idx, day, LimitId::OmegaAragoniteAfterDose, s.omega_aragonite, lim.get(LimitId::OmegaAragoniteAfterDose));
      }
      const struct {
        double level, start;
        LimitId ceiling, rise;
        bool raised;
      } checks[] = {
          {s.alkalinity_dkh, day_alk0, LimitId::AlkalinityCeiling, LimitId::AlkalinityRisePerDay, u.alkalinity_eq > 0},
          {s.calcium_mg_l, day_ca0, LimitId::CalciumCeiling, LimitId::CalciumRisePerDay, u.calcium_mol > 0},
          {s.magnesium_mg_l, day_mg0, LimitId::MagnesiumCeiling, LimitId::MagnesiumRisePerDay, u.magnesium_mol > 0},
      };
      for (const auto& c : checks) {
        if (!c.raised) continue;  // a dose is judged on what it raises; a level already high is the start's doing
        if (c.level > lim.get(c.ceiling) + kTolLevel) violate(idx, day, c.ceiling, c.level, lim.get(c.ceiling));
        if (c.level - c.start > lim.get(c.rise) + kTolLevel) violate(idx, day, c.rise, c.level - c.start, lim.get(c.rise));
      }
    }
    for (std::size_t i = 0; i < in.deliveries.size(); ++i) {
      const Delivery& dv = in.deliveries[i];
      if (given_today[i] > dv.max_per_day * (1 + 1e-12)) {
        rep.other.push_back(fmt::format("day {}: {} gave {:g}, over its {:g} per day", day, dv.additive.name,
                                        given_today[i], dv.max_per_day));
      }
      if (dv.reservoir > 0 && given_total[i] > dv.reservoir * (1 + 1e-12)) {
        rep.other.push_back(fmt::format("day {}: {} used {:g}, more than its reservoir {:g}", day, dv.additive.name,
                                        given_total[i], dv.reservoir));
      }
    }
    if (limewater_ml > in.evaporation_l_per_day * 1000.0 * (1 + 1e-12) + 1e-9) {
      rep.other.push_back(fmt::format("day {}: {:g} mL limewater exceeds the {:g} L evaporation", day, limewater_ml,
                                      in.evaporation_l_per_day));
    }
    for (; tick < ticks.size(); ++tick) {
      const double h = (day - 1) * 24.0 + ticks[tick] / 60.0;
      if (!pass_time(t, h - clock_h)) rep.other.push_back("carbonate solve failed");
      clock_h = h;
    }
    if (!pass_time(t, day * 24.0 - clock_h)) rep.other.push_back("carbonate solve failed");
    clock_h = day * 24.0;
    WaterState e;
    if (state_of(t, e)) rep.day_end.push_back(e);
  }
  if (next < order.size()) rep.other.push_back("doses after the horizon");
  return rep;
}

CheckReport check_plan(const PlanInput& in, const Plan& plan) {
  std::vector<PlannedDose> list;
  list.reserve(plan.doses.size());
  for (const auto& d : plan.doses) list.push_back({d.day, d.minute, d.delivery, d.amount});
  return check_doses(in, list);
}

Result<WhatIf> what_if(const PlanInput& in, const Plan& plan, std::size_t dose, Mishap mishap) {
  if (dose >= plan.doses.size()) {
    return Error{"dose", fmt::format("dose {} does not exist (accepted: 0 to {})", dose,
                                     plan.doses.empty() ? 0 : plan.doses.size() - 1)};
  }
  std::vector<PlannedDose> list;
  std::size_t watched = SIZE_MAX;
  for (std::size_t i = 0; i < plan.doses.size(); ++i) {
    const auto& d = plan.doses[i];
    if (i == dose && mishap == Mishap::Missed) continue;
    list.push_back({d.day, d.minute, d.delivery, d.amount});
    if (i == dose) {
      list.push_back({d.day, d.minute, d.delivery, d.amount});  // the pump ran a second time
      watched = list.size() - 1;
    }
  }
  const CheckReport rep = check_doses(in, list);
  const auto& target = plan.doses[dose];
  const int day = target.day;
  if (rep.day_end.size() < static_cast<std::size_t>(day) || plan.days.size() < static_cast<std::size_t>(day)) {
    return Error{"dose", "the replay of this dose failed"};
  }
  WhatIf out;
  out.dose = dose;
  out.mishap = mishap;
  const WaterState& planned = plan.days[static_cast<std::size_t>(day - 1)].end;
  const WaterState& got = rep.day_end[static_cast<std::size_t>(day - 1)];
  out.alkalinity_dkh_change = got.alkalinity_dkh - planned.alkalinity_dkh;
  out.calcium_mg_l_change = got.calcium_mg_l - planned.calcium_mg_l;
  out.magnesium_mg_l_change = got.magnesium_mg_l - planned.magnesium_mg_l;
  if (watched != SIZE_MAX) {
    out.ph_total_after = rep.after[watched].ph_total;
    out.omega_aragonite_after = rep.after[watched].omega_aragonite;
  } else {
    out.ph_total_after = target.after.ph_total;
    out.omega_aragonite_after = target.after.omega_aragonite;
  }
  out.within_limits = rep.violations.empty();
  const std::string& name = in.deliveries[target.delivery].additive.name;
  out.summary = fmt::format(
      "{} {:g} {} of {} on day {} at {:02d}:{:02d}: end of day alkalinity {:+.2f} dKH, calcium {:+.1f} mg/L, "
      "magnesium {:+.1f} mg/L{}; {}",
      mishap == Mishap::Missed ? "missed:" : "ran twice:", target.amount,
      additives::to_string(in.deliveries[target.delivery].additive.unit), name, day, target.minute / 60,
      target.minute % 60, out.alkalinity_dkh_change, out.calcium_mg_l_change, out.magnesium_mg_l_change,
      mishap == Mishap::RanTwice
          ? fmt::format(", pH {:.3f} (total scale) and Omega aragonite {:.2f} right after", out.ph_total_after,
                        out.omega_aragonite_after)
          : std::string(),
      out.within_limits ? "stays inside every limit"
                        : "CROSSES A LIMIT: " + rep.violations.front().message);
  return out;
}

std::vector<WhatIf> mishap_summary(const PlanInput& in, const Plan& plan) {
  std::vector<WhatIf> out;
  for (std::size_t i = 0; i < in.deliveries.size(); ++i) {
    std::size_t best = SIZE_MAX;
    for (std::size_t j = 0; j < plan.doses.size(); ++j) {
      if (plan.doses[j].delivery == i && (best == SIZE_MAX || plan.doses[j].amount > plan.doses[best].amount)) best = j;
    }
    if (best == SIZE_MAX) continue;
    for (Mishap m : {Mishap::Missed, Mishap::RanTwice}) {
      auto w = what_if(in, plan, best, m);
      if (w) out.push_back(*w);
    }
  }
  return out;
}

}  // namespace tw::plan
