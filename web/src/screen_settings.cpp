// Settings: units (stored with the current system and as the default for new ones), the pH
// scale of the user's meter, text size, room CO2, the planner's safety limits, and the user's
// data (export, import).
#include <cctype>
#include <cmath>
#include <string>

#include "tidewright/common/ranges.hpp"
#include "actions.hpp"
#include "fields.hpp"
#include "format.hpp"
#include "platform.hpp"
#include "screens.hpp"
#include "theme.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

namespace jn = tw::journal;
namespace au = tw::units;
namespace cb = tw::carbonate;

const char* const kAlkUnits[] = {"dKH", "meq/L", "mg/L CaCO\u2083"};
const au::AlkalinityUnit kAlkValues[] = {au::AlkalinityUnit::DKH, au::AlkalinityUnit::MeqPerL, au::AlkalinityUnit::MgPerLCaCO3};
const char* const kVolumeUnits[] = {"Litres", "US gallons"};
const char* const kTempUnits[] = {"\u00b0C", "\u00b0F"};
const char* const kConventions[] = {"CO2SYS / PyCO2SYS", "2007 Guide"};
const char* const kTextSizes[] = {"Small", "Normal", "Large", "Huge"};
const float kTextSizeValues[] = {0.85f, 1.0f, 1.2f, 1.45f};

// How each safety limit is entered: step, decimals and the least strict value offered on the
// screen's own side (the lowest ceiling or largest change, the highest floor). Those are this
// screen's choice (a limit past them leaves no useful plan); the core asks only for a value in
// its accepted range. The other end is always the core's hard bound: this screen has no
// override, so it never goes past it.
struct LimitEntry {
  int decimals;
  double step, strictest;
};
LimitEntry limit_entry(tw::plan::LimitId id) {
  using L = tw::plan::LimitId;
  switch (id) {
    case L::AlkalinityRisePerDay: return {2, 0.1, 0.1};
    case L::CalciumRisePerDay: return {0, 1, 1};
    case L::MagnesiumRisePerDay: return {0, 5, 5};
    case L::PhAfterDose: return {2, 0.05, 7.8};
    case L::OmegaAragoniteAfterDose: return {1, 0.1, 1.5};
    case L::AlkalinityCeiling: return {1, 0.5, 5};
    case L::CalciumCeiling: return {0, 10, 350};
    case L::MagnesiumCeiling: return {0, 10, 1000};
    case L::AlkalinityFallPerDay: return {2, 0.1, 0.1};
    case L::CalciumFallPerDay: return {0, 1, 1};
    case L::MagnesiumFallPerDay: return {0, 5, 5};
    case L::AlkalinityStepPerDose: return {2, 0.05, 0.05};
    case L::CalciumStepPerDose: return {0, 1, 1};
    case L::MagnesiumStepPerDose: return {0, 5, 5};
    case L::AlkalinityFloor: return {1, 0.5, 11};
    case L::CalciumFloor: return {0, 10, 480};
    case L::MagnesiumFloor: return {0, 10, 1450};
    case L::PhFloor: return {2, 0.05, 8.2};
    case L::OmegaAragoniteFloor: return {1, 0.1, 4.0};
  }
  return {2, 0.1, 0.1};
}

void draw_safety_limits(AppState& app) {
  ui::heading(app, "Safety limits of the dose plan");
  ui::dim_text("Limits on both sides: ceilings and largest changes bound how hard a dose may push the water; floors bound how low it may be let go. Tighten any limit for sensitive livestock. Loosening one past its default (a higher ceiling, a lower floor) is allowed up to its hard bound and is shown with every plan; past the hard bound the app refuses.");
  ui::card_begin(app);
  for (const tw::plan::LimitSpec& spec : tw::plan::limit_specs()) {
    const LimitEntry e = limit_entry(spec.id);
    double v = app.settings.safety_limits[static_cast<std::size_t>(spec.id)];
    std::string label = spec.description;
    if (!label.empty()) label[0] = static_cast<char>(std::toupper(static_cast<unsigned char>(label[0])));
    const std::string name = std::string("settings.limit.") + spec.key;
    const bool floor = spec.side == tw::plan::LimitSide::Floor;
    const double lo = floor ? spec.hard_bound : e.strictest, hi = floor ? e.strictest : spec.hard_bound;
    if (ui::number_field(app, name, {label.c_str(), spec.unit, e.decimals, e.step, lo, hi}, &v)) {
      set_safety_limit(app, spec.id, v);
    }
    const bool loosened = spec.loosens(v) && std::fabs(v - spec.default_value) > 1e-9 * std::fabs(spec.default_value);
    const std::string note = std::string(floor ? "Floor. " : "") + "Default " +
                             fmtx::fixed(spec.default_value, e.decimals) + ", hard " + (floor ? "floor " : "ceiling ") +
                             fmtx::fixed(spec.hard_bound, e.decimals) + " (" + spec.source + ")";
    if (loosened) ui::colored_wrapped(theme::kWarning, ((floor ? "Below the default. " : "Above the default. ") + note).c_str());
    else ui::dim_text(note.c_str());
  }
  ui::card_end(app);
  if (app.settings.safety_limits != tw::plan::default_limits().value) {
    if (ui::button(app, "settings.limits_reset", "Back to the default limits", 0, ui::Tone::Quiet)) reset_safety_limits(app);
  }
}

