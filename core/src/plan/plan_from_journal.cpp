// Plan basis from the journal (plan_from_journal.hpp): reads the latest tests and runs the
// consumption estimate; the numbers all come from estimate.hpp, journal.hpp and plan.hpp.
#include "tidewright/plan/plan_from_journal.hpp"

#include <cmath>
#include <cstdint>

#include <fmt/format.h>

#include "tidewright/common/datetime.hpp"

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

}  // namespace

Result<JournalPlanBasis> plan_basis_from_journal(const journal::Journal& journal, journal::SystemId system,
                                                 const estimate::JournalSeriesOptions& options) {
  const journal::System* sys = journal::find_system(journal, system);
  if (sys == nullptr) return Error{"system", fmt::format("system {} is not in the journal", system)};
  auto series = estimate::series_from_journal(journal, system, options);
  if (!series) return series.error();

  JournalPlanBasis b;
  b.system_name = sys->name;
  b.volume_l = sys->volume_l;
  b.notes = series->notes;
  b.provenance.push_back(fmt::format("volume {:.0f} L: the system's net water volume in the journal", b.volume_l));

  b.salinity = sys->default_salinity;
  if (auto t = latest_test(journal, system, journal::Parameter::Salinity)) {
    b.salinity = t->value;
    b.provenance.push_back(fmt::format("salinity {:.1f}: latest test {}", b.salinity, datetime::format_date_utc(t->time_s)));
  } else {
    b.provenance.push_back(fmt::format("salinity {:.1f}: the system's default (no salinity test)", b.salinity));
  }
  b.temperature_c = sys->default_temperature_c;
  if (auto t = latest_test(journal, system, journal::Parameter::Temperature)) {
    b.temperature_c = t->value;
    b.provenance.push_back(fmt::format("temperature {:.1f} C: latest test {}", b.temperature_c, datetime::format_date_utc(t->time_s)));
  } else {
    b.provenance.push_back(fmt::format("temperature {:.1f} C: the system's default (no temperature test)", b.temperature_c));
  }

  double per_litre[3] = {0, 0, 0};
  std::optional<JournalLevel>* slot[3] = {&b.alkalinity_dkh, &b.calcium_mg_l, &b.magnesium_mg_l};
  for (estimate::Parameter p : estimate::kAllParameters) {
    const int i = static_cast<int>(p);
    const char* name = estimate::to_string(p);
    const char* unit = estimate::unit_of(p);
    auto e = estimate::estimate_series(series->of(p), estimate::default_filter_options(p));
    if (!e) return e.error();
    if (e->tests_used == 0 || e->history.empty()) continue;
    JournalLevel l;
    l.level = e->level;
    l.level_sd = e->level_sd;
    l.demand_known = e->demand_known;
    l.demand_per_day = e->demand_per_day;
    l.demand_sd = e->demand_sd;
    l.demand_low95 = e->demand_low95;
    l.demand_high95 = e->demand_high95;
    l.last_test_date = date_of_days(e->history.back().time_days);
    const int dp = p == estimate::Parameter::Alkalinity ? 2 : 0;
    b.provenance.push_back(fmt::format("{} {:.{}f} {}: estimated level at last test {} (sd {:.{}f})", name, l.level,
                                       dp, unit, l.last_test_date, l.level_sd, dp));
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

std::vector<std::string> apply_journal_basis(const JournalPlanBasis& basis, PlanInput& input) {
  std::vector<std::string> lines;
  lines.push_back(fmt::format("state and demand from the journal, system \"{}\":", basis.system_name));
  for (const auto& p : basis.provenance) lines.push_back(p);
  input.system.name = basis.system_name;
  input.system.volume_l = basis.volume_l;
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
  for (auto& r : rows) {
    if (!r.est) {
      lines.push_back(fmt::format("{}: no test in the journal; level {:g} and demand {:g} per day kept from the plan input",
                                  r.name, r.level, r.demand));
      continue;
    }
    r.level = r.est->level;
    if (r.est->demand_known) {
      r.demand = r.basis_demand;
    } else {
      lines.push_back(fmt::format("{}: demand unknown; {:g} per day kept from the plan input", r.name, r.demand));
    }
  }
  for (const auto& n : basis.notes) lines.push_back("journal note: " + n);
  return lines;
}

}  // namespace tw::plan
