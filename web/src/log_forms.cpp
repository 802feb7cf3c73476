// The Log screen's entry forms. Map: 1. test result  2. dose  3. water change  4. top-off
// 5. the four together (draw, build, clear, from_event, event_text).
// Values are kept in the journal's units (dKH, mg/L, L) and shown in the system's units.
#include "log_forms.hpp"

#include <cmath>
#include <cstdlib>
#include <functional>
#include <variant>
#include <vector>

#include "actions.hpp"
#include "actions_dosing.hpp"
#include "fields.hpp"
#include "format.hpp"
#include "tidewright/additives/additives.hpp"
#include "tidewright/journal/schedule.hpp"
#include "tidewright/journal/test_precision.hpp"
#include "tidewright/seawater/seawater.hpp"
#include "tidewright/common/ranges.hpp"
#include "ui.hpp"

namespace twapp::log_forms {

namespace {

namespace jn = tw::journal;
namespace cb = tw::carbonate;
namespace add = tw::additives;
namespace au = tw::units;

// Shows an optional value kept in a canonical unit in the user's unit (to_shown/from_shown
// convert), through ui::optional_number_field. Returns true when the user changed it.
bool converted_field(AppState& app, const std::string& name, ui::NumberSpec spec, std::optional<double>* canonical,
                     const std::function<double(double)>& to_shown, const std::function<double(double)>& from_shown) {
  std::optional<double> shown;
  if (*canonical) shown = to_shown(**canonical);
  spec.lo = to_shown(spec.lo);
  spec.hi = to_shown(spec.hi);
  if (!ui::optional_number_field(app, name, spec, &shown)) return false;
  if (shown) *canonical = from_shown(*shown);
  return true;
}

// ---------------------------------------------------------------- 1. Test result
// "SG": specific gravity from a refractometer or hydrometer (the journal keeps it as read; the
// Water screen turns it into salinity).
const char* const kParams[] = {"Alkalinity", "Calcium", "Magnesium", "pH", "Salinity", "SG", "Temperature", "Nitrate",
                               "Phosphate"};
const jn::Parameter kParamValues[] = {jn::Parameter::Alkalinity, jn::Parameter::Calcium, jn::Parameter::Magnesium,
                                      jn::Parameter::PH, jn::Parameter::Salinity, jn::Parameter::SpecificGravity,
                                      jn::Parameter::Temperature, jn::Parameter::Nitrate, jn::Parameter::Phosphate};
constexpr int kParamCount = static_cast<int>(sizeof kParams / sizeof kParams[0]);

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
    case jn::Parameter::SpecificGravity: return {{"sg", ""}};
    case jn::Parameter::Temperature: return {{"C", "\u00b0C"}, {"F", "\u00b0F"}};
    default: return {{"mg/L", "mg/L"}};
  }
}

// The user's preferred unit for a parameter (index into units_for).
int preferred_unit(jn::Parameter p, const jn::UnitPreferences& u) {
  if (p == jn::Parameter::Alkalinity) {
    return u.alkalinity == au::AlkalinityUnit::MeqPerL ? 1 : u.alkalinity == au::AlkalinityUnit::MgPerLCaCO3 ? 2 : 0;
  }
  if (p == jn::Parameter::Calcium || p == jn::Parameter::Magnesium) {
    return u.calcium_magnesium == au::ConcentrationUnit::MmolPerKg ? 1 : 0;
  }
  if (p == jn::Parameter::Temperature) return u.temperature == jn::TemperatureUnit::Fahrenheit ? 1 : 0;
  return 0;
}

int decimals_for(jn::Parameter p, const std::string& unit) {
  if (p == jn::Parameter::PH) return 2;
  if (p == jn::Parameter::SpecificGravity) return 4;
  if (p == jn::Parameter::Phosphate) return 3;
  if (unit == "meq/L" || unit == "mmol/kg") return 2;
  if (unit == "mg/L CaCO3" || p == jn::Parameter::Calcium || p == jn::Parameter::Magnesium) return 0;
  return 1;
}

std::string precision_key(const LogForm& f) { return std::string(tw::parameter_name(f.parameter)) + "|" + f.unit; }

