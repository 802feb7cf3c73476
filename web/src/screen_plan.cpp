// Plan: the day-by-day dose schedule for the current system from the core's planner
// (tw::plan::make_plan), with the water predicted after each dose, every safety limit's status
// beside its default and source, the independent checker's replay and cautions; the verdict (can the
// plan hold the water inside its floors?) first. Map: 1. form  2. chart  3. days and doses
// 4. limits, verdict, adopt  5. draw_plan.
#include <algorithm>
#include <cmath>
#include <string>
#include <utility>
#include <vector>

#include "tidewright/common/ranges.hpp"
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

namespace pl = tw::plan;

// ---------------------------------------------------------------- 1. Form
// The stock cards (plan_stock_cards.cpp), then how far ahead and where the consumption comes from.
void draw_form(AppState& app, PlanForm& f) {
  namespace rg = tw::ranges;
  draw_plan_stock_cards(app, f);
  ui::card_begin(app);
  double h = f.horizon_days;
  if (ui::number_field(app, "plan.horizon", {"Days to plan", "days", 0, 1, rg::kPlanHorizonDays.lo, rg::kPlanHorizonDays.hi}, &h)) f.horizon_days = static_cast<int>(h);
  int src = f.use_estimate ? 0 : 1;
  const char* const srcs[] = {"From the log", "Typed here"};
  if (ui::choice(app, "plan.demand_source", "Consumption", &src, srcs, 2)) f.use_estimate = src == 0;
  if (f.accept_stale) {
    ui::colored_wrapped(theme::kWarning, "Planning from a level the log cannot vouch for today.");
    if (ui::button(app, "plan.refuse_stale", "Plan only from recent tests", 0, ui::Tone::Quiet)) f.accept_stale = false;
  }
  if (!f.use_estimate) {
    ui::number_field(app, "plan.alk_demand", {"Alkalinity consumption", "dKH/day", 2, 0.1,
                                                rg::kAlkalinityDemandMeqPerLDay.lo / tw::units::kMeqPerLPerDKH,
                                                rg::kAlkalinityDemandMeqPerLDay.hi / tw::units::kMeqPerLPerDKH},
                     &f.alkalinity_demand_dkh_per_day);
    ui::number_field(app, "plan.ca_demand", {"Calcium consumption", "mg/L/day", 1, 1, rg::kCalciumDemandMgPerLDay.lo,
                                                rg::kCalciumDemandMgPerLDay.hi},
                     &f.calcium_demand_mg_l_per_day);
    ui::number_field(app, "plan.mg_demand", {"Magnesium consumption", "mg/L/day", 1, 0.5, rg::kMagnesiumDemandMgPerLDay.lo,
                                               rg::kMagnesiumDemandMgPerLDay.hi},
                     &f.magnesium_demand_mg_l_per_day);
  }
  ui::card_end(app);
}

// ---------------------------------------------------------------- 2. Chart
double value_of(const pl::WaterState& w, int p) {
  return p == 0 ? w.alkalinity_dkh : p == 1 ? w.calcium_mg_l : w.magnesium_mg_l;
}

double dose_time(const PlanCache& c, const pl::DoseRecord& d) {
  return c.start_day + (d.day - 1) + d.minute / 1440.0;
}

