// Demand: how fast the current system uses alkalinity, calcium or magnesium. The core's
// Kalman estimate (tw::estimate) of the logged tests, doses and water changes gives the level
// and the daily consumption with their uncertainty, flags outlying tests and forecasts the
// coming days. Map: 1. units shown  2. level chart + read-out  3. consumption chart
// 4. summary, forecast table, notes.
#include <algorithm>
#include <cmath>
#include <string>

#include <fmt/format.h>

#include "local_time.hpp"
#include "actions.hpp"
#include "actions_dosing.hpp"
#include "chart_timeseries.hpp"
#include "format.hpp"
#include "platform.hpp"
#include "screens.hpp"
#include "theme.hpp"
#include "tidewright/carbonate/uncertainty.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

namespace est = tw::estimate;

// ---------------------------------------------------------------- 1. Units shown
// The estimate works in dKH and mg/L; the screen shows the user's units (a linear factor).
struct Shown {
  double factor = 1;  // shown per core unit
  std::string unit;
  int decimals = 1;
  double band_half = 0;  // half-width of the target band, core units (common/parameter.hpp)
  std::string band_text;
};

Shown shown_for(const AppState& app, est::Parameter p) {
  const auto* sys = current_system(app);
  const tw::journal::UnitPreferences u = sys ? sys->units : app.settings.units;
  Shown s;
  const ShownUnit su = shown_unit(u, p);
  s.factor = su.factor;
  s.unit = su.unit;
  s.decimals = su.decimals;
  const tw::ParameterInfo& info = tw::info_of(p);
  s.band_half = info.band_half_width.value_or(0.0);
  s.band_text = fmt::format("target \u00b1 {:g} {}", s.band_half, info.unit);
  return s;
}

std::optional<double> target_of(const AppState& app, est::Parameter p) {
  const auto* sys = current_system(app);
  if (!sys) return std::nullopt;
  return tw::journal::target_of(*sys, p);
}

std::string when(double t_days) {
  return local_time::text(static_cast<std::int64_t>(std::llround(t_days * 86400.0)));
}

std::string val(const Shown& s, double v, int extra = 0) { return fmtx::fixed(v * s.factor, s.decimals + extra); }

// ---------------------------------------------------------------- 2. Level chart
void level_readout(AppState& app, const ParameterEstimate& pe, const Shown& s, double probe) {
  const est::SeriesEstimate& e = pe.estimate;
  std::string out;
  if (probe > e.time_days + 0.25 && !pe.forecast.empty()) {
    const est::ForecastPoint* best = &pe.forecast.front();
    for (const auto& f : pe.forecast) if (std::fabs(f.time_days - probe) < std::fabs(best->time_days - probe)) best = &f;
    out = "Forecast, day " + std::to_string(best->day) + " (" + chart::day_label(best->time_days) +
          "): " + val(s, best->level) + " " + s.unit + ", 95% range " + val(s, best->low95) + " to " + val(s, best->high95);
    ui::wrapped(out.c_str());
    ui::record(app, "demand.readout");
    return;
  }
  if (e.history.empty()) return;
  const est::HistoryPoint* h = &e.history.front();
  for (const auto& p : e.history) if (std::fabs(p.time_days - probe) < std::fabs(h->time_days - probe)) h = &p;
  out = "Test " + when(h->time_days) + ": " + val(s, h->reading) + " " + s.unit + " (" + est::to_string(h->status) +
        "). Estimated level then " + val(s, h->level) + " \u00b1 " + val(s, 1.96 * h->level_sd) + " " + s.unit + ".";
  ui::wrapped(out.c_str());
  ui::record(app, "demand.readout");
  if (h->status == est::TestStatus::Flagged || h->status == est::TestStatus::LevelRestart) {
    for (const auto& o : e.outliers) {
      if (std::fabs(o.time_days - h->time_days) < 1e-6) {
        const std::string why = "Why flagged: " + o.reason;
        ui::colored_wrapped(theme::kWarning, why.c_str());
        ui::record(app, "demand.readout_reason");
      }
    }
  }
  for (size_t i = 0; i < pe.addition_days.size(); ++i) {
    if (std::fabs(pe.addition_days[i] - probe) < 0.5) {
      const std::string d = "Dose " + when(pe.addition_days[i]) + ": +" + val(s, pe.addition_deltas[i], 1) + " " + s.unit;
      ui::dim_text(d.c_str());
    }
  }
  for (size_t i = 0; i < pe.dilution_days.size(); ++i) {
    if (std::fabs(pe.dilution_days[i] - probe) < 0.5) {
      const std::string d = "Water change " + when(pe.dilution_days[i]) + ": " +
                            fmtx::fixed(100 * pe.dilution_fractions[i], 0) + "% of the volume";
      ui::dim_text(d.c_str());
    }
  }
}