// The kit's precision: the parameter's typical one (the core's table) in the unit chosen,
// until the user types their kit's; bounded by what the journal accepts for it.
void draw_precision(AppState& app, LogForm& f, const char* unit_shown, int value_decimals) {
  if (f.precision_for != precision_key(f)) {
    f.precision = jn::typical_precision_in_unit(f.parameter, f.unit);
    f.precision_for = precision_key(f);
  }
  const auto bounds = jn::accepted_precision_in_unit(f.parameter, f.unit);
  if (!bounds) return;
  const int dec = value_decimals + 1;
  ui::optional_number_field(app, "log.precision",
                            {"Kit precision (one standard deviation)", unit_shown, dec, std::pow(10.0, -dec), bounds->lo,
                             bounds->hi},
                            &f.precision);
  ui::dim_text("Filled with a typical hobby kit's; enter your own kit's if you know it. The Demand estimate weighs "
               "each test by it.");
}

void draw_test(AppState& app, const jn::System& sys, LogForm& f) {
  int param = 0;
  for (int i = 0; i < kParamCount; ++i) if (kParamValues[i] == f.parameter) param = i;
  if (ui::choice(app, "log.parameter", "What you measured", &param, kParams, kParamCount)) {
    f.parameter = kParamValues[param];
    f.unit.clear();
    f.value_text.clear();
  }
  const auto units = units_for(f.parameter);
  int unit = preferred_unit(f.parameter, sys.units);
  for (size_t i = 0; i < units.size(); ++i) if (f.unit == units[i].journal_unit) unit = static_cast<int>(i);
  if (units.size() > 1) {
    std::vector<const char*> shown;
    for (const auto& u : units) shown.push_back(u.shown);
    if (ui::choice(app, "log.unit", "Unit", &unit, shown.data(), static_cast<int>(shown.size()))) f.value_text.clear();
  }
  f.unit = units[static_cast<size_t>(unit)].journal_unit;
  if (f.parameter == jn::Parameter::PH) {
    if (f.value_text.empty() && f.editing == 0 && f.ph_scale != sys.units.ph_scale) f.ph_scale = sys.units.ph_scale;
    fields::ph_scale(app, "log.ph_scale", "pH scale of the meter or kit", &f.ph_scale);
  }
  std::optional<double> value;
  if (!f.value_text.empty()) value = std::strtod(f.value_text.c_str(), nullptr);
  const int dec = decimals_for(f.parameter, f.unit);
  const std::string label = f.parameter == jn::Parameter::SpecificGravity ? std::string("Specific gravity")
                                                                          : std::string(kParams[param]) + " result";
  const double step = dec == 0 ? 1 : dec == 1 ? 0.1 : dec == 2 ? 0.01 : 0.001;
  // The field's bounds are the core's range in the unit shown (the core checks it again on save).
  double lo = tw::ranges::kOtherValue.lo, hi = tw::ranges::kOtherValue.hi;  // unknown unit: the core refuses on save
  if (auto b = jn::accepted_in_unit(f.parameter, f.unit)) {
    lo = b->lo;
    hi = b->hi;
  }
  if (ui::optional_number_field(app, "log.value", {label.c_str(), units[static_cast<size_t>(unit)].shown, dec, step, lo, hi},
                                &value) && value) {
    f.value_text = fmtx::fixed(*value, dec + 1);
  }
  draw_precision(app, f, units[static_cast<size_t>(unit)].shown, dec);
  if (f.parameter == jn::Parameter::SpecificGravity && value) {
    // What the reading means, as the Water screen will use it (refractometer convention 25/25 C).
    auto s = tw::seawater::salinity_from_specific_gravity(*value);
    ui::dim_text(s ? ("= salinity " + fmtx::fixed(*s, 1) + " (EOS-80, read at 25 \u00b0C against pure water at 25 \u00b0C)").c_str()
                   : s.error().message.c_str());
  }
}

std::optional<jn::EventData> build_test(AppState& app, const LogForm& f) {
  if (f.value_text.empty()) {
    notify(app, "Enter the value first", true);
    return std::nullopt;
  }
  jn::TestResult t;
  t.parameter = f.parameter;
  t.value = std::strtod(f.value_text.c_str(), nullptr);
  t.unit = f.unit;
  if (f.parameter == jn::Parameter::PH) t.ph_scale = f.ph_scale;
  if (f.precision_for == precision_key(f)) t.precision = f.precision;  // the core checks its range
  return t;
}

