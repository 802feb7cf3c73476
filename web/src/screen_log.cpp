// Log: enter a test result (parameter, value, unit) for the current system; the core checks
// it (tw::journal::add_event) and the Water screen follows the new reading. Below, the recent
// entries of this system.
#include <algorithm>
#include <string>
#include <variant>

#include "actions.hpp"
#include "format.hpp"
#include "platform.hpp"
#include "screens.hpp"
#include "theme.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

namespace jn = tw::journal;
namespace cb = tw::carbonate;

const char* const kParams[] = {"Alkalinity", "Calcium", "Magnesium", "pH", "Salinity", "Temperature", "Nitrate", "Phosphate"};
const jn::Parameter kParamValues[] = {jn::Parameter::Alkalinity, jn::Parameter::Calcium, jn::Parameter::Magnesium,
                                      jn::Parameter::PH, jn::Parameter::Salinity, jn::Parameter::Temperature,
                                      jn::Parameter::Nitrate, jn::Parameter::Phosphate};
const char* const kScales[] = {"NBS", "Total", "Seawater", "Free"};
const cb::PhScale kScaleValues[] = {cb::PhScale::NBS, cb::PhScale::Total, cb::PhScale::Seawater, cb::PhScale::Free};

struct UnitChoice {
  const char* journal_unit;  // spelling the journal accepts (normalize_unit)
  const char* shown;
};

// Units offered per parameter (the journal's accepted spellings, journal.hpp section 4).
std::vector<UnitChoice> units_for(jn::Parameter p) {
  switch (p) {
    case jn::Parameter::Alkalinity: return {{"dKH", "dKH"}, {"meq/L", "meq/L"}, {"mg/L CaCO3", "mg/L CaCO\u2083"}};
    case jn::Parameter::Calcium:
    case jn::Parameter::Magnesium: return {{"mg/L", "mg/L"}, {"mmol/kg", "mmol/kg"}};
    case jn::Parameter::PH: return {{"pH", ""}};
    case jn::Parameter::Salinity: return {{"psu", "psu"}};
    case jn::Parameter::Temperature: return {{"C", "\u00b0C"}, {"F", "\u00b0F"}};
    default: return {{"mg/L", "mg/L"}};
  }
}

// The user's preferred unit for a parameter (index into units_for).
int preferred_unit(jn::Parameter p, const jn::UnitPreferences& u) {
  if (p == jn::Parameter::Alkalinity) {
    return u.alkalinity == tw::units::AlkalinityUnit::MeqPerL ? 1 : u.alkalinity == tw::units::AlkalinityUnit::MgPerLCaCO3 ? 2 : 0;
  }
  if (p == jn::Parameter::Calcium || p == jn::Parameter::Magnesium) {
    return u.calcium_magnesium == tw::units::ConcentrationUnit::MmolPerKg ? 1 : 0;
  }
  if (p == jn::Parameter::Temperature) return u.temperature == jn::TemperatureUnit::Fahrenheit ? 1 : 0;
  return 0;
}

int decimals_for(jn::Parameter p, const std::string& unit) {
  if (p == jn::Parameter::PH) return 2;
  if (p == jn::Parameter::Phosphate) return 3;
  if (unit == "meq/L" || unit == "mmol/kg") return 2;
  if (unit == "mg/L CaCO3" || p == jn::Parameter::Calcium || p == jn::Parameter::Magnesium) return 0;
  return 1;
}

std::string event_text(const jn::Event& e) {
  if (const auto* t = std::get_if<jn::TestResult>(&e.data)) {
    std::string s = std::string(fmtx::parameter_label(t->parameter)) + " " +
                    fmtx::fixed(t->value, decimals_for(t->parameter, t->unit));
    if (t->parameter == jn::Parameter::PH) return s + " (" + fmtx::ph_scale_label(t->ph_scale.value_or(cb::PhScale::NBS)) + ")";
    return s + " " + t->unit;
  }
  if (const auto* d = std::get_if<jn::Dose>(&e.data)) return "Dose " + fmtx::fixed(d->amount, 1) + " " + jn::to_string(d->unit) + " " + d->additive_id;
  if (const auto* w = std::get_if<jn::WaterChange>(&e.data)) return "Water change " + fmtx::fixed(w->volume_l, 1) + " L";
  if (const auto* o = std::get_if<jn::TopOff>(&e.data)) return std::string("Top-off ") + fmtx::fixed(o->volume_l, 1) + " L " + jn::to_string(o->kind);
  if (const auto* n = std::get_if<jn::Note>(&e.data)) return "Note: " + n->text;
  return "?";
}

}  // namespace

