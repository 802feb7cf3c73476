#include "test_api.hpp"

#include "log_schedules.hpp"

#include <algorithm>
#include <vector>
#include <nlohmann/json.hpp>

#include "actions.hpp"
#include "actions_dosing.hpp"
#include "dosing_saved.hpp"
#include "platform.hpp"
#include "theme.hpp"
#include "tidewright/journal/journal_file.hpp"
#include "water.hpp"

namespace twapp::test_api {

namespace {
AppState* g_app = nullptr;  // the one AppState, set by main (test hook only)
using nlohmann::json;
namespace jn = tw::journal;

json opt(const std::optional<double>& v) { return v ? json(*v) : json(nullptr); }
}  // namespace

void attach(AppState* app) { g_app = app; }

// The preview of a picked file (import_state.hpp), as the Settings screen shows it.
static json import_json(const ImportPreview& p) {
  const char* kinds[] = {"none", "csv", "journal"};
  json j = {{"kind", kinds[static_cast<int>(p.kind)]}, {"error", p.error}, {"merge_error", p.merge_error},
            {"csv_system", p.csv_system}, {"confirm_replace", p.confirm_replace},
            {"file_systems", p.file_systems}, {"file_events", p.file_events},
            {"mapping_open", p.mapping_open}, {"mapping_error", p.mapping_error},
            {"system_filter", p.system_list.filter}};
  json mappings = json::array();
  for (const auto& m : p.mappings) mappings.push_back({{"header", m.header}, {"meaning", m.meaning}});
  j["mappings"] = mappings;
  if (p.csv_report) {
    const auto& r = *p.csv_report;
    json refused = json::array();
    for (const auto& row : r.rejected) refused.push_back({{"line", row.line}, {"field", row.field}, {"reason", row.reason}});
    json unused = json::array();
    for (const auto& c : r.unused_columns) unused.push_back({{"name", c.name}, {"reason", c.reason}});
    j["csv"] = {{"added", r.added.size()}, {"duplicates", r.duplicates_skipped}, {"refused", refused},
                {"unused_columns", unused}, {"delimiter", std::string(1, r.delimiter)},
                {"date_order", static_cast<int>(r.date_order)}};
  }
  if (p.merge_report) {
    const auto& m = *p.merge_report;
    j["merge"] = {{"entries_added", m.entries_added}, {"duplicates", m.duplicates_skipped},
                  {"systems_added", m.systems_added}, {"systems_matched", m.systems_matched},
                  {"settings_kept", m.settings_kept}};
  }
  return j;
}

std::string journal_json() { return g_app ? jn::serialize_journal(g_app->journal) : "{}"; }

std::string state_json() {
  if (!g_app) return "{}";
  const AppState& a = *g_app;
  json j;
  j["screen"] = screen_name(a.ui.screen);
  j["current_system"] = a.current_system;
  j["systems"] = json::array();
  for (const auto& s : a.journal.systems) {
    j["systems"].push_back({{"id", s.id}, {"name", s.name}, {"kind", jn::to_string(s.kind)},
                            {"volume_l", s.volume_l}, {"default_salinity", s.default_salinity},
                            {"default_temperature_c", s.default_temperature_c},
                            {"units", {{"alkalinity", tw::units::to_string(s.units.alkalinity)},
                                       {"temperature", jn::to_string(s.units.temperature)},
                                       {"ph_scale", jn::ph_scale_name(s.units.ph_scale)},
                                       {"volume", tw::units::to_string(s.units.volume)}}}});
  }
  j["events"] = a.journal.events.size();
  // The ten most recently created events (highest ids), whatever time they are dated.
  std::vector<const jn::Event*> newest;
  for (const auto& e : a.journal.events) newest.push_back(&e);
  std::sort(newest.begin(), newest.end(), [](const jn::Event* x, const jn::Event* y) { return x->id < y->id; });
  if (newest.size() > 10) newest.erase(newest.begin(), newest.end() - 10);
  j["recent_events"] = json::array();
  for (const jn::Event* e : newest) j["recent_events"].push_back(jn::event_to_json(*e));
  j["log_form"] = {{"editing", a.ui.log.editing}, {"kind", static_cast<int>(a.ui.log.kind)},
                   {"when_s", a.ui.log.when_s ? json(*a.ui.log.when_s) : json(nullptr)},
                   {"precision", opt(a.ui.log.precision)}};
  const LatestReadings r = latest_readings(a);
  j["latest"] = {{"alkalinity_dkh", opt(r.alkalinity_dkh)}, {"ph", opt(r.ph)},
                 {"salinity", opt(r.salinity)}, {"temperature_c", opt(r.temperature_c)},
                 {"calcium_mg_l", opt(r.calcium_mg_l)}};
  const WaterResult& w = a.water_result;
  json water = {{"ok", w.ok}, {"error", w.error}, {"what_if", a.water.what_if}, {"source", a.water.source},
                {"computed_count", w.computed_count}, {"calcium_mg_l", opt(a.water.calcium_mg_l)},
                {"calcium_source", w.calcium.note},
                {"boron_measured", w.boron.measured}, {"boron_source", w.boron.note},
                {"magnesium_mg_l", opt(a.water.magnesium_mg_l)}, {"total_boron_mg_l", opt(a.water.total_boron_mg_l)},
                {"mg_ca_correction", a.water.mg_ca_correction},
                {"inputs", {{"pair", static_cast<int>(a.water.pair)}, {"alkalinity_dkh", a.water.alkalinity_dkh},
                            {"ph", a.water.ph}, {"ph_scale", jn::ph_scale_name(a.water.ph_scale)},
                            {"salinity", a.water.salinity}, {"temperature_c", a.water.temperature_c}}}};
  if (w.ok) {
    water["ph_total"] = w.state.ph_total;
    water["warnings"] = w.state.warnings;
    water["ph_nbs"] = w.state.ph_nbs;
    water["ph_sws"] = w.state.ph_sws;
    water["alkalinity_umol_kg"] = w.state.alkalinity_umol_kg;
    water["dic_umol_kg"] = w.state.dic_umol_kg;
    water["pco2_uatm"] = w.state.pco2_uatm;
    water["omega_aragonite"] = w.state.omega_aragonite;
    water["omega_calcite"] = w.state.omega_calcite;
    water["curve_points"] = w.curve.ph.size();
    water["u_error"] = w.u_error;
    if (w.u) {
      json u = json::object();
      for (const auto& f : tw::carbonate::kOutputFields) u[f.name] = (*w.u).*f.output;
      water["u"] = u;
      water["omega_main_source"] = w.omega_main_source;
    }
  }
  const WaterPrecision& wp = a.water_precision;
  water["precision"] = {{"alkalinity_dkh", wp.alkalinity_dkh}, {"ph", wp.ph}, {"ph_conversion", wp.ph_conversion},
                        {"salinity", wp.salinity}, {"temperature_c", wp.temperature_c},
                        {"pco2_uatm", wp.pco2_uatm}, {"dic_umol_kg", wp.dic_umol_kg}};
  j["water"] = water;
  // The farm overview (only once it has been shown): order of the rows, which need a look and
  // why, and how long building it took.
  const FarmCache& fc = a.ui.farm.cache;
  if (fc.valid) {
    json rows = json::array();
    for (const FarmRow& row : fc.rows) {
      rows.push_back({{"id", row.id}, {"attention", row.attention}, {"due", row.due.size()}});
    }
    j["farm"] = {{"rows", rows}, {"needing_attention", fc.needing_attention}, {"build_ms", fc.build_ms},
                 {"wall_ms", fc.wall_ms}, {"frames", fc.frames}, {"computed_count", fc.computed_count},
                 {"revision", fc.revision}};
  }
  j["farm_building"] = a.ui.farm.build.active;
  j["systems_view"] = static_cast<int>(a.ui.farm.view);
  j["settings"] = {{"alkalinity_unit", tw::units::to_string(a.settings.units.alkalinity)},
                   {"volume_unit", tw::units::to_string(a.settings.units.volume)},
                   {"temperature_unit", jn::to_string(a.settings.units.temperature)},
                   {"ph_scale", jn::ph_scale_name(a.settings.units.ph_scale)},
                   {"text_size", a.settings.text_size}, {"look", theme::to_string(a.settings.look)},
                   {"room_co2_ppm", a.settings.room_co2_ppm},
                   {"constants_convention", tw::carbonate::to_string(a.settings.constants_convention)}};
  json limits = json::object();
  for (const auto& spec : tw::plan::limit_specs()) limits[spec.key] = a.settings.safety_limits[static_cast<size_t>(spec.id)];
  j["settings"]["safety_limits"] = limits;
  // The last plan the Plan screen made (only when it has been shown): the limits it used, the
  // largest daily alkalinity rise it plans and the independent checker's verdict.
  const PlanCache& pc = a.ui.dosing.plan_cache;
  if (pc.plan) {
    json used = json::object();
    for (const auto& spec : tw::plan::limit_specs()) used[spec.key] = pc.plan->limits.get(spec.id);
    double rise = 0;
    for (const auto& d : pc.plan->days) rise = std::max(rise, d.rise_alkalinity_dkh);
    const auto& v = pc.plan->verdict;
    json conflicts = json::array();
    for (const auto& t : v.target_conflicts) conflicts.push_back(t.message);
    j["plan"] = {{"target_conflicts", conflicts},
                 {"limits", used}, {"max_alkalinity_rise_dkh", rise}, {"check_ok", pc.check && pc.check->ok()},
                 {"check_explained", pc.check && !v.holds && pc.check->only_floors_and_falls()},
                 {"verdict", {{"holds", v.holds}, {"headline", v.headline}, {"reasons", v.reasons}, {"fixes", v.fixes}}},
                 {"computed_count", pc.computed_count}};
    // Where it starts and how high the water goes (a test compares them with the command line).
    double max_alk = pc.plan->start.alkalinity_dkh;
    for (const auto& d : pc.plan->doses) max_alk = std::max(max_alk, d.after.alkalinity_dkh);
    j["plan"]["max_alkalinity_dkh"] = max_alk;
    // What the independent checker found (a failing test prints it).
    json problems = json::array();
    if (pc.check) {
      for (const auto& vi : pc.check->violations) problems.push_back(vi.message);
      for (const auto& o : pc.check->other) problems.push_back(o);
    }
    j["plan"]["check_problems"] = problems;
    j["plan"]["test_again"] = pc.plan->uncertainty && pc.plan->uncertainty->retest
                                  ? nlohmann::json{{"day", pc.plan->uncertainty->retest->day},
                                                   {"minute", pc.plan->uncertainty->retest->minute},
                                                   {"message", pc.plan->uncertainty->retest->message}}
                                  : nlohmann::json(nullptr);
    if (pc.input) {
      j["plan"]["start"] = {{"alkalinity_dkh", pc.input->system.alkalinity_dkh},
                            {"calcium_mg_l", pc.input->system.calcium_mg_l},
                            {"magnesium_mg_l", pc.input->system.magnesium_mg_l},
                            {"salinity", pc.input->system.salinity},
                            {"temperature_c", pc.input->system.temperature_c}};
      j["plan"]["target_alkalinity_dkh"] = pc.input->targets.alkalinity_dkh.target;
      // The pumps it doses with and every dose: what reaches the tank and what to set.
      json pumps = json::array();
      for (const auto& d : pc.input->deliveries) {
        pumps.push_back({{"device", d.device}, {"calibration", d.calibration}, {"additive", d.additive.name},
                         {"doses_per_day", d.doses_per_day}, {"max_dose", d.max_dose}});
      }
      j["plan"]["pumps"] = pumps;
      json columns = json::array();
      for (const auto& d : pc.input->deliveries) columns.push_back(pump_column_title(d));
      j["plan"]["day_columns"] = columns;  // the day table's pump columns, as drawn
      j["plan"]["legend"] = pump_legend(pc.input->deliveries);
      json doses = json::array();
      for (const auto& d : pc.plan->doses) {
        doses.push_back({{"day", d.day}, {"minute", d.minute}, {"pump", d.delivery}, {"amount", d.amount},
                         {"amount_set", pc.input->deliveries[d.delivery].set_amount(d.amount)}});
      }
      j["plan"]["doses"] = doses;
    }
  }
  if (pc.valid) {
    j["plan_basis"] = {{"flags", pc.flags}, {"assumptions", pc.assumptions}, {"error", pc.error}, {"stale", pc.stale}};
    // The three stock pumps as the Plan's form shows them (the keeper's, the log's schedule's or the fallback).
    json pumps = json::array();
    for (const PlanPump& p : pc.pumps) {
      pumps.push_back({{"name", p.name}, {"calibration", p.calibration}, {"from_schedule", p.from_schedule},
                       {"doses_per_day", p.doses_per_day}, {"max_dose_ml", p.max_dose_ml},
                       {"program_from_schedule", p.program_from_schedule}});
    }
    j["plan_basis"]["pumps"] = pumps;
    j["plan_basis"]["magnesium"] = pc.magnesium == PlanMagnesium::None ? std::string("none")
                                   : pc.magnesium == PlanMagnesium::MagnesiumSulfate ? std::string("magnesium_sulfate_heptahydrate")
                                                                                     : std::string("magnesium_chloride_hexahydrate");
    j["plan_basis"]["magnesium_g_per_l"] = pc.magnesium_g_per_l;
    j["plan_basis"]["alkalinity_g_per_l"] = pc.alkalinity_g_per_l;
    j["plan_basis"]["calcium_g_per_l"] = pc.calcium_g_per_l;
    j["plan_basis"]["magnesium_from_log"] = pc.magnesium_from_log;
  }
  // The Demand screen's estimate (when shown): level, flagged tests and the newest test's
  // disagreement with the log, per parameter.
  const DemandCache& dc = a.ui.dosing.demand_cache;
  if (dc.valid && dc.error.empty()) {
    json per = json::array();
    for (const ParameterEstimate& pe : dc.per_parameter) {
      json o = {{"ok", pe.ok}};
      if (pe.ok) {
        json flagged = json::array();
        for (const auto& f : pe.estimate.outliers) flagged.push_back(f.time_days);
        o.update({{"level", pe.estimate.level}, {"tests", pe.estimate.tests}, {"flagged_days", flagged},
                  {"last_test_days", opt(pe.estimate.last_test_days)}, {"disagreement", pe.estimate.disagreement.has_value()},
                  {"scheduled", pe.scheduled}, {"stale", pe.stale}});
      }
      per.push_back(o);
    }
    j["demand"] = {{"system", dc.system}, {"now_days", dc.now_days}, {"parameters", per}};
  }
  // The Hatchery screen's form and last result (issue 18: measured calcium, the K1 K2 set and
  // the core's suggestion of another set, where calcium came from).
  {
    const HatcheryForm& hf = a.ui.dosing.hatchery;
    const HatcheryCache& hc = a.ui.dosing.hatchery_cache;
    json h = {{"salinity", hf.salinity}, {"calcium_mg_l", opt(hf.calcium_mg_l)},
              {"k1k2", tw::carbonate::to_string(hf.k1k2)}, {"error", hc.error},
              {"k1k2_suggestion", hc.k1k2_suggestion ? json(hc.k1k2_suggestion->reason) : json(nullptr)}};
    const tw::hatchery::Treatment* t = hc.flow ? &hc.flow->treatment : hc.batch ? &hc.batch->treatment : nullptr;
    if (hc.valid && t) {
      h["calcium_source"] = t->calcium_source;
      h["omega_intake"] = t->intake.omega_aragonite;
      h["warnings"] = t->warnings;
      h["added_alkalinity_umol_kg"] = t->dose.alkalinity_umol_kg();
    }
    // A salt mix's own boron and magnesium, and the line's points when shown (issue 18).
    h.update({{"total_boron_mg_l", opt(hf.total_boron_mg_l)}, {"magnesium_mg_l", opt(hf.magnesium_mg_l)},
              {"mg_ca_correction", hf.mg_ca_correction}, {"boron_source", hc.boron.note},
              {"line_error", hc.line_error}});
    json points = json::array();
    if (hc.line) {
      for (const auto& p : hc.line->points) {
        points.push_back({{"name", p.name}, {"salinity", p.salinity}, {"temperature_c", p.temperature_c},
                          {"ph_total", p.state.ph_total}, {"omega_aragonite", p.state.omega_aragonite},
                          {"alkalinity_umol_kg", p.state.alkalinity_umol_kg}});
      }
    }
    h["line"] = points;
    // The pump rates shown (for the line's conditioned water while the line is shown).
    json pumps = json::array();
    if (hc.flow) {
      for (const auto& l : hc.flow->lines) {
        pumps.push_back({{"formula", tw::hatchery::formula_of(l.compound)}, {"pump_ml_per_min", l.pump_ml_per_min},
                         {"grams_per_hour", l.grams_per_hour}});
      }
    }
    h["pumps"] = pumps;
    h["dosed_flow_l_per_min"] = hc.dosed_flow_l_per_min;
    j["hatchery"] = h;
  }
  // The current system's schedules running now or starting later (as the Log screen lists them).
  json schedules = json::array();
  for (const jn::Event* e : schedules_now_and_later(a.journal, a.current_system, platform::now_unix_seconds())) {
    schedules.push_back(jn::event_to_json(*e));
  }
  j["schedules"] = schedules;
  // The Plan and Hatchery forms as shown (their saved part) and the system they are for.
  j["dosing_forms"] = system_dosing_to_json(saved_part(a.ui.dosing.plan, a.ui.dosing.hatchery));
  j["dosing_forms"]["system"] = a.ui.dosing.forms_for ? json(*a.ui.dosing.forms_for) : json(nullptr);
  j["demo_system_ids"] = a.demo_system_ids;
  j["demo_shift_s"] = a.demo_shift_s;
  j["store"] = {{"loaded", a.store.loaded}, {"problem", a.store.problem}, {"save_error", a.store.save_error},
                {"saves", a.store.saves}};
  j["import"] = import_json(a.ui.import);
  j["message"] = a.ui.message;
  j["message_is_error"] = a.ui.message_is_error;
  j["entry_open"] = platform::text_entry_open();
  j["em_px"] = a.ui.em;
  j["pixel_ratio"] = a.ui.pixel_ratio;
  j["frames"] = a.ui.frames_drawn;
  return j.dump();
}

// A widget's place, and how long the message strip has left: when the strip goes, a page
// scrolled to its end grows by the strip's height and its widgets move down (app.cpp), so a
// test's tap waits for a strip about to go (lib.mjs tap).
std::string widget_json(const std::string& name, float ratio) {
  json j = {{"name", name}, {"found", false}};
  if (!g_app) return j.dump();
  const double left = g_app->ui.message.empty() ? 0.0 : g_app->ui.message_until_ms - platform::now_ms();
  j["message_ms_left"] = std::max(0.0, left);
  const auto it = g_app->ui.widgets.find(name);
  if (it == g_app->ui.widgets.end()) return j.dump();
  const float k = ratio > 0 ? 1.0f / ratio : 1.0f;
  const Rect& r = it->second;
  j.update({{"found", true}, {"visible", r.visible},
            {"x", r.x * k}, {"y", r.y * k}, {"w", r.w * k}, {"h", r.h * k}, {"text", r.text}});
  return j.dump();
}

std::string widgets_json(float ratio) {
  json j = json::object();
  if (!g_app) return j.dump();
  const float k = ratio > 0 ? 1.0f / ratio : 1.0f;
  for (const auto& [name, r] : g_app->ui.widgets) {
    j[name] = {{"visible", r.visible}, {"x", r.x * k}, {"y", r.y * k}, {"w", r.w * k}, {"h", r.h * k}};
  }
  return j.dump();
}

void reveal(const std::string& name) {
  if (g_app) g_app->ui.reveal = name;
}

std::string frame_stats_json() {
  if (!g_app || g_app->ui.frame_ms.empty()) return R"({"frames":0})";
  std::vector<float> v = g_app->ui.frame_ms;
  std::sort(v.begin(), v.end());
  const auto at = [&](double q) { return v[std::min(v.size() - 1, static_cast<size_t>(q * static_cast<double>(v.size())))]; };
  return json({{"frames", v.size()}, {"median_ms", at(0.5)}, {"p95_ms", at(0.95)}, {"worst_ms", v.back()}}).dump();
}

void reset_frame_stats() {
  if (g_app) g_app->ui.frame_ms.clear();
}

}  // namespace twapp::test_api