void draw_chart(AppState& app, const PlanCache& c) {
  const pl::Plan& plan = *c.plan;
  int& p = app.ui.dosing.plan_chart;
  const char* const names[] = {"Alkalinity", "Calcium", "Magnesium"};
  if (ui::choice(app, "plan.chart_param", "", &p, names, 3)) app.ui.dosing.plan_probe_day.reset();
  const pl::Band& band = p == 0 ? c.input->targets.alkalinity_dkh : p == 1 ? c.input->targets.calcium_mg_l
                                                                           : c.input->targets.magnesium_mg_l;
  chart::TimeSeries ts;
  ts.name = "plan.chart";
  ts.y_unit = p == 0 ? "dKH (predicted)" : "mg/L (predicted)";
  ts.decimals = p == 0 ? 1 : 0;
  ts.target = band.target;
  ts.band_lo = band.low;
  ts.band_hi = band.high;
  chart::Band line{{}, {}, {}, {}, theme::kAccent, false};
  const double v0 = value_of(plan.start, p);
  line.t.push_back(c.start_day);
  line.mid.push_back(v0);
  for (size_t i = 0; i < plan.doses.size(); ++i) {
    const pl::DoseRecord& d = plan.doses[i];
    const double t = dose_time(c, d);
    const double v = value_of(d.after, p);
    line.t.push_back(t);
    line.mid.push_back(v);
    const double next = i + 1 < plan.doses.size() ? dose_time(c, plan.doses[i + 1]) : c.start_day + static_cast<double>(plan.days.size());
    line.t.push_back(std::max(t, next - 1e-3));
    line.mid.push_back(value_of(d.before_next, p));
    ts.marks.push_back({t, chart::MarkKind::Dose});
  }
  line.lo = line.mid;
  line.hi = line.mid;
  // The 95 % band of the forecast at each day's end (from today's level and the demand's
  // uncertainty), shaded around the day-end levels.
  if (plan.uncertainty && !plan.days.empty() && plan.days.front().end_band[static_cast<size_t>(p)]) {
    chart::Band unc{{}, {}, {}, {}, theme::kWarning, true};
    for (const pl::DaySummary& d : plan.days) {
      const auto& b = d.end_band[static_cast<size_t>(p)];
      if (!b) continue;
      unc.t.push_back(c.start_day + d.day);
      unc.mid.push_back(value_of(d.end, p));
      unc.lo.push_back(b->low);
      unc.hi.push_back(b->high);
    }
    ts.bands.push_back(unc);
  }
  ts.bands.push_back(line);
  std::optional<double>& probe = app.ui.dosing.plan_probe_day;
  chart::draw_timeseries(app, ts, &probe);
  ui::dim_text(plan.uncertainty ? "Predicted level after each dose and just before the next; ticks: doses; shaded: the target "
                                  "band; dashed with shade: each day's end with its 95% band (today's level and the "
                                  "consumption estimate's uncertainty)."
                                : "Predicted level after each dose and just before the next; ticks: doses; shaded: the target band.");
  if (probe && !plan.doses.empty()) {
    const pl::DoseRecord* best = &plan.doses.front();
    for (const auto& d : plan.doses) if (std::fabs(dose_time(c, d) - *probe) < std::fabs(dose_time(c, *best) - *probe)) best = &d;
    const pl::Delivery& del = c.input->deliveries[best->delivery];
    char hm[24];
    std::snprintf(hm, sizeof hm, "%02d:%02d", best->minute / 60, best->minute % 60);
    const std::string r = "Day " + std::to_string(best->day) + " " + hm + ", " + del.device + ": " +
                          fmtx::fixed(best->amount, 1) + " " + tw::additives::to_string(del.additive.unit) + " of " +
                          del.additive.name +
                          (del.calibration != 1.0 ? " (set " + fmtx::fixed(del.set_amount(best->amount), 1) + ")" : "") +
                          ". After: " + fmtx::fixed(best->after.alkalinity_dkh, 2) + " dKH, " +
                          fmtx::fixed(best->after.calcium_mg_l, 0) + " mg/L Ca, pH " + fmtx::fixed(best->after.ph_total, 2) +
                          " (total), \u03a9 " + fmtx::fixed(best->after.omega_aragonite, 2) +
                          (best->cap.empty() ? "" : ". Held back by: " + best->cap);
    ui::wrapped(r.c_str());
    ui::record(app, "plan.readout");
  }
}

// ---------------------------------------------------------------- 3. Days and doses
// "8.0 (7.2-8.8)": the level and its 95 % band, digits set by the band (a level known to
// +/- 0.4 dKH shows one decimal, not two); without a band, `decimals`.
std::string level_with_band(double level, const std::optional<pl::Band95>& band, int decimals) {
  if (!band) return fmtx::fixed(level, decimals);
  const int dp = std::min(decimals, tw::carbonate::decimals_for_uncertainty((band->high - band->low) / (2 * 1.96)));
  return fmtx::fixed(level, dp) + " (" + fmtx::fixed(band->low, dp) + "\u2013" + fmtx::fixed(band->high, dp) + ")";
}

