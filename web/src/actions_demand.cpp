// The Demand screen's results: the current system's journal -> estimate and forecast per
// parameter, recomputed when AppState::revision, the system, the hour or the forecast length moved.
#include "actions_dosing.hpp"

#include "actions.hpp"
#include "format.hpp"
#include "platform.hpp"
#include "tidewright/estimate/estimate.hpp"

namespace twapp {

namespace est = tw::estimate;

ShownUnit shown_unit(const tw::journal::UnitPreferences& u, tw::Parameter p) {
  ShownUnit s;
  if (p == est::Parameter::Alkalinity) {
    const fmtx::UnitShown a = fmtx::alkalinity_shown(u.alkalinity);
    s.factor = fmtx::alkalinity_from_dkh(1.0, u.alkalinity);
    s.unit = a.unit;
    s.decimals = a.decimals;
  } else {
    const auto ion = p == est::Parameter::Calcium ? tw::units::Ion::Calcium : tw::units::Ion::Magnesium;
    s.factor = ion_shown(1.0, u.calcium_magnesium, ion);
    s.unit = tw::units::to_string(u.calcium_magnesium);
    s.decimals = ion_decimals(u.calcium_magnesium);
  }
  return s;
}

// ---------------------------------------------------------------- One system
// The estimate of one system at now_s, into out's result part (the Demand screen and the
// farm overview both call this, so they show the same numbers).
void estimate_system(const tw::journal::Journal& journal, const tw::journal::System& sys, std::int64_t now_s,
                     int forecast_days, DemandCache& out, bool smooth) {
  out.now_days = static_cast<double>(now_s) / 86400.0;
  out.volume_l = sys.volume_l;
  // As `tidewright demand`: standing schedules give their doses up to now and the state is
  // read at now; the forecast's dosing is the running schedules, else the last 7 days' doses.
  est::JournalSeriesOptions so;
  so.until_s = now_s;
  auto series = est::series_from_journal(journal, sys.id, so);
  if (!series) {
    out.error = series.error().message;
    return;
  }
  out.notes = series->notes;
  for (size_t i = 0; i < 3; ++i) {
    const est::Parameter p = est::kAllParameters[i];
    const est::Series& s = series->of(p);
    ParameterEstimate& pe = out.per_parameter[i];
    for (const est::SeriesEvent& ev : s.events) {
      if (const auto* a = std::get_if<est::Addition>(&ev)) {
        pe.addition_days.push_back(a->time_days);
        pe.addition_deltas.push_back(a->delta);
      } else if (const auto* d = std::get_if<est::Dilution>(&ev)) {
        pe.dilution_days.push_back(d->time_days);
        pe.dilution_fractions.push_back(d->fraction_replaced);
      }
    }
    est::FilterOptions opts = est::default_filter_options(p);
    opts.smooth = smooth;  // the smoother changes the history only, never the state at now
    auto r = est::estimate_series(s, opts, out.now_days);
    if (!r) {
      pe.error = r.error().message;
      continue;
    }
    pe.ok = true;
    pe.estimate = std::move(r).value();
    pe.stale = est::is_stale(pe.estimate, out.now_days);
    pe.scheduled = series->scheduled[i];
    if (!pe.estimate.demand_known || pe.stale) continue;
    pe.daily_dose_effect = series->scheduled[i] ? series->scheduled_per_day[i]
                                                : est::recent_daily_addition(s, est::kRecentDosingWindowDays, out.now_days);
    auto f = est::forecast_levels(pe.estimate, pe.daily_dose_effect, forecast_days, opts);
    if (f) {
      pe.forecast = std::move(f).value();
    } else {
      pe.forecast_error = f.error().message;
    }
  }
  if (out.per_parameter[0].ok && out.per_parameter[1].ok) {
    out.ratio = est::read_calcium_alkalinity(out.per_parameter[0].estimate, out.per_parameter[1].estimate, out.now_days);
  }
}

// ---------------------------------------------------------------- Demand
void refresh_demand(AppState& app) {
  DemandView& view = app.ui.dosing.demand;
  DemandCache& c = app.ui.dosing.demand_cache;
  const std::int64_t now_s = platform::now_unix_seconds();
  const std::int64_t hour = now_s / 3600;
  if (c.valid && c.system == app.current_system && c.now_hour == hour && c.forecast_days == view.forecast_days &&
      c.revision == app.revision) {
    return;
  }
  DemandCache out;
  out.valid = true;
  out.revision = app.revision;
  out.system = app.current_system;
  out.now_hour = hour;
  out.forecast_days = view.forecast_days;
  out.computed_count = c.computed_count + 1;
  out.now_days = static_cast<double>(now_s) / 86400.0;
  const tw::journal::System* sys = current_system(app);
  if (!sys) {
    out.error = "No system yet: add one on the Systems screen, then log tests.";
    c = std::move(out);
    return;
  }
  estimate_system(app.journal, *sys, now_s, view.forecast_days, out, true);
  c = std::move(out);
}

}  // namespace twapp