void draw_level_chart(AppState& app, const ParameterEstimate& pe, const Shown& s, std::optional<double> target) {
  const est::SeriesEstimate& e = pe.estimate;
  chart::TimeSeries ts;
  ts.name = "demand.chart.level";
  ts.y_unit = s.unit;
  ts.decimals = s.decimals;
  ts.now_t = app.ui.dosing.demand_cache.now_days;
  chart::Band level{{}, {}, {}, {}, theme::kAccent, false};
  for (const auto& h : e.history) {
    const chart::PointKind k = h.status == est::TestStatus::Flagged        ? chart::PointKind::Flagged
                               : h.status == est::TestStatus::LevelRestart ? chart::PointKind::Restart
                                                                            : chart::PointKind::Used;
    ts.points.push_back({h.time_days, h.reading * s.factor, k});
    level.t.push_back(h.time_days);
    level.mid.push_back(h.level * s.factor);
    level.lo.push_back((h.level - 1.96 * h.level_sd) * s.factor);
    level.hi.push_back((h.level + 1.96 * h.level_sd) * s.factor);
  }
  if (!e.history.empty() && e.time_days > e.history.back().time_days) {
    level.t.push_back(e.time_days);
    level.mid.push_back(e.level * s.factor);
    level.lo.push_back((e.level - 1.96 * e.level_sd) * s.factor);
    level.hi.push_back((e.level + 1.96 * e.level_sd) * s.factor);
  }
  ts.bands.push_back(level);
  if (!pe.forecast.empty()) {
    chart::Band f{{e.time_days}, {e.level * s.factor}, {(e.level - 1.96 * e.level_sd) * s.factor},
                  {(e.level + 1.96 * e.level_sd) * s.factor}, theme::kCo3, true};
    for (const auto& p : pe.forecast) {
      f.t.push_back(p.time_days);
      f.mid.push_back(p.level * s.factor);
      f.lo.push_back(p.low95 * s.factor);
      f.hi.push_back(p.high95 * s.factor);
    }
    ts.bands.push_back(f);
  }
  for (double t : pe.addition_days) ts.marks.push_back({t, chart::MarkKind::Dose});
  for (double t : pe.dilution_days) ts.marks.push_back({t, chart::MarkKind::WaterChange});
  if (target) {
    ts.target = *target * s.factor;
    ts.band_lo = (*target - s.band_half) * s.factor;
    ts.band_hi = (*target + s.band_half) * s.factor;
  }
  std::optional<double>& probe = app.ui.dosing.demand.probe_day;
  chart::draw_timeseries(app, ts, &probe);
  std::string legend = "Dots: tests.  Red rings: flagged tests.  Line and shade: estimated level (95%).";
  if (!pe.forecast.empty()) legend += "  Dashed with shade: forecast (95%).";
  if (!pe.addition_days.empty()) legend += "  Ticks at the bottom: doses (taller: several close together).";
  if (!pe.dilution_days.empty()) legend += "  Triangles: water changes.";
  if (target) legend += std::string("  Dashed line across, with its strip: ") + s.band_text + " (common practice).";
  ui::dim_text(legend.c_str());
  if (probe) {
    level_readout(app, pe, s, *probe);
  } else {
    ui::dim_text("Touch the chart to read a test, the reason a test was flagged, or the forecast.");
  }
}

// ---------------------------------------------------------------- 3. Consumption chart
void draw_demand_chart(AppState& app, const ParameterEstimate& pe, const Shown& s) {
  const est::SeriesEstimate& e = pe.estimate;
  chart::TimeSeries ts;
  ts.name = "demand.chart.demand";
  ts.y_unit = s.unit + " per day";
  ts.decimals = s.decimals + 1;
  ts.zero_line = 0.0;
  ts.height_em = 10;
  chart::Band b{{}, {}, {}, {}, theme::kCo2, false};
  for (const auto& h : e.history) {
    if (h.status == est::TestStatus::First) continue;
    b.t.push_back(h.time_days);
    b.mid.push_back(h.smoothed_demand_per_day * s.factor);
    b.lo.push_back((h.smoothed_demand_per_day - 1.96 * h.smoothed_demand_sd) * s.factor);
    b.hi.push_back((h.smoothed_demand_per_day + 1.96 * h.smoothed_demand_sd) * s.factor);
  }
  if (b.t.empty()) return;
  ts.bands.push_back(b);
  std::optional<double>& probe = app.ui.dosing.demand.probe_demand_day;
  chart::draw_timeseries(app, ts, &probe);
  ui::dim_text("Consumption per day, estimated with all tests (smoothed), shaded 95% band. Above zero: the water loses it.");
  if (probe) {
    size_t best = 0;
    for (size_t i = 0; i < b.t.size(); ++i) if (std::fabs(b.t[i] - *probe) < std::fabs(b.t[best] - *probe)) best = i;
    const std::string r = when(b.t[best]) + ": " + fmtx::fixed(b.mid[best], s.decimals + 1) + " " + s.unit +
                          "/day, 95% range " + fmtx::fixed(b.lo[best], s.decimals + 1) + " to " +
                          fmtx::fixed(b.hi[best], s.decimals + 1);
    ui::wrapped(r.c_str());
    ui::record(app, "demand.demand_readout");
  }
}