// The width a day-table column needs to show its widest value and either its heading's longest
// word (whole_lines false: the heading may wrap between words) or each heading line whole.
float column_width(const std::vector<std::string>& head, const std::vector<std::vector<std::string>>& rows, int column,
                   bool whole_lines) {
  float w = 0;
  for (const std::string& line : head) {
    std::size_t start = 0;
    while (start <= line.size()) {
      const std::size_t end = whole_lines ? line.size() : std::min(line.find(' ', start), line.size());
      w = std::max(w, ImGui::CalcTextSize(line.data() + start, line.data() + end).x);
      start = end + 1;
    }
  }
  for (const auto& row : rows) w = std::max(w, ImGui::CalcTextSize(row[static_cast<size_t>(column)].c_str()).x);
  return std::max(w, 1.0f);
}

// Each column's share of the table's width: what it must show whole (its longest heading line,
// or where that does not fit on the screen, its longest word) and its widest value. A wide
// screen then shows "dKH end" on one line; a phone wraps headings between words, never inside.
std::vector<float> day_column_weights(const std::vector<std::vector<std::string>>& heads,
                                      const std::vector<std::vector<std::string>>& rows) {
  const int cols = static_cast<int>(heads.size());
  const float padding = 2 * ImGui::GetStyle().CellPadding.x * static_cast<float>(cols);
  std::vector<float> whole(heads.size()), broken(heads.size());
  float whole_sum = 0;
  for (int k = 0; k < cols; ++k) {
    whole[static_cast<size_t>(k)] = column_width(heads[static_cast<size_t>(k)], rows, k, true);
    broken[static_cast<size_t>(k)] = column_width(heads[static_cast<size_t>(k)], rows, k, false);
    whole_sum += whole[static_cast<size_t>(k)];
  }
  return whole_sum + padding <= ImGui::GetContentRegionAvail().x ? whole : broken;
}

// The day table's heading row: each column's lines (a pump column: pump, chemical, unit) wrapped
// inside the column, so a phone's narrow columns still name their pump in full instead of one
// line cut at the column's edge. Each heading is recorded as "plan.days.head.<column>".
void draw_day_heads(AppState& app, const std::vector<std::vector<std::string>>& heads) {
  ImGui::TableNextRow(ImGuiTableRowFlags_Headers);
  for (std::size_t k = 0; k < heads.size(); ++k) {
    ImGui::TableSetColumnIndex(static_cast<int>(k));
    ImGui::TableSetBgColor(ImGuiTableBgTarget_CellBg, ImGui::GetColorU32(ImGuiCol_TableHeaderBg));
    ImGui::BeginGroup();
    ImGui::PushTextWrapPos(0.0f);  // the column's right edge
    std::string text;
    for (const std::string& line : heads[k]) {
      if (line.empty()) continue;
      ImGui::TextUnformatted(line.c_str());
      text += (text.empty() ? "" : "\n") + line;
    }
    ImGui::PopTextWrapPos();
    ImGui::EndGroup();
    const std::string name = "plan.days.head." + std::to_string(k);
    ui::record(app, name);
    app.ui.widgets[name].text = text;
  }
}

