// Journal -> series adapter (estimate.hpp 6): one system's tests, doses, water changes and
// top-offs as three plain series of Measurement / Addition / Dilution for the filter.
#include <algorithm>
#include <cmath>
#include <utility>

#include <fmt/format.h>

#include "tidewright/additives/additives.hpp"
#include "tidewright/common/datetime.hpp"
#include "tidewright/estimate/estimate.hpp"
#include "tidewright/journal/schedule.hpp"

namespace tw::estimate {
namespace {

constexpr double kSecondsPerDay = 86400.0;

std::size_t index_of(Parameter p) { return static_cast<std::size_t>(p); }

Series& series_of(SystemSeries& s, Parameter p) {
  switch (p) {
    case Parameter::Alkalinity: return s.alkalinity;
    case Parameter::Calcium: return s.calcium;
    case Parameter::Magnesium: return s.magnesium;
    default: break;  // only the dosed parameters reach here
  }
  return s.alkalinity;
}

// Adds each parameter's rise from a chemical change, if it is not zero. logged[] collects the
// times of logged (not scheduled) additions per parameter for the unknown-dosing rule.
void add_change(SystemSeries& out, double t, const additives::ChemicalChange& c,
                std::vector<std::pair<double, double>>* logged = nullptr) {
  for (Parameter p : kAllParameters) {
    const double rise = additives::rise_of(p, c, out.volume_l);
    if (rise != 0.0 && std::isfinite(rise)) {
      series_of(out, p).events.push_back(Addition{t, rise, 0.0});
      if (logged) logged[index_of(p)].push_back({t, rise});
    }
  }
}

// What a logged dose adds, or a reason it cannot be counted.
Result<additives::ChemicalChange> dose_change(const journal::Dose& d, const journal::System& sys) {
  if (d.additive_id == "limewater") {  // saturated limewater by the mL
    if (d.unit != journal::DoseUnit::Millilitres)
      return Error{"unit", "limewater doses are counted in mL"};
    auto lw = additives::limewater_additive(sys.default_temperature_c);
    if (!lw) return lw.error();
    return additives::dose_effect(*lw, d.amount);
  }
  auto found = additives::find_compound(d.additive_id);
  if (!found) return found.error();
  const additives::Compound& c = **found;
  double grams = 0.0;
  if (d.unit == journal::DoseUnit::Grams) {
    grams = d.amount;
  } else if (d.stock_g_per_l) {
    grams = d.amount / 1000.0 * *d.stock_g_per_l;
  } else if (c.id == additives::CompoundId::CalciumHydroxide) {
    auto lw = additives::saturated_limewater(sys.default_temperature_c);  // the one limewater strength
    if (!lw) return lw.error();
    grams = d.amount / 1000.0 * lw->g_per_l;
  } else {
    return Error{"stock_g_per_l", "a dose in mL needs the stock's strength (stock_g_per_l)"};
  }
  return c.per_mole.scaled(grams / c.molar_mass_g_mol());
}

std::optional<double> new_water_value(const journal::WaterChange& w, Parameter p) {
  switch (p) {
    case Parameter::Alkalinity: return w.alkalinity_dkh;
    case Parameter::Calcium: return w.calcium_mg_l;
    case Parameter::Magnesium: return w.magnesium_mg_l;
    default: break;
  }
  return std::nullopt;
}

// Spans of unknown dosing of one parameter (estimate.hpp section 6): silences in its logged
// dosing longer than max(3 x usual spacing, 1 day), less the times a schedule doses it.
constexpr double kRateWindowDays = 14.0;
std::vector<UnknownDosing> unknown_spans(const std::vector<std::pair<double, double>>& logged,
                                         const std::vector<std::pair<double, double>>& scheduled_spans,
                                         double end_days) {
  std::vector<UnknownDosing> out;
  if (logged.empty()) return out;
  std::vector<double> gaps;
  for (std::size_t i = 1; i < logged.size(); ++i) gaps.push_back(logged[i].first - logged[i - 1].first);
  double spacing = 1.0;  // one logged dose only: taken as daily
  if (!gaps.empty()) {
    std::vector<double> recent(gaps.end() - static_cast<std::ptrdiff_t>(std::min<std::size_t>(gaps.size(), 20)),
                               gaps.end());
    std::nth_element(recent.begin(), recent.begin() + static_cast<std::ptrdiff_t>(recent.size() / 2), recent.end());
    spacing = std::max(recent[recent.size() / 2], 1.0 / 288.0);
  }
  const double silence = std::max(3.0 * spacing, 1.0);
  auto rate_before = [&](std::size_t last) {
    const double to = logged[last].first, from = to - kRateWindowDays;
    double sum = 0.0, first = to;
    for (std::size_t k = 0; k <= last; ++k) {
      if (logged[k].first > from) {
        sum += logged[k].second;
        first = std::min(first, logged[k].first);
      }
    }
    const double window = std::min(kRateWindowDays, to - first + spacing);
    return window > 0.0 ? std::fabs(sum) / window : 0.0;
  };
  for (std::size_t i = 0; i < logged.size(); ++i) {
    const bool last = i + 1 == logged.size();
    const double next = last ? end_days : logged[i + 1].first;
    if (next - logged[i].first <= silence) continue;
    const double from = logged[i].first + spacing;
    const double to = last ? kOpenEnd : next;
    const double rate = rate_before(i);
    if (!(rate > 0.0)) continue;
    // Cut out the times a schedule doses this parameter (its doses are known).
    std::vector<std::pair<double, double>> pieces{{from, to}};
    for (const auto& [s0, s1] : scheduled_spans) {
      std::vector<std::pair<double, double>> kept;
      for (const auto& [a, b] : pieces) {
        if (s1 <= a || s0 >= b) {
          kept.push_back({a, b});
          continue;
        }
        if (s0 > a) kept.push_back({a, s0});
        if (s1 < b) kept.push_back({s1, b});
      }
      pieces = std::move(kept);
    }
    for (const auto& [a, b] : pieces) {
      if (b > a) out.push_back(UnknownDosing{a, b, rate, logged[i].first});
    }
  }
  return out;
}

}  // namespace

const Series& SystemSeries::of(Parameter p) const {
  switch (p) {
    case Parameter::Alkalinity: return alkalinity;
    case Parameter::Calcium: return calcium;
    case Parameter::Magnesium: return magnesium;
    default: break;  // not a dosed parameter
  }
  return alkalinity;
}

Result<SystemSeries> series_from_journal(const journal::Journal& journal, journal::SystemId system,
                                         const JournalSeriesOptions& options) {
  const journal::System* sys = journal::find_system(journal, system);
  if (!sys) return Error{"system", fmt::format("system {} is not in the journal", system)};
  SystemSeries out;
  out.system_id = sys->id;
  out.system_name = sys->name;
  out.volume_l = sys->volume_l;
  journal::EventFilter filter;
  filter.system_id = sys->id;
  const auto events = journal::select_events(journal, filter);
  const std::int64_t end_s =
      options.until_s.value_or(events.empty() ? 0 : events.back()->time_s);
  out.end_days = static_cast<double>(end_s) / kSecondsPerDay;
  std::vector<std::pair<double, double>> logged[3];  // (time, rise) of logged additions
  std::vector<std::pair<double, std::string>> uncounted;  // time and what, of doses not counted
  for (const journal::Event* ev : events) {
    if (ev->time_s > end_s) break;
    const double t = static_cast<double>(ev->time_s) / kSecondsPerDay;
    // The time as text only for a note (formatting it for every event cost ~5 % of a demand run).
    auto when = [&] { return datetime::format_iso8601_utc(ev->time_s); };
    if (const auto* test = std::get_if<journal::TestResult>(&ev->data)) {
      if (!is_dosed(test->parameter)) continue;
      const Parameter p = test->parameter;
      auto value = journal::canonical_value(*test);
      if (!value) {
        out.notes.push_back(fmt::format("{} {} test left out: {}", when(), parameter_name(p),
                                        value.error().message));
        continue;
      }
      auto sigma = journal::canonical_precision(*test);
      if (!sigma || !(*sigma > 0.0)) sigma = info_of(test->parameter).typical_precision;
      series_of(out, p).events.push_back(Measurement{t, *value, sigma.value_or(1.0)});
    } else if (const auto* dose = std::get_if<journal::Dose>(&ev->data)) {
      if (dose->mark == journal::ScheduleMark::Missed) continue;  // taken off its schedule below
      journal::Dose counted = *dose;
      if (dose->mark == journal::ScheduleMark::Extra && dose->schedule_id) {
        const journal::Event* se = journal::find_event(journal, *dose->schedule_id);
        if (se) {
          if (const auto* sched = std::get_if<journal::DoseSchedule>(&se->data)) {
            counted = journal::delivered_dose(*sched, dose->amount);
          }
        }
      }
      auto change = dose_change(counted, *sys);
      if (!change) {
        out.notes.push_back(fmt::format("{} dose of {:g} {} {} not counted: {}", when(), dose->amount,
                                        journal::to_string(dose->unit), dose->additive_id,
                                        change.error().message));
        uncounted.push_back({t, dose->additive_id});
        continue;
      }
      add_change(out, t, *change, logged);
    } else if (const auto* top = std::get_if<journal::TopOff>(&ev->data)) {
      if (top->kind != journal::TopOffKind::Limewater) continue;  // plain: no change
      const additives::Compound& lime = additives::compound(additives::CompoundId::CalciumHydroxide);
      double g_per_l = 0;
      if (top->limewater_g_per_l) {
        g_per_l = *top->limewater_g_per_l;
      } else {  // saturated: the one limewater strength, at the system's temperature
        auto lw = additives::saturated_limewater(sys->default_temperature_c);
        if (!lw) {
          out.notes.push_back(fmt::format("{} limewater top-off not counted: {}", when(), lw.error().message));
          continue;
        }
        g_per_l = lw->g_per_l;
      }
      add_change(out, t, lime.per_mole.scaled(top->volume_l * g_per_l / lime.molar_mass_g_mol()), logged);
    } else if (const auto* wc = std::get_if<journal::WaterChange>(&ev->data)) {
      const double f = std::min(1.0, wc->volume_l / sys->volume_l);
      if (!(f > 0.0)) continue;
      for (Parameter p : kAllParameters) {
        if (auto v = new_water_value(*wc, p)) {
          series_of(out, p).events.push_back(Dilution{t, f, *v, 0.0});
        } else if (auto target = journal::target_of(*sys, p)) {
          series_of(out, p).events.push_back(
              Dilution{t, f, *target, options.new_water_unknown_sd[index_of(p)]});
          out.notes.push_back(fmt::format(
              "{} water change: new water's {} not logged; taken as the target {:g} {} +/- {:g}",
              when(), parameter_name(p), *target, parameter_unit(p), options.new_water_unknown_sd[index_of(p)]));
        } else {
          out.notes.push_back(fmt::format(
              "{} water change: new water's {} not logged and no target set; left out of the {} "
              "estimate",
              when(), parameter_name(p), parameter_name(p)));
        }
      }
    }
  }
  // Standing schedules: each scheduled dose as a logged one, up to the end.
  std::vector<std::pair<double, double>> schedule_spans[3];
  for (const journal::Event* se : journal::schedules_of(journal, sys->id)) {
    const auto& sched = std::get<journal::DoseSchedule>(se->data);
    auto per_dose = dose_change(journal::delivered_dose(sched, sched.amount), *sys);
    if (!per_dose) {
      out.notes.push_back(fmt::format("{} schedule of {:g} {} {} ({}) not counted: {}",
                                      datetime::format_iso8601_utc(se->time_s), sched.amount,
                                      journal::to_string(sched.unit), sched.additive_id, sched.device,
                                      per_dose.error().message));
      continue;
    }
    const bool running_at_end = se->time_s <= end_s && (!sched.stop_time_s || *sched.stop_time_s > end_s);
    for (Parameter p : kAllParameters) {
      const double rise = additives::rise_of(p, *per_dose, out.volume_l);
      if (rise == 0.0 || !std::isfinite(rise)) continue;
      const double from = static_cast<double>(se->time_s) / kSecondsPerDay;
      const double to = sched.stop_time_s ? static_cast<double>(*sched.stop_time_s) / kSecondsPerDay : kOpenEnd;
      schedule_spans[index_of(p)].push_back({from, to});
      if (running_at_end) {
        out.scheduled[index_of(p)] = true;
        out.scheduled_per_day[index_of(p)] += rise * sched.doses_per_day;
      }
    }
  }
  for (const journal::ScheduledDose& d : journal::scheduled_doses(journal, sys->id, 0, end_s)) {
    auto change = dose_change(d.dose, *sys);
    if (change) add_change(out, static_cast<double>(d.time_s) / kSecondsPerDay, *change);
  }
  for (Parameter p : kAllParameters) {
    Series& series = series_of(out, p);
    std::stable_sort(series.events.begin(), series.events.end(),
                     [](const SeriesEvent& a, const SeriesEvent& b) { return time_of(a) < time_of(b); });
    series.unknown_dosing = unknown_spans(logged[index_of(p)], schedule_spans[index_of(p)], out.end_days);
  }
  // Doses after the newest test of any parameter that could not be counted.
  double newest_test = -1.0;
  for (Parameter p : kAllParameters) {
    for (const SeriesEvent& e : series_of(out, p).events) {
      if (std::holds_alternative<Measurement>(e)) newest_test = std::max(newest_test, time_of(e));
    }
  }
  for (const auto& u : uncounted) {
    if (u.first > newest_test) ++out.uncounted_after_last_test;
  }
  return out;
}

double recent_daily_addition(const Series& series, double window_days,
                             std::optional<double> until_days) {
  if (series.events.empty() || !(window_days > 0.0)) return 0.0;
  const double end = until_days.value_or(time_of(series.events.back()));
  const double start = end - window_days;
  double sum = 0.0;
  for (const SeriesEvent& e : series.events) {
    if (const auto* a = std::get_if<Addition>(&e)) {
      if (a->time_days > start && a->time_days <= end) sum += a->delta;
    }
  }
  return sum / window_days;
}

}  // namespace tw::estimate