void draw_log(AppState& app) {
  const jn::System* sys = current_system(app);
  ui::heading(app, "Log a test result");
  if (!sys) {
    ui::dim_text("Add a system first (Systems tab): every result belongs to one system.");
    return;
  }
  LogForm& f = app.ui.log;
  ui::dim_text(("For " + sys->name + ", now.").c_str());
  int param = 0;
  for (int i = 0; i < 8; ++i) if (kParamValues[i] == f.parameter) param = i;
  if (ui::choice(app, "log.parameter", "What you measured", &param, kParams, 8)) {
    f.parameter = kParamValues[param];
    f.unit.clear();
    f.value_text.clear();
  }
  const auto units = units_for(f.parameter);
  int unit = preferred_unit(f.parameter, sys->units);
  for (size_t i = 0; i < units.size(); ++i) if (f.unit == units[i].journal_unit) unit = static_cast<int>(i);
  if (units.size() > 1) {
    std::vector<const char*> shown;
    for (const auto& u : units) shown.push_back(u.shown);
    if (ui::choice(app, "log.unit", "Unit", &unit, shown.data(), static_cast<int>(shown.size()))) f.value_text.clear();
  }
  f.unit = units[static_cast<size_t>(unit)].journal_unit;
  if (f.parameter == jn::Parameter::PH) {
    int scale = 0;
    if (f.value_text.empty() && f.ph_scale != sys->units.ph_scale) f.ph_scale = sys->units.ph_scale;
    for (int i = 0; i < 4; ++i) if (kScaleValues[i] == f.ph_scale) scale = i;
    if (ui::choice(app, "log.ph_scale", "pH scale of the meter or kit", &scale, kScales, 4)) f.ph_scale = kScaleValues[scale];
  }
  std::optional<double> value;
  if (!f.value_text.empty()) value = std::strtod(f.value_text.c_str(), nullptr);
  const int dec = decimals_for(f.parameter, f.unit);
  const std::string label = std::string(kParams[param]) + " result";
  const double step = dec == 0 ? 1 : dec == 1 ? 0.1 : dec == 2 ? 0.01 : 0.001;
  if (ui::optional_number_field(app, "log.value", {label.c_str(), units[static_cast<size_t>(unit)].shown, dec, step, -1e6, 1e6}, &value) && value) {
    f.value_text = fmtx::fixed(*value, dec + 1);
  }
  if (ui::button(app, "log.save", "Save result", 0, ui::Tone::Primary)) {
    if (!value) {
      notify(app, "Enter the value first", true);
    } else {
      jn::TestResult t;
      t.parameter = f.parameter;
      t.value = *value;
      t.unit = f.unit;
      if (f.parameter == jn::Parameter::PH) t.ph_scale = f.ph_scale;
      if (log_test(app, t)) f.value_text.clear();
    }
  }

  ui::heading(app, "Recent entries");
  jn::EventFilter filter;
  filter.system_id = sys->id;
  auto events = jn::select_events(app.journal, filter);
  if (events.empty()) ui::dim_text("Nothing logged for this system yet.");
  const int tz = platform::utc_offset_minutes();
  const float e = ui::em(app);
  int shown = 0;
  for (auto it = events.rbegin(); it != events.rend() && shown < 30; ++it, ++shown) {
    const jn::Event& ev = **it;
    const std::string id = std::to_string(ev.id);
    ui::card_begin(app);
    ui::dim_text(fmtx::local_time_text(ev.time_s, tz).c_str());
    ImGui::PushFont(app.ui.fonts.bold);
    ui::wrapped(event_text(ev).c_str());
    ImGui::PopFont();
    ui::record(app, "log.entry." + id);
    if (app.ui.confirm_remove_event == ev.id) {
      const float half = (ImGui::GetContentRegionAvail().x - ImGui::GetStyle().ItemSpacing.x) / 2;
      if (ui::button(app, "log.keep." + id, "Keep", half)) app.ui.confirm_remove_event = 0;
      ImGui::SameLine();
      if (ui::button(app, "log.remove_confirm." + id, "Remove", half, ui::Tone::Danger)) {
        remove_event(app, ev.id);
        app.ui.confirm_remove_event = 0;
      }
    } else if (ui::button(app, "log.remove." + id, "Remove\u2026", 6 * e, ui::Tone::Quiet)) {
      app.ui.confirm_remove_event = ev.id;
    }
    ui::card_end(app);
    if (app.ui.confirm_remove_event == 0 && shown > 30) break;
  }
}

}  // namespace twapp