void draw_days(AppState& app, PlanForm& f, const PlanCache& c) {
  const pl::Plan& plan = *c.plan;
  const auto& del = c.input->deliveries;
  // The magnesium level gets its own column when a pump doses it.
  const bool mg = std::any_of(del.begin(), del.end(), [](const pl::Delivery& d) { return d.additive.per_unit.magnesium_mol > 0; });
  const int cols = 3 + static_cast<int>(del.size()) + (mg ? 1 : 0);
  // On a phone, three pumps and three levels leave no room for the 95 % bands: the levels
  // alone (the chart above shades the bands).
  const bool bands = plan.uncertainty && ImGui::GetContentRegionAvail().x >= 7.0f * ui::em(app) * static_cast<float>(cols);
  const std::optional<pl::Band95> none;
  // The columns are named by pump; say what each pump doses. A pump whose calibration is not 1
  // shows the amount to SET on it (dose / calibration), and its column says so.
  ui::dim_text(pump_legend(del).c_str());
  std::vector<std::vector<std::string>> heads{{"Day"}};
  for (const auto& d : del) heads.push_back(pump_column_lines(d));
  heads.push_back({"dKH end", bands ? "(95%)" : ""});
  heads.push_back({"Ca end", bands ? "(95%)" : ""});
  if (mg) heads.push_back({"Mg end", bands ? "(95%)" : ""});
  const size_t shown = f.show_all_days ? plan.days.size() : std::min<size_t>(plan.days.size(), 7);
  std::vector<std::vector<std::string>> rows;
  for (size_t i = 0; i < shown; ++i) {
    const pl::DaySummary& d = plan.days[i];
    std::vector<std::string> row{std::to_string(d.day) + " (" +
                                 chart::day_label(c.start_day + d.day - 1 + 0.5) + ")"};
    for (std::size_t k = 0; k < d.amount_per_delivery.size(); ++k) {
      row.push_back(fmtx::fixed(del[k].set_amount(d.amount_per_delivery[k]), 1));
    }
    row.push_back(level_with_band(d.end.alkalinity_dkh, bands ? d.end_band[0] : none, 2));
    row.push_back(level_with_band(d.end.calcium_mg_l, bands ? d.end_band[1] : none, 0));
    if (mg) row.push_back(level_with_band(d.end.magnesium_mg_l, bands ? d.end_band[2] : none, 0));
    rows.push_back(std::move(row));
  }
  const std::vector<float> weights = day_column_weights(heads, rows);  // before the table: the page's width
  if (ImGui::BeginTable("##days", cols, ImGuiTableFlags_RowBg | ImGuiTableFlags_SizingStretchProp)) {
    for (int k = 0; k < cols; ++k) {
      ImGui::TableSetupColumn(nullptr, ImGuiTableColumnFlags_WidthStretch, weights[static_cast<size_t>(k)]);
    }
    draw_day_heads(app, heads);
    for (const auto& row : rows) {
      ImGui::TableNextRow();
      for (const std::string& cell : row) {
        ImGui::TableNextColumn();
        ImGui::TextUnformatted(cell.c_str());
      }
    }
    ImGui::EndTable();
  }
  ui::record(app, "plan.days");
  if (plan.days.size() > 7) {
    if (ui::button(app, "plan.show_all_days", f.show_all_days ? "Show the first week" : "Show every day", 0, ui::Tone::Quiet)) {
      f.show_all_days = !f.show_all_days;
    }
  }
  // Doses of day 1 with the water after each.
  ui::heading(app, "Doses of day 1");
  int count = 0;
  for (const pl::DoseRecord& d : plan.doses) {
    if (d.day != 1) continue;
    const pl::Delivery& dv = del[d.delivery];
    char hm[24];
    std::snprintf(hm, sizeof hm, "%02d:%02d", d.minute / 60, d.minute % 60);
    const std::string unit = tw::additives::to_string(dv.additive.unit);
    ui::label_value(app, (std::string(hm) + "  " + dv.device + " (" + dv.additive.name + ")").c_str(),
                    dv.calibration != 1.0 ? "set " + fmtx::fixed(dv.set_amount(d.amount), 1) + " " + unit + " (" +
                                                fmtx::fixed(d.amount, 1) + " to the tank)"
                                          : fmtx::fixed(d.amount, 1) + " " + unit);
    ui::dim_text(("after: " + fmtx::fixed(d.after.alkalinity_dkh, 2) + " dKH, " + fmtx::fixed(d.after.calcium_mg_l, 0) +
                  " mg/L Ca, " +
                  (dv.additive.per_unit.magnesium_mol > 0 ? fmtx::fixed(d.after.magnesium_mg_l, 0) + " mg/L Mg, " : std::string()) +
                  "pH " + fmtx::fixed(d.after.ph_total, 2) + " total, \u03a9 arag. " +
                  fmtx::fixed(d.after.omega_aragonite, 2) + (d.cap.empty() ? "" : "; held back by " + pl::cap_in_words(d.cap)))
                     .c_str());
    if (++count >= 24) break;
  }
  if (count == 0) ui::dim_text("No dose on day 1.");
  ui::record(app, "plan.doses");
}