template <class T, int N>
int index_of(const T (&values)[N], T v) {
  for (int i = 0; i < N; ++i) if (values[i] == v) return i;
  return 0;
}

}  // namespace

void draw_settings(AppState& app) {
  const jn::System* sys = current_system(app);
  jn::UnitPreferences u = sys ? sys->units : app.settings.units;
  ui::panes_begin(app);  // wide: how the app shows things beside the limits and the data
  ui::heading(app, "Units");
  ui::dim_text(sys ? ("Used for " + sys->name + " and for new systems.").c_str() : "Used for new systems.");
  bool units_changed = false;
  int alk = index_of(kAlkValues, u.alkalinity);
  if (ui::choice(app, "settings.alkalinity", "Alkalinity", &alk, kAlkUnits, 3)) {
    u.alkalinity = kAlkValues[alk];
    units_changed = true;
  }
  int vol = u.volume == au::VolumeUnit::UsGallon ? 1 : 0;
  if (ui::choice(app, "settings.volume", "Volume", &vol, kVolumeUnits, 2)) {
    u.volume = vol ? au::VolumeUnit::UsGallon : au::VolumeUnit::Litre;
    units_changed = true;
  }
  int temp = u.temperature == jn::TemperatureUnit::Fahrenheit ? 1 : 0;
  if (ui::choice(app, "settings.temperature", "Temperature", &temp, kTempUnits, 2)) {
    u.temperature = temp ? jn::TemperatureUnit::Fahrenheit : jn::TemperatureUnit::Celsius;
    units_changed = true;
  }
  units_changed |= fields::ph_scale(app, "settings.ph_scale", "pH scale of your meter or kit", &u.ph_scale);
  ui::dim_text("Hobby pH meters calibrated with NBS buffers (pH 7 and 10) read on the NBS scale. Laboratories and hatcheries measuring with dye or TRIS buffers in seawater usually report the total scale.");
  if (units_changed) set_units(app, u);

  ui::heading(app, "Text size");
  int size = 1;
  for (int i = 0; i < 4; ++i) if (std::abs(kTextSizeValues[i] - app.settings.text_size) < 0.01f) size = i;
  if (ui::choice(app, "settings.text_size", nullptr, &size, kTextSizes, 4)) set_text_size(app, kTextSizeValues[size]);

  ui::heading(app, "Colours");
  const char* const looks[] = {"Dark (dim rooms)", "Light (bright rooms)"};
  int look = app.settings.look == Look::Light ? 1 : 0;
  if (ui::choice(app, "settings.look", nullptr, &look, looks, 2)) set_look(app, look == 1 ? Look::Light : Look::Dark);

  ui::heading(app, "Room air");
  double co2 = app.settings.room_co2_ppm;
  if (ui::number_field(app, "settings.room_co2", {"CO\u2082 in the room's air", "ppm", 0, 50, tw::ranges::kRoomCo2Ppm.lo, tw::ranges::kRoomCo2Ppm.hi}, &co2)) {
    set_room_co2(app, co2);
  }
  ui::dim_text("Outdoor air is about 420 ppm; closed rooms with people in them often reach 800 to 2000 ppm, which lowers the pH that tank water settles at.");

  ui::heading(app, "Chemistry constants");
  int conv = app.settings.constants_convention == cb::ConstantsConvention::Guide2007 ? 1 : 0;
  if (ui::choice(app, "settings.conventions", nullptr, &conv, kConventions, 2)) {
    set_constants_convention(app, conv ? cb::ConstantsConvention::Guide2007 : cb::ConstantsConvention::ReferencePackages);
  }
  ui::dim_text("How the Water screen puts its constants on the total pH scale. CO2SYS / PyCO2SYS: as the reference software of oceanography does (the default). 2007 Guide: as printed in Dickson, Sabine & Christian (2007). They differ by at most 0.004 in pH on the seawater and NBS scales.");

  ui::panes_next(app);
  draw_safety_limits(app);

  draw_settings_data(app);  // settings_data.cpp: exports, import and its preview

  ui::heading(app, "Care");
  ui::dim_text("Tidewright's numbers come from published seawater chemistry, but your test kits, your animals and your dosing are your responsibility. Change alkalinity slowly; sodium hydroxide and limewater are caustic (wear eye protection, add slowly, never into a tank with the pump off). Hatcheries and farms producing food follow their local codes and licensed practice.");
  ui::panes_end(app);
}

}  // namespace twapp