// ---------------------------------------------------------------- 4. Summary and forecast
void draw_summary(AppState& app, const ParameterEstimate& pe, const Shown& s) {
  const est::SeriesEstimate& e = pe.estimate;
  ui::card_begin(app);
  if (!e.demand_known) {
    ui::dim_text(e.tests == 0 ? "No tests of this parameter logged yet. Log at least two tests a day or more apart."
                              : "One usable test so far: log another a day or more later to see the consumption.");
  } else {
    ui::dim_text("Consumption now (95% range)");
    // Digits the estimate supports: set by its own uncertainty, not by the unit.
    const int dd = tw::carbonate::decimals_for_uncertainty(e.demand_sd * s.factor);
    ImGui::PushFont(app.ui.fonts.big);
    const std::string figure = fmtx::fixed(e.demand_per_day * s.factor, dd);
    ImGui::TextUnformatted(figure.c_str());
    ImGui::PopFont();
    ImGui::SameLine(0, 0.4f * ui::em(app));
    ImGui::PushFont(app.ui.fonts.bold);
    ImGui::TextUnformatted((s.unit + " per day").c_str());
    ImGui::PopFont();
    ui::record(app, "demand.consumption");
    app.ui.widgets["demand.consumption"].text = figure;  // the figure as shown (tests compare it)
    const std::string range = fmtx::fixed(e.demand_low95 * s.factor, dd) + " to " +
                              fmtx::fixed(e.demand_high95 * s.factor, dd) + " " + s.unit + " per day";
    ui::wrapped(range.c_str());
  }
  if (e.tests > 0) {
    const int ld = tw::carbonate::decimals_for_uncertainty(1.96 * e.level_sd * s.factor);
    ui::label_value(app, ("Level " + chart::day_label(e.time_days) + " (estimate)").c_str(),
                    fmtx::fixed(e.level * s.factor, ld) + " \u00b1 " + fmtx::fixed(1.96 * e.level_sd * s.factor, ld) + " " +
                        s.unit);
    ui::label_value(app, "Tests used", std::to_string(e.tests_used) + " of " + std::to_string(e.tests));
    ui::label_value(app, "Flagged tests", std::to_string(e.outliers.size()),
                    e.outliers.empty() ? 0 : theme::kWarning);
  }
  // The newest test is never left out: when it and the log disagree, the estimate restarts
  // from it and says so, with the likely reasons (the core's words).
  if (e.disagreement) {
    ui::colored_wrapped(theme::kWarning, ("The newest test and the log disagree: read " + val(s, e.disagreement->reading) +
                                          " " + s.unit + ", the log expected " + val(s, e.disagreement->expected) +
                                          " \u00b1 " + val(s, 1.96 * e.disagreement->expected_sd) + ". The level restarts from the test.")
                                             .c_str());
    ui::wrapped(e.disagreement->reasons.c_str());
    ui::wrapped(e.disagreement->question.c_str());
    ui::record(app, "demand.disagreement");
  }
  if (pe.stale) {
    ui::colored_wrapped(theme::kWarning, "The last test is too old to say today's level: test again before dosing by it.");
    ui::record(app, "demand.stale");
  }
  ui::card_end(app);
}