// ---------------------------------------------------------------- 4. Limits
void draw_limits(AppState& app, const PlanCache& c) {
  const pl::Plan& plan = *c.plan;
  ui::card_begin(app);
  for (const pl::LimitSpec& s : pl::limit_specs()) {
    const size_t i = static_cast<size_t>(s.id);
    const double limit = plan.limits.get(s.id);
    const bool floor = s.side == pl::LimitSide::Floor;
    // The closest the independent checker saw the water come to this limit, over every state.
    const double closest = c.check ? c.check->closest[i] : 1e9;
    const bool tested = closest < 1e8;
    const double reached = floor ? limit + closest : limit - closest;
    const bool over = tested && closest < -1e-7;
    const bool near = tested && !over && closest <= 0.03 * std::fabs(limit);
    const ImU32 col = over ? theme::kError : near ? theme::kWarning : theme::kAccent;
    const int dec = std::fabs(limit) < 20 ? 2 : 0;
    ImGui::PushFont(app.ui.fonts.bold);
    std::string desc = s.description;
    if (!desc.empty()) desc[0] = static_cast<char>(std::toupper(static_cast<unsigned char>(desc[0])));
    ui::wrapped(desc.c_str());
    ImGui::PopFont();
    const std::string unit = *s.unit ? std::string(" ") + s.unit : std::string();  // Omega has none
    const std::string word = floor ? (over ? "below: " : near ? "at the floor: " : "lowest: ")
                                   : (over ? "over: " : near ? "at the limit: " : "within: ");
    ui::label_value(app, ((floor ? "floor " : "limit ") + fmtx::fixed(limit, dec) + unit).c_str(),
                    tested ? word + fmtx::fixed(reached, dec) : std::string("not reached by this plan"), col);
    ui::record(app, std::string("plan.limit.") + s.key);
    // Planned inside the keeper's setting (room for the uncertainty of the estimates): say both.
    if (c.input && c.input->limits_as_set) {
      const double set = c.input->limits_as_set->get(s.id);
      if (std::fabs(set - limit) > 1e-9 * std::max(1.0, std::fabs(set))) {
        ui::dim_text(("Set at " + fmtx::fixed(set, dec) + unit + "; planned at " + fmtx::fixed(limit, dec) + unit +
                      " to keep room for " + tw::plan::room_band(s.id) + " of the estimates.").c_str());
      }
    }
    ui::dim_text(("Default " + fmtx::fixed(s.default_value, dec) + unit + " (" + s.source + "); hard " +
                  (floor ? "floor " : "ceiling ") + fmtx::fixed(s.hard_bound, dec) + ".").c_str());
  }
  for (const std::string& r : plan.limits.record) ui::colored_wrapped(theme::kWarning, r.c_str());
  if (ui::button(app, "plan.limits_settings", "Change the limits (Settings)", 0, ui::Tone::Quiet)) go_to(app, Screen::Settings);
  if (c.check) {
    if (c.check->ok()) {
      ui::colored_wrapped(theme::kAccent, "Independent check: every state replayed (after each dose and before the next), no limit crossed.");
    } else if (!plan.verdict.holds && c.check->only_floors_and_falls()) {
      ui::colored_wrapped(theme::kError, "Independent check: every state replayed; it confirms the floors or falls the verdict at the top names, and nothing else is crossed:");
      for (size_t i = 0; i < std::min<size_t>(c.check->violations.size(), 5); ++i) ui::dim_text(c.check->violations[i].message.c_str());
    } else {
      ui::colored_wrapped(theme::kError, ("Independent check found " + std::to_string(c.check->violations.size()) +
                                          " limit breaks and " + std::to_string(c.check->other.size()) + " other problems:").c_str());
      for (size_t i = 0; i < std::min<size_t>(c.check->violations.size(), 5); ++i) ui::dim_text(c.check->violations[i].message.c_str());
      for (const std::string& o : c.check->other) ui::dim_text(o.c_str());
    }
    ui::record(app, "plan.check");
  }
  ui::card_end(app);
}

