// Journal -> series adapter (estimate.hpp 6): one system's tests, doses, water changes and
// top-offs as three plain series of Measurement / Addition / Dilution for the filter.
#include <cmath>

#include <fmt/format.h>

#include "tidewright/additives/additives.hpp"
#include "tidewright/common/datetime.hpp"
#include "tidewright/estimate/estimate.hpp"

namespace tw::estimate {
namespace {

constexpr double kSecondsPerDay = 86400.0;

std::optional<Parameter> estimate_parameter(journal::Parameter p) {
  switch (p) {
    case journal::Parameter::Alkalinity: return Parameter::Alkalinity;
    case journal::Parameter::Calcium: return Parameter::Calcium;
    case journal::Parameter::Magnesium: return Parameter::Magnesium;
    default: return std::nullopt;
  }
}

additives::Parameter additive_parameter(Parameter p) {
  switch (p) {
    case Parameter::Alkalinity: return additives::Parameter::Alkalinity;
    case Parameter::Calcium: return additives::Parameter::Calcium;
    case Parameter::Magnesium: return additives::Parameter::Magnesium;
  }
  return additives::Parameter::Alkalinity;
}

std::size_t index_of(Parameter p) { return static_cast<std::size_t>(p); }

Series& series_of(SystemSeries& s, Parameter p) {
  switch (p) {
    case Parameter::Alkalinity: return s.alkalinity;
    case Parameter::Calcium: return s.calcium;
    case Parameter::Magnesium: return s.magnesium;
  }
  return s.alkalinity;
}

// Adds each parameter's rise from a chemical change, if it is not zero.
void add_change(SystemSeries& out, double t, const additives::ChemicalChange& c) {
  for (Parameter p : kAllParameters) {
    const double rise = additives::rise_of(additive_parameter(p), c, out.volume_l);
    if (rise != 0.0 && std::isfinite(rise)) series_of(out, p).events.push_back(Addition{t, rise, 0.0});
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
  }
  return std::nullopt;
}

std::optional<double> target_of(const journal::System& s, Parameter p) {
  switch (p) {
    case Parameter::Alkalinity: return s.targets.alkalinity_dkh;
    case Parameter::Calcium: return s.targets.calcium_mg_l;
    case Parameter::Magnesium: return s.targets.magnesium_mg_l;
  }
  return std::nullopt;
}

}  // namespace

const Series& SystemSeries::of(Parameter p) const {
  switch (p) {
    case Parameter::Alkalinity: return alkalinity;
    case Parameter::Calcium: return calcium;
    case Parameter::Magnesium: return magnesium;
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
  for (const journal::Event* ev : journal::select_events(journal, filter)) {
    const double t = static_cast<double>(ev->time_s) / kSecondsPerDay;
    const std::string when = datetime::format_iso8601_utc(ev->time_s);
    if (const auto* test = std::get_if<journal::TestResult>(&ev->data)) {
      const auto p = estimate_parameter(test->parameter);
      if (!p) continue;
      auto value = journal::canonical_value(*test);
      if (!value) {
        out.notes.push_back(fmt::format("{} {} test left out: {}", when, to_string(*p),
                                        value.error().message));
        continue;
      }
      auto sigma = journal::canonical_precision(*test);
      if (!sigma || !(*sigma > 0.0)) sigma = journal::typical_precision(test->parameter);
      series_of(out, *p).events.push_back(Measurement{t, *value, sigma.value_or(1.0)});
    } else if (const auto* dose = std::get_if<journal::Dose>(&ev->data)) {
      auto change = dose_change(*dose, *sys);
      if (!change) {
        out.notes.push_back(fmt::format("{} dose of {:g} {} {} not counted: {}", when, dose->amount,
                                        journal::to_string(dose->unit), dose->additive_id,
                                        change.error().message));
        continue;
      }
      add_change(out, t, *change);
    } else if (const auto* top = std::get_if<journal::TopOff>(&ev->data)) {
      if (top->kind != journal::TopOffKind::Limewater) continue;  // plain: no change
      const additives::Compound& lime = additives::compound(additives::CompoundId::CalciumHydroxide);
      double g_per_l = 0;
      if (top->limewater_g_per_l) {
        g_per_l = *top->limewater_g_per_l;
      } else {  // saturated: the one limewater strength, at the system's temperature
        auto lw = additives::saturated_limewater(sys->default_temperature_c);
        if (!lw) {
          out.notes.push_back(fmt::format("{} limewater top-off not counted: {}", when, lw.error().message));
          continue;
        }
        g_per_l = lw->g_per_l;
      }
      add_change(out, t, lime.per_mole.scaled(top->volume_l * g_per_l / lime.molar_mass_g_mol()));
    } else if (const auto* wc = std::get_if<journal::WaterChange>(&ev->data)) {
      const double f = std::min(1.0, wc->volume_l / sys->volume_l);
      if (!(f > 0.0)) continue;
      for (Parameter p : kAllParameters) {
        if (auto v = new_water_value(*wc, p)) {
          series_of(out, p).events.push_back(Dilution{t, f, *v, 0.0});
        } else if (auto target = target_of(*sys, p)) {
          series_of(out, p).events.push_back(
              Dilution{t, f, *target, options.new_water_unknown_sd[index_of(p)]});
          out.notes.push_back(fmt::format(
              "{} water change: new water's {} not logged; taken as the target {:g} {} +/- {:g}",
              when, to_string(p), *target, unit_of(p), options.new_water_unknown_sd[index_of(p)]));
        } else {
          out.notes.push_back(fmt::format(
              "{} water change: new water's {} not logged and no target set; left out of the {} "
              "estimate",
              when, to_string(p), to_string(p)));
        }
      }
    }
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