void draw_forecast(AppState& app, const ParameterEstimate& pe, const Shown& s, std::optional<double> target) {
  if (!pe.estimate.demand_known) return;
  ui::heading(app, "Forecast");
  const std::string assume = std::string(pe.scheduled ? "If the pumps' schedules go on (" : "If the dosing of the last 7 days goes on (") +
                             fmtx::fixed(pe.daily_dose_effect * s.factor, s.decimals + 1) + " " + s.unit +
                             " added per day) and the consumption stays as estimated:";
  ui::dim_text(assume.c_str());
  if (!pe.forecast_error.empty()) ui::colored_wrapped(theme::kError, pe.forecast_error.c_str());
  int& days = app.ui.dosing.demand.forecast_days;
  double d = days;
  if (ui::number_field(app, "demand.forecast_days", {"Days ahead", "days", 0, 1, 3, 60}, &d)) days = static_cast<int>(d);
  if (pe.forecast.empty()) return;
  if (ImGui::BeginTable("##forecast", 3, ImGuiTableFlags_RowBg | ImGuiTableFlags_SizingStretchProp)) {
    ImGui::TableSetupColumn("Day");
    ImGui::TableSetupColumn(("Level, " + s.unit).c_str());
    ImGui::TableSetupColumn("95% range");
    ImGui::TableHeadersRow();
    for (const auto& f : pe.forecast) {
      if (!(f.day <= 3 || f.day % 7 == 0 || f.day == static_cast<int>(pe.forecast.size()))) continue;
      ImGui::TableNextRow();
      ImGui::TableNextColumn();
      ImGui::Text("%d (%s)", f.day, chart::day_label(f.time_days).c_str());
      ImGui::TableNextColumn();
      const bool off = target && tw::band_side(tw::target_band(pe.estimate.parameter, *target), f.level) != tw::BandSide::Inside;
      if (off) ImGui::PushStyleColor(ImGuiCol_Text, theme::kWarning);
      ImGui::TextUnformatted(val(s, f.level).c_str());
      if (off) ImGui::PopStyleColor();
      ImGui::TableNextColumn();
      ImGui::TextUnformatted((val(s, f.low95) + " to " + val(s, f.high95)).c_str());
    }
    ImGui::EndTable();
  }
  ui::record(app, "demand.forecast_table");
  if (target) ui::dim_text("Yellow: more than the target band away from the target.");
}

// The screen's content; an early return (nothing to show) still ends the panes.
void draw_demand_panes(AppState& app, const DemandCache& c, const tw::journal::System* sys) {
  ui::heading(app, sys ? ("Demand of " + sys->name).c_str() : "Demand");
  if (!c.error.empty()) {
    ui::dim_text(c.error.c_str());
    return;
  }
  const char* const names[] = {"Alkalinity", "Calcium", "Magnesium"};
  int& pi = app.ui.dosing.demand.parameter;
  if (ui::choice(app, "demand.param", "", &pi, names, 3)) {
    app.ui.dosing.demand.probe_day.reset();
    app.ui.dosing.demand.probe_demand_day.reset();
  }
  pi = std::clamp(pi, 0, 2);
  const est::Parameter p = est::kAllParameters[pi];
  const ParameterEstimate& pe = c.per_parameter[pi];
  if (!pe.ok) {
    ui::colored_wrapped(theme::kError, pe.error.c_str());
    return;
  }
  const Shown s = shown_for(app, p);
  const std::optional<double> target = target_of(app, p);
  draw_summary(app, pe, s);
  if (pe.estimate.tests > 0) {
    ui::heading(app, (std::string(names[pi]) + " over time").c_str());
    draw_level_chart(app, pe, s, target);
  }
  if (pe.estimate.demand_known) {
    ui::heading(app, "Consumption per day");
    draw_demand_chart(app, pe, s);
  }
  ui::panes_next(app);
  draw_forecast(app, pe, s, target);
  if (p != est::Parameter::Magnesium && c.ratio.verdict != est::RatioVerdict::NotEnoughData) {
    ui::heading(app, "Calcium and alkalinity together");
    ui::wrapped(c.ratio.reading.c_str());
    ui::record(app, "demand.ratio");
  }
  draw_reactor_check(app);
  if (!c.notes.empty()) {
    ui::heading(app, "Log entries left out or assumed");
    for (const std::string& n : c.notes) ui::dim_text(("\u2022 " + n).c_str());
  }
  ui::dim_text("Kit precision sets how much one test counts: log it with each test when you know it. "
               "Typical hobby kits: 0.2 dKH, 10 mg/L calcium, 25 mg/L magnesium (common practice).");
}

}  // namespace

void draw_demand(AppState& app) {
  refresh_demand(app);
  const DemandCache& c = app.ui.dosing.demand_cache;
  const auto* sys = current_system(app);
  ui::panes_begin(app);  // wide: the summary and charts beside the forecast and the checks
  draw_demand_panes(app, c, sys);
  ui::panes_end(app);
}

}  // namespace twapp