// The verdict of the core's planner, first on the screen: a plan that cannot hold the water
// inside its floors says so in the error colour before anything else, with what is short and
// which setting would hold it (the same text the command line prints first).
void draw_verdict(AppState& app, const pl::Plan& plan) {
  const pl::Verdict& v = plan.verdict;
  ui::card_begin(app);
  if (v.holds) {
    ui::colored_wrapped(theme::kAccent, v.headline.c_str());
  } else {
    ImGui::PushFont(app.ui.fonts.bold);
    ui::colored_wrapped(theme::kError, "This plan cannot hold the water safe.");
    ImGui::PopFont();
    ui::colored_wrapped(theme::kError, v.headline.c_str());
    for (const std::string& r : v.reasons) ui::wrapped(("Why: " + r).c_str());
    for (const std::string& f : v.fixes) ui::wrapped(("Fix: " + f).c_str());
  }
  // The same words as the command line's verdict (core message), in the warning colour.
  for (const pl::TargetConflict& t : v.target_conflicts) ui::colored_wrapped(theme::kError, t.message.c_str());
  ui::record(app, "plan.verdict");
  // How sure the plan is: when to test again (before a 95 % band reaches a limit as set), and
  // what keeping the band inside the limits costs (the core's words, as the command line's).
  if (plan.uncertainty) {
    if (const auto& r = plan.uncertainty->retest) {
      ImGui::PushFont(app.ui.fonts.bold);
      ui::colored_wrapped(theme::kWarning, ("When to test again: " + r->message + ".").c_str());
      ImGui::PopFont();
      ui::record(app, "plan.test_again");
    }
    if (const auto& cost = plan.uncertainty->cost) {
      ui::dim_text(("Room kept for the estimates' uncertainty: " + std::to_string(cost->room.size()) +
                    " limits tightened (see Safety limits); against the limits as set this costs: " + cost->effect + ".")
                       .c_str());
      ui::record(app, "plan.margin_cost");
    }
  }
  ui::card_end(app);
}

// "Adopt this plan": the plan becomes the pumps' standing schedules in the log (the same core
// call as `tidewright plan --adopt`), so what the app told the keeper to dose and what the
// estimate assumes are the same. Only a plan that holds and passes its check can be adopted.
void draw_adopt(AppState& app, const PlanCache& c) {
  const bool can = c.plan->verdict.holds && (!c.check || c.check->ok() || c.check->only_floors_and_falls());
  ui::card_begin(app);
  ui::wrapped(("Set " + pumps_in_words(c.input->deliveries) + " to this plan? Adopting it makes it the schedules in the log from tomorrow, with the "
               "amounts to set on each pump; their earlier schedules stop there.")
                  .c_str());
  if (ui::button(app, "plan.adopt", "Adopt this plan", 0, can ? ui::Tone::Primary : ui::Tone::Quiet)) {
    adopt_current_plan(app);
  }
  if (!can) ui::dim_text("Not while the plan cannot hold the water safe.");
  ui::card_end(app);
}

}  // namespace