// ---------------------------------------------------------------- 2. Dose
// Salts a reef keeper doses by hand or pump (catalog keys; gases and caustics left to the Plan
// and Hatchery screens, which carry their cautions).
struct DoseChoice {
  add::CompoundId id;
  const char* shown;
};
const DoseChoice kDoseChoices[] = {
    {add::CompoundId::SodiumCarbonate, "Na\u2082CO\u2083"},
    {add::CompoundId::SodiumBicarbonate, "NaHCO\u2083"},
    {add::CompoundId::CalciumChlorideDihydrate, "CaCl\u2082\u00b72H\u2082O"},
    {add::CompoundId::MagnesiumChlorideHexahydrate, "MgCl\u2082\u00b76H\u2082O"},
    {add::CompoundId::MagnesiumSulfateHeptahydrate, "MgSO\u2084\u00b77H\u2082O"},
};
constexpr int kDoseChoiceCount = static_cast<int>(sizeof kDoseChoices / sizeof kDoseChoices[0]);

int dose_choice_of(const std::string& key) {
  for (int i = 0; i < kDoseChoiceCount; ++i) if (add::compound(kDoseChoices[i].id).key == key) return i;
  return -1;
}

void draw_dose(AppState& app, LogForm& f) {
  if (f.dose_compound >= 0) {
    const char* names[kDoseChoiceCount];
    for (int i = 0; i < kDoseChoiceCount; ++i) names[i] = kDoseChoices[i].shown;
    ui::choice(app, "log.dose.compound", "What you dosed", &f.dose_compound, names, kDoseChoiceCount);
    ui::dim_text(add::compound(kDoseChoices[f.dose_compound].id).name.c_str());
  } else {
    ui::label_value(app, "What you dosed", f.dose_additive_as_logged + " (as logged)");
  }
  int form = f.dose_in_ml ? 0 : 1;
  const char* const forms[] = {"mL of stock solution", "grams of dry salt"};
  if (ui::choice(app, "log.dose.form", "Dosed as", &form, forms, 2)) f.dose_in_ml = form == 0;
  ui::optional_number_field(app, "log.dose.amount", {"Amount", f.dose_in_ml ? "mL" : "g", 1, f.dose_in_ml ? 1.0 : 0.5,
                                                     0.1, tw::ranges::kDoseAmount.hi}, &f.dose_amount);
  if (f.dose_in_ml) {
    ui::number_field(app, "log.dose.stock", {"Stock strength (salt as sold per litre of solution)", "g/L", 0, 5, 1,
                                             tw::ranges::kStockGPerL.hi}, &f.dose_stock_g_per_l);
  }
}

std::optional<jn::EventData> build_dose(AppState& app, const LogForm& f) {
  if (!f.dose_amount) {
    notify(app, "Enter the amount dosed first", true);
    return std::nullopt;
  }
  jn::Dose d;
  d.additive_id = f.dose_compound >= 0 ? add::compound(kDoseChoices[f.dose_compound].id).key : f.dose_additive_as_logged;
  d.amount = *f.dose_amount;
  d.unit = f.dose_in_ml ? jn::DoseUnit::Millilitres : jn::DoseUnit::Grams;
  if (f.dose_in_ml) d.stock_g_per_l = f.dose_stock_g_per_l;
  return d;
}

// ---------------------------------------------------------------- 3. Water change
void draw_water_change(AppState& app, const jn::System& sys, LogForm& f) {
  const au::VolumeUnit vu = sys.units.volume;
  const auto vol_to = [vu](double l) { return au::volume_from_litres(l, vu); };
  const auto vol_from = [vu](double v) { return au::volume_to_litres(v, vu); };
  converted_field(app, "log.change.volume", {"Water replaced", fmtx::volume_unit_text(vu), 1, vol_to(5), 0.1, sys.volume_l},
                  &f.change_volume_l, vol_to, vol_from);
  ui::dim_text("The new water's levels, when you know them (the consumption estimate uses them):");
  const au::AlkalinityUnit au_ = sys.units.alkalinity;
  const fmtx::UnitShown alk = fmtx::alkalinity_shown(au_);
  converted_field(app, "log.change.alkalinity", {"Alkalinity of the new water", alk.unit, alk.decimals, alk.step,
                                                 0, tw::ranges::kAlkalinityDkh.hi},
                  &f.change_alkalinity_dkh, [au_](double d) { return fmtx::alkalinity_from_dkh(d, au_); },
                  [au_](double v) { return fmtx::alkalinity_to_dkh(v, au_); });
  const au::ConcentrationUnit cu = sys.units.calcium_magnesium;
  const char* cu_text = cu == au::ConcentrationUnit::MmolPerKg ? "mmol/kg" : "mg/L";
  const int cd = ion_decimals(cu);
  converted_field(app, "log.change.calcium", {"Calcium of the new water", cu_text, cd, cd ? 0.1 : 5.0, 0,
                                              tw::ranges::kCalciumMgL.hi},
                  &f.change_calcium_mg_l, [cu](double m) { return ion_shown(m, cu, au::Ion::Calcium); },
                  [cu](double v) { return ion_from_shown(v, cu, au::Ion::Calcium); });
  converted_field(app, "log.change.magnesium", {"Magnesium of the new water", cu_text, cd, cd ? 0.2 : 10.0, 0,
                                                tw::ranges::kMagnesiumMgL.hi},
                  &f.change_magnesium_mg_l, [cu](double m) { return ion_shown(m, cu, au::Ion::Magnesium); },
                  [cu](double v) { return ion_from_shown(v, cu, au::Ion::Magnesium); });
  ui::optional_number_field(app, "log.change.salinity", {"Salinity of the new water", "psu", 1, 0.1, 0,
                                                         tw::ranges::kSalinity.hi}, &f.change_salinity);
}

