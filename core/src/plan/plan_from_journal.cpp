// Plan basis from the journal (plan_from_journal.hpp): reads the latest tests and runs the
// consumption estimate; the numbers all come from estimate.hpp, journal.hpp and plan.hpp.
#include "tidewright/plan/plan_from_journal.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>

#include <fmt/format.h>

#include "tidewright/common/datetime.hpp"
#include "tidewright/seawater/seawater.hpp"
#include "plan_internal.hpp"

namespace tw::plan {
namespace {

// Latest test of a parameter for the system, in its canonical unit, with its date.
struct LatestTest {
  double value = 0;
  std::int64_t time_s = 0;
};
std::optional<LatestTest> latest_test(const journal::Journal& j, journal::SystemId system,
                                      journal::Parameter p) {
  std::optional<LatestTest> out;
  for (const auto& e : j.events) {  // sorted by time
    if (e.system_id != system) continue;
    const auto* t = std::get_if<journal::TestResult>(&e.data);
    if (t == nullptr || t->parameter != p) continue;
    auto v = journal::canonical_value(*t);
    if (v.ok() && std::isfinite(*v)) out = LatestTest{*v, e.time_s};
  }
  return out;
}

std::string date_of_days(double time_days) {
  return datetime::format_date_utc(static_cast<std::int64_t>(std::llround(time_days * 86400.0)));
}

std::string age_text(std::int64_t time_s, std::int64_t now_s) {
  const double days = static_cast<double>(now_s - time_s) / 86400.0;
  return fmt::format("latest test {} ({:.0f} days old)", datetime::format_date_utc(time_s), days < 0 ? 0.0 : days);
}

}  // namespace

CurrentConditions current_conditions(const journal::Journal& j, const journal::System& sys, std::int64_t now_s) {
  CurrentConditions c;
  c.salinity = Condition{sys.default_salinity, std::nullopt,
                         fmt::format("salinity {:.1f}: the system's default (no salinity or specific gravity test)",
                                     sys.default_salinity)};
  const auto sal = latest_test(j, sys.id, journal::Parameter::Salinity);
  const auto sg = latest_test(j, sys.id, journal::Parameter::SpecificGravity);
  if (sal && (!sg || sal->time_s >= sg->time_s)) {
    c.salinity = Condition{sal->value, sal->time_s,
                           fmt::format("salinity {:.1f}: {}", sal->value, age_text(sal->time_s, now_s))};
  } else if (sg) {
    if (auto s = seawater::salinity_from_specific_gravity(sg->value); s) {
      c.salinity = Condition{*s, sg->time_s,
                             fmt::format("salinity {:.1f}: from specific gravity {:.4f}, {}", *s, sg->value,
                                         age_text(sg->time_s, now_s))};
    }
  }
  c.temperature_c = Condition{sys.default_temperature_c, std::nullopt,
                              fmt::format("temperature {:.1f} C: the system's default (no temperature test)",
                                          sys.default_temperature_c)};
  if (auto t = latest_test(j, sys.id, journal::Parameter::Temperature)) {
    c.temperature_c = Condition{t->value, t->time_s,
                                fmt::format("temperature {:.1f} C: {}", t->value, age_text(t->time_s, now_s))};
  }
  return c;
}

Result<JournalPlanBasis> plan_basis_from_journal(const journal::Journal& journal, journal::SystemId system,
                                                 const estimate::JournalSeriesOptions& options) {
  BasisOptions b;
  b.series = options;
  b.accept_stale = true;  // the old behaviour: levels at the last test, whatever its age
  return plan_basis_from_journal(journal, system, b);
}

Result<JournalPlanBasis> plan_basis_from_journal(const journal::Journal& journal, journal::SystemId system,
                                                 const BasisOptions& bo) {
  const estimate::JournalSeriesOptions& options = bo.series;
  const journal::System* sys = journal::find_system(journal, system);
  if (sys == nullptr) return Error{"system", fmt::format("system {} is not in the journal", system)};
  auto series = estimate::series_from_journal(journal, system, options);
  if (!series) return series.error();
  const std::optional<double> now_days =
      options.until_s ? std::optional<double>(static_cast<double>(*options.until_s) / 86400.0) : std::nullopt;

  JournalPlanBasis b;
  b.system_name = sys->name;
  b.volume_l = sys->volume_l;
  b.notes = series->notes;
  b.provenance.push_back(fmt::format("volume {:.0f} L: the system's net water volume in the journal", b.volume_l));

  std::int64_t now_s = options.until_s.value_or(0);
  if (!options.until_s) {
    for (const auto& e : journal.events) if (e.system_id == system) now_s = std::max(now_s, e.time_s);
  }
  const CurrentConditions cond = current_conditions(journal, *sys, now_s);
  b.salinity = cond.salinity.value;
  b.temperature_c = cond.temperature_c.value;
  b.provenance.push_back(cond.salinity.source);
  b.provenance.push_back(cond.temperature_c.source);

  double per_litre[3] = {0, 0, 0};
  std::optional<JournalLevel>* slot[3] = {&b.alkalinity_dkh, &b.calcium_mg_l, &b.magnesium_mg_l};
  for (estimate::Parameter p : estimate::kAllParameters) {
    const int i = static_cast<int>(p);
    const char* name = parameter_name(p);
    const char* unit = parameter_unit(p);
    auto e = estimate::estimate_series(series->of(p), estimate::default_filter_options(p), now_days);
    if (!e) return e.error();
    if (e->tests_used == 0 || e->history.empty()) continue;
    const int dp0 = info_of(p).decimals;
    bool stale_accepted = false;
    if (now_days && e->last_test_days) {
      const double age = *now_days - *e->last_test_days;
      const std::string when = date_of_days(*e->last_test_days);
      std::string why;
      if (estimate::is_stale(*e, *now_days)) {
        why = fmt::format("its last test ({}, {:.0f} days ago) is older than the {:.0f}-day horizon", when, age,
                          estimate::useful_horizon_days(p));
        stale_accepted = bo.accept_stale;
      } else if (e->unknown_dosing_level_sd > info_of(p).typical_precision.value_or(0.2)) {
        why = fmt::format("doses since its last test ({}) are not in the log and no schedule covers them, so today's "
                          "level could be {:.{}f} {} off either way",
                          when, e->unknown_dosing_level_sd, dp0, unit);
      }
      if (!why.empty()) {
        if (!bo.accept_stale) {
          return Error{"stale", fmt::format("{}: {}; test {} today (or add the pumps' schedule), or accept the "
                                            "old level explicitly", name, why, name)};
        }
        b.flags.push_back(fmt::format("{}: {}; planned from it anyway, as asked", name, why));
      }
    }
    if (e->disagreement) {
      b.flags.push_back(fmt::format("{}: the newest test and the log disagree; the plan starts from the test. {} {}",
                                    name, e->disagreement->reasons, e->disagreement->question));
    }
    JournalLevel l;
    l.level = e->level;
    l.level_sd = e->level_sd;
    if (stale_accepted) {
      // Beyond the horizon the consumption since is not known (a year of a 4 mg/L/day demand
      // "carried forward" reads as no calcium at all): the old level is the level at its last
      // test, as the keeper asked, not an extrapolation.
      l.level = e->history.back().level;
      l.level_sd = e->history.back().level_sd;
    }
    l.demand_known = e->demand_known;
    l.demand_per_day = e->demand_per_day;
    l.demand_sd = e->demand_sd;
    l.demand_low95 = e->demand_low95;
    l.demand_high95 = e->demand_high95;
    l.last_test_date = date_of_days(e->history.back().time_days);
    l.spread = estimate::spread_of(*e, estimate::default_filter_options(p));
    const int dp = info_of(p).decimals;
    b.provenance.push_back(fmt::format("{} {:.{}f} {}: estimated level {} (sd {:.{}f}), last test {}", name, l.level,
                                       dp, unit,
                                       stale_accepted ? "at its last test, stale (not carried to now)"
                                       : now_days     ? "now, with the known doses since"
                                                      : "at the last test",
                                       l.level_sd, dp, l.last_test_date));
    if (!l.demand_known) {
      b.provenance.push_back(fmt::format("{} demand: unknown (fewer than two usable tests)", name));
    } else if (l.demand_per_day < 0) {
      b.provenance.push_back(fmt::format("{} demand 0 {}/day: the estimate is {:.2f} (95 % {:.2f} to {:.2f}), a net gain; "
                                         "the plan doses none against it", name, unit, l.demand_per_day,
                                         l.demand_low95, l.demand_high95));
    } else {
      per_litre[i] = l.demand_per_day;
      b.provenance.push_back(fmt::format("{} demand {:.2f} {}/day: estimated from {} tests (95 % {:.2f} to {:.2f})",
                                         name, l.demand_per_day, unit, e->tests_used, l.demand_low95,
                                         l.demand_high95));
    }
    *slot[i] = l;
  }
  b.demand = demand_from_per_litre(per_litre[0], per_litre[1], per_litre[2], b.volume_l);
  return b;
}

namespace {

// Honest precision: levels and consumption read from the journal are estimates, so the plan
// keeps room for their uncertainty (plan.hpp kRateRoomSd, level_room_sd) instead of running up
// to a limit with the truth possibly beyond it. The largest rise and fall per day are
// tightened by 3 x the consumption's sd (the water may use more or less than estimated every
// day), the ceiling and floor of the level by 1.96 x the level's sd. A limit is never
// tightened by more than a quarter of the span between its floor and ceiling, or half of a
// rate, so a plan is still possible.
void tighten(Limits& limits, LimitId id, double by, const char* why, std::vector<std::string>& lines) {
  if (!(by > 0)) return;
  const LimitSpec& spec = limit_spec(id);
  const double before = limits.get(id);
  double room = std::fabs(before) * 0.5;
  if (id == LimitId::AlkalinityCeiling || id == LimitId::AlkalinityFloor) {
    room = 0.25 * (limits.get(LimitId::AlkalinityCeiling) - limits.get(LimitId::AlkalinityFloor));
  } else if (id == LimitId::CalciumCeiling || id == LimitId::CalciumFloor) {
    room = 0.25 * (limits.get(LimitId::CalciumCeiling) - limits.get(LimitId::CalciumFloor));
  } else if (id == LimitId::MagnesiumCeiling || id == LimitId::MagnesiumFloor) {
    room = 0.25 * (limits.get(LimitId::MagnesiumCeiling) - limits.get(LimitId::MagnesiumFloor));
  } else if (id == LimitId::PhAfterDose || id == LimitId::PhFloor) {
    room = 0.25 * (limits.get(LimitId::PhAfterDose) - limits.get(LimitId::PhFloor));
  } else if (id == LimitId::OmegaAragoniteAfterDose || id == LimitId::OmegaAragoniteFloor) {
    room = 0.25 * (limits.get(LimitId::OmegaAragoniteAfterDose) - limits.get(LimitId::OmegaAragoniteFloor));
  }
  by = std::min(by, std::max(0.0, room));
  if (!(by > 0)) return;
  const double after = spec.side == LimitSide::Floor ? before + by : before - by;
  limits.value[static_cast<std::size_t>(id)] = after;
  const int dp = std::fabs(before) < 20 ? 2 : 0;
  lines.push_back(fmt::format("the {} planned at {:.{}f}{} instead of {:.{}f}: room for {} of {}",
                              spec.description, after, dp, spec.unit_suffix(), before, dp, room_band(id), why));
}

}  // namespace

void keep_room_for_uncertainty(const JournalPlanBasis& basis, PlanInput& input, std::vector<std::string>& lines) {
  struct Row {
    const std::optional<JournalLevel>& est;
    LimitId rise, fall, ceiling, floor;
    Parameter parameter;
  } rows[3] = {
      {basis.alkalinity_dkh, LimitId::AlkalinityRisePerDay, LimitId::AlkalinityFallPerDay, LimitId::AlkalinityCeiling,
       LimitId::AlkalinityFloor, Parameter::Alkalinity},
      {basis.calcium_mg_l, LimitId::CalciumRisePerDay, LimitId::CalciumFallPerDay, LimitId::CalciumCeiling,
       LimitId::CalciumFloor, Parameter::Calcium},
      {basis.magnesium_mg_l, LimitId::MagnesiumRisePerDay, LimitId::MagnesiumFallPerDay, LimitId::MagnesiumCeiling,
       LimitId::MagnesiumFloor, Parameter::Magnesium},
  };
  if (!input.limits_as_set) input.limits_as_set = input.limits;
  Limits& limits = input.limits;
  double sd_at_test[3] = {0, 0, 0};     // each level's sd now
  for (std::size_t i = 0; i < 3; ++i) {
    const Row& r = rows[i];
    if (!r.est) continue;
    const char* name = parameter_name(r.parameter);
    input.spread[i] = r.est->spread;
    const std::string consumption = fmt::format("the {} consumption estimate", name);
    // Today's band: it widens as the plan goes on, and the plan says when to test before it
    // reaches a limit as set (plan_bands.cpp); a room for a week's band would put the floor
    // above a tank that is fine today.
    sd_at_test[i] = r.est->level_sd;
    const std::string level = fmt::format("the {} level estimate", name);
    if (r.est->demand_known) {
      tighten(limits, r.rise, kRateRoomSd * r.est->demand_sd, consumption.c_str(), lines);
      tighten(limits, r.fall, kRateRoomSd * r.est->demand_sd, consumption.c_str(), lines);
    }
    tighten(limits, r.ceiling, level_room_sd() * sd_at_test[i], level.c_str(), lines);
    tighten(limits, r.floor, level_room_sd() * sd_at_test[i], level.c_str(), lines);
  }
  // pH and Omega follow the alkalinity and calcium levels: their bands at the input's water.
  if (sd_at_test[0] > 0 || sd_at_test[1] > 0) {
    auto sens = detail::chemistry_sensitivity(input.system, input.system.alkalinity_dkh, input.system.calcium_mg_l);
    if (sens) {
      const auto hw = detail::chemistry_half_width(*sens, sd_at_test[0], sd_at_test[1], level_room_sd());
      const char* why = "pH and Omega from the alkalinity and calcium levels";
      tighten(limits, LimitId::PhAfterDose, hw.ph, why, lines);
      tighten(limits, LimitId::PhFloor, hw.ph, why, lines);
      tighten(limits, LimitId::OmegaAragoniteAfterDose, hw.omega, why, lines);
      tighten(limits, LimitId::OmegaAragoniteFloor, hw.omega, why, lines);
    }
  }
}

std::vector<KeptFromInput> put_basis_water(const JournalPlanBasis& basis, PlanInput& input) {
  input.system.salinity = basis.salinity;
  input.system.temperature_c = basis.temperature_c;
  // Demand in the input's volume is per system; convert the input's own demand only where kept.
  const DailyDemand& d = basis.demand;
  struct Row {
    const std::optional<JournalLevel>& est;
    double& level;
    double& demand;
    double basis_demand;
    const char* name;
  } rows[3] = {
      {basis.alkalinity_dkh, input.system.alkalinity_dkh, input.demand.alkalinity_meq_per_day,
       d.alkalinity_meq_per_day, "alkalinity"},
      {basis.calcium_mg_l, input.system.calcium_mg_l, input.demand.calcium_mg_per_day, d.calcium_mg_per_day,
       "calcium"},
      {basis.magnesium_mg_l, input.system.magnesium_mg_l, input.demand.magnesium_mg_per_day,
       d.magnesium_mg_per_day, "magnesium"},
  };
  std::vector<KeptFromInput> kept;
  for (auto& r : rows) {
    if (!r.est) {
      kept.push_back({r.name, true, r.level, r.demand});
      continue;
    }
    r.level = r.est->level;
    if (r.est->demand_known) {
      r.demand = r.basis_demand;
    } else {
      kept.push_back({r.name, false, r.level, r.demand});
    }
  }
  return kept;
}

std::vector<std::string> apply_journal_basis(const JournalPlanBasis& basis, PlanInput& input) {
  std::vector<std::string> lines;
  lines.push_back(fmt::format("state and demand from the journal, system \"{}\":", basis.system_name));
  for (const auto& p : basis.provenance) lines.push_back(p);
  input.system.name = basis.system_name;
  input.system.volume_l = basis.volume_l;
  for (const KeptFromInput& k : put_basis_water(basis, input)) {
    lines.push_back(k.no_test ? fmt::format("{}: no test in the journal; level {:g} and demand {:g} per day kept from "
                                            "the plan input", k.parameter, k.level, k.demand)
                              : fmt::format("{}: demand unknown; {:g} per day kept from the plan input", k.parameter,
                                            k.demand));
  }
  keep_room_for_uncertainty(basis, input, lines);
  for (const auto& f : basis.flags) lines.push_back("FLAG " + f);
  for (const auto& n : basis.notes) lines.push_back("journal note: " + n);
  return lines;
}

}  // namespace tw::plan