// ---------------------------------------------------------------- 5. The screen
void draw_plan(AppState& app) {
  PlanForm& f = app.ui.dosing.plan;
  const auto* sys = current_system(app);
  ui::panes_begin(app);  // wide: the verdict and the choices beside what the plan predicts
  ui::heading(app, sys ? ("Dose plan for " + sys->name).c_str() : "Dose plan");
  refresh_plan(app);
  const PlanCache& c = app.ui.dosing.plan_cache;
  if (c.plan) draw_verdict(app, *c.plan);
  draw_form(app, f);
  refresh_plan(app);  // a change in the form shows from the next frame on, the verdict included
  if (!c.flags.empty()) {
    ui::card_begin(app);
    for (const std::string& fl : c.flags) ui::colored_wrapped(theme::kWarning, ("\u26a0 " + fl).c_str());
    ui::record(app, "plan.flags");
    ui::card_end(app);
  }
  for (const std::string& a : c.assumptions) ui::dim_text(("\u2022 " + a).c_str());
  if (!c.error.empty()) {
    ui::card_begin(app);
    ui::colored_wrapped(theme::kError, c.error.c_str());
    ui::record(app, "plan.error");
    if (c.stale && ui::button(app, "plan.accept_stale", "Plan from the old level anyway", 0, ui::Tone::Quiet)) {
      f.accept_stale = true;
    }
    ui::card_end(app);
  }
  if (!c.plan) {
    ui::panes_end(app);
    return;
  }
  const pl::Plan& plan = *c.plan;
  ui::card_begin(app);
  const char* pnames[3] = {"Alkalinity", "Calcium", "Magnesium"};
  for (int i = 0; i < 3; ++i) {
    const auto& td = plan.target_day[static_cast<size_t>(i)];
    ui::label_value(app, pnames[i], td ? "in band on day " + std::to_string(*td) : std::string("not in band in this plan"),
                    td ? theme::kAccent : theme::kWarning);
  }
  ui::record(app, "plan.summary");
  for (const std::string& s : plan.findings) ui::colored_wrapped(theme::kWarning, ("\u2022 " + s).c_str());
  for (const auto& r : plan.reservoirs_empty) {
    ui::colored_wrapped(theme::kWarning, (c.input->deliveries[r.delivery].device + " runs dry on day " + std::to_string(r.day)).c_str());
  }
  // The salinity drift is among the core's findings above (plan_salinity.cpp); it was also
  // paraphrased here, so the keeper read it twice.
  ui::card_end(app);
  draw_adopt(app, c);
  ui::panes_next(app);
  ui::heading(app, "Predicted water");
  draw_chart(app, c);
  ui::heading(app, "Day by day");
  draw_days(app, f, c);
  ui::heading(app, "Safety limits");
  ui::dim_text("pH and \u03a9 are computed right after each dose, fully mixed, before gas exchange (total pH scale).");
  draw_limits(app, c);
  if (!plan.cautions.empty()) {
    ui::heading(app, "Cautions");
    // One paragraph per chemical ("Sodium carbonate (soda ash): ..."): a bullet per caution
    // made nine lines for two stocks.
    std::vector<std::pair<std::string, std::string>> by_chemical;
    for (const std::string& s : plan.cautions) {
      const size_t colon = s.find(": ");
      const std::string who = colon == std::string::npos ? std::string() : s.substr(0, colon);
      const std::string what = colon == std::string::npos ? s : s.substr(colon + 2);
      auto it = std::find_if(by_chemical.begin(), by_chemical.end(), [&](const auto& g) { return g.first == who; });
      if (it == by_chemical.end()) {
        by_chemical.emplace_back(who, what);
      } else {
        it->second += "; " + what;
      }
    }
    for (const auto& [who, what] : by_chemical) {
      const std::string line = who.empty() ? what : who + ": " + what;
      ui::colored_wrapped(theme::kWarning, ("\u2022 " + line + (line.ends_with('.') ? "" : ".")).c_str());
    }
    ui::record(app, "plan.cautions");
  }
  ui::heading(app, "Download");
  const char* const formats[] = {"CSV", "iCalendar", "Text", "JSON"};
  ui::choice(app, "plan.export_format", "", &f.export_index, formats, 4);
  if (ui::button(app, "plan.export", "Download the schedule", 0, ui::Tone::Primary)) export_plan(app, f.export_index);
  ui::panes_end(app);
}

}  // namespace twapp