std::optional<jn::EventData> build_water_change(AppState& app, const LogForm& f) {
  if (!f.change_volume_l) {
    notify(app, "Enter how much water was replaced first", true);
    return std::nullopt;
  }
  jn::WaterChange w;
  w.volume_l = *f.change_volume_l;
  w.alkalinity_dkh = f.change_alkalinity_dkh;
  w.calcium_mg_l = f.change_calcium_mg_l;
  w.magnesium_mg_l = f.change_magnesium_mg_l;
  w.salinity = f.change_salinity;
  return w;
}

// ---------------------------------------------------------------- 4. Top-off
void draw_top_off(AppState& app, const jn::System& sys, LogForm& f) {
  const au::VolumeUnit vu = sys.units.volume;
  const auto vol_to = [vu](double l) { return au::volume_from_litres(l, vu); };
  const auto vol_from = [vu](double v) { return au::volume_to_litres(v, vu); };
  converted_field(app, "log.topoff.volume", {"Water added", fmtx::volume_unit_text(vu), 1, vol_to(0.5), 0.1, sys.volume_l},
                  &f.topoff_volume_l, vol_to, vol_from);
  int kind = f.topoff_limewater ? 1 : 0;
  const char* const kinds[] = {"Fresh water", "Limewater (saturated)"};
  if (ui::choice(app, "log.topoff.kind", "Kind", &kind, kinds, 2)) f.topoff_limewater = kind == 1;
  if (f.topoff_limewater) {
    ui::dim_text("Limewater is caustic (pH about 12.4): add it slowly, into strong flow, never all at once.");
  }
}

std::optional<jn::EventData> build_top_off(AppState& app, const LogForm& f) {
  if (!f.topoff_volume_l) {
    notify(app, "Enter how much water was added first", true);
    return std::nullopt;
  }
  jn::TopOff t;
  t.volume_l = *f.topoff_volume_l;
  t.kind = f.topoff_limewater ? jn::TopOffKind::Limewater : jn::TopOffKind::Plain;
  return t;
}

}  // namespace

// ---------------------------------------------------------------- 5. The four together
void draw(AppState& app, const jn::System& sys, LogForm& f) {
  switch (f.kind) {
    case LogKind::Test: draw_test(app, sys, f); break;
    case LogKind::Dose: draw_dose(app, f); break;
    case LogKind::WaterChange: draw_water_change(app, sys, f); break;
    case LogKind::TopOff: draw_top_off(app, sys, f); break;
  }
}

std::optional<jn::EventData> build(AppState& app, const jn::System& /*sys*/, const LogForm& f) {
  switch (f.kind) {
    case LogKind::Test: return build_test(app, f);
    case LogKind::Dose: return build_dose(app, f);
    case LogKind::WaterChange: return build_water_change(app, f);
    case LogKind::TopOff: return build_top_off(app, f);
  }
  return std::nullopt;
}

void clear_values(LogForm& f) {
  f.value_text.clear();
  f.dose_amount.reset();
  f.change_volume_l.reset();
  f.change_alkalinity_dkh.reset();
  f.change_calcium_mg_l.reset();
  f.change_magnesium_mg_l.reset();
  f.change_salinity.reset();
  f.topoff_volume_l.reset();
}

LogForm from_event(const jn::Event& e) {
  LogForm f;
  f.editing = e.id;
  f.when_s = e.time_s;
  if (const auto* t = std::get_if<jn::TestResult>(&e.data)) {
    f.kind = LogKind::Test;
    f.parameter = t->parameter;
    f.unit = t->unit;
    f.value_text = fmtx::fixed(t->value, decimals_for(t->parameter, t->unit) + 1);
    if (t->ph_scale) f.ph_scale = *t->ph_scale;
    f.precision = t->precision;  // as logged (none: the field stays empty)
    f.precision_for = precision_key(f);
  } else if (const auto* d = std::get_if<jn::Dose>(&e.data)) {
    f.kind = LogKind::Dose;
    f.dose_compound = dose_choice_of(d->additive_id);
    if (f.dose_compound < 0) f.dose_additive_as_logged = d->additive_id;
    f.dose_amount = d->amount;
    f.dose_in_ml = d->unit == jn::DoseUnit::Millilitres;
    if (d->stock_g_per_l) f.dose_stock_g_per_l = *d->stock_g_per_l;
  } else if (const auto* w = std::get_if<jn::WaterChange>(&e.data)) {
    f.kind = LogKind::WaterChange;
    f.change_volume_l = w->volume_l;
    f.change_alkalinity_dkh = w->alkalinity_dkh;
    f.change_calcium_mg_l = w->calcium_mg_l;
    f.change_magnesium_mg_l = w->magnesium_mg_l;
    f.change_salinity = w->salinity;
  } else if (const auto* o = std::get_if<jn::TopOff>(&e.data)) {
    f.kind = LogKind::TopOff;
    f.topoff_volume_l = o->volume_l;
    f.topoff_limewater = o->kind == jn::TopOffKind::Limewater;
  }
  return f;
}

std::string event_text(const jn::Event& e, const jn::UnitPreferences& units) {
  if (const auto* t = std::get_if<jn::TestResult>(&e.data)) {
    std::string s = std::string(tw::parameter_label(t->parameter)) + " " +
                    fmtx::fixed(t->value, decimals_for(t->parameter, t->unit));
    if (t->parameter == jn::Parameter::PH) return s + " (" + fmtx::ph_scale_label(t->ph_scale.value_or(cb::PhScale::NBS)) + ")";
    if (t->parameter == jn::Parameter::SpecificGravity) return s;  // a ratio: no unit
    return s + " " + t->unit;
  }
  if (const auto* d = std::get_if<jn::Dose>(&e.data)) {
    const int i = dose_choice_of(d->additive_id);
    std::string s = "Dose " + fmtx::fixed(d->amount, 1) + " " + jn::to_string(d->unit) + " " +
                    (i >= 0 ? kDoseChoices[i].shown : d->additive_id.c_str());
    if (d->stock_g_per_l) s += " (" + fmtx::fixed(*d->stock_g_per_l, 0) + " g/L stock)";
    if (d->mark == jn::ScheduleMark::Missed) s += ", missed by its schedule";
    if (d->mark == jn::ScheduleMark::Extra) s += ", extra run of its schedule";
    return s;
  }
  if (const auto* w = std::get_if<jn::WaterChange>(&e.data)) {
    std::string known;  // the new water's levels, when they were logged
    const auto add_part = [&known](const std::string& part) { known += (known.empty() ? "" : ", ") + part; };
    if (w->alkalinity_dkh) add_part(fmtx::alkalinity_text(*w->alkalinity_dkh, units.alkalinity));
    if (w->calcium_mg_l) add_part("Ca " + fmtx::fixed(*w->calcium_mg_l, 0) + " mg/L");
    if (w->magnesium_mg_l) add_part("Mg " + fmtx::fixed(*w->magnesium_mg_l, 0) + " mg/L");
    if (w->salinity) add_part("salinity " + fmtx::fixed(*w->salinity, 1));
    return "Water change " + fmtx::volume_text(w->volume_l, units.volume) + (known.empty() ? "" : " (new water " + known + ")");
  }
  if (const auto* o = std::get_if<jn::TopOff>(&e.data)) {
    return std::string("Top-off ") + fmtx::volume_text(o->volume_l, units.volume) +
           (o->kind == jn::TopOffKind::Limewater ? " limewater" : " fresh water");
  }
  if (const auto* n = std::get_if<jn::Note>(&e.data)) return "Note: " + n->text;
  if (const auto* p = std::get_if<jn::DoseSchedule>(&e.data)) {
    return "Schedule " + jn::schedule_summary(*p) + (p->stop_time_s ? " (stopped)" : "");
  }
  return "?";
}

}  // namespace twapp::log_forms
