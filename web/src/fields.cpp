#include "fields.hpp"

#include "actions.hpp"
#include "format.hpp"
#include "ui.hpp"

namespace twapp::fields {

namespace cb = tw::carbonate;

tw::journal::UnitPreferences units(const AppState& app) {
  const tw::journal::System* sys = current_system(app);
  return sys ? sys->units : app.settings.units;
}

bool temperature(AppState& app, const std::string& name, const char* label, double* celsius,
                 tw::units::TemperatureUnit tu, const tw::ranges::Range& range_c) {
  double shown = fmtx::temperature_shown(*celsius, tu);
  if (!ui::number_field(app, name,
                        {label, fmtx::temperature_unit_text(tu), 1, 0.5, fmtx::temperature_shown(range_c.lo, tu),
                         fmtx::temperature_shown(range_c.hi, tu)},
                        &shown)) {
    return false;
  }
  *celsius = fmtx::temperature_from_shown(shown, tu);
  return true;
}

bool optional_temperature(AppState& app, const std::string& name, const char* label, std::optional<double>* celsius,
                          tw::units::TemperatureUnit tu, const tw::ranges::Range& range_c) {
  std::optional<double> shown;
  if (*celsius) shown = fmtx::temperature_shown(**celsius, tu);
  if (!ui::optional_number_field(app, name,
                                 {label, fmtx::temperature_unit_text(tu), 1, 0.5, fmtx::temperature_shown(range_c.lo, tu),
                                  fmtx::temperature_shown(range_c.hi, tu)},
                                 &shown)) {
    return false;
  }
  celsius->reset();
  if (shown) *celsius = fmtx::temperature_from_shown(*shown, tu);
  return true;
}

bool alkalinity(AppState& app, const std::string& name, const char* label, double* dkh,
                tw::units::AlkalinityUnit au, const tw::ranges::Range& range_dkh) {
  const fmtx::UnitShown shown_unit = fmtx::alkalinity_shown(au);
  double shown = fmtx::alkalinity_from_dkh(*dkh, au);
  if (!ui::number_field(app, name,
                        {label, shown_unit.unit, shown_unit.decimals, shown_unit.step,
                         fmtx::alkalinity_from_dkh(range_dkh.lo, au), fmtx::alkalinity_from_dkh(range_dkh.hi, au)},
                        &shown)) {
    return false;
  }
  *dkh = fmtx::alkalinity_to_dkh(shown, au);
  return true;
}

bool ph_scale(AppState& app, const std::string& name, const char* label, cb::PhScale* scale) {
  static const char* const kNames[] = {"NBS", "Total", "Seawater", "Free"};
  int index = 0;
  for (int i = 0; i < 4; ++i) {
    if (kPhScales[i] == *scale) index = i;
  }
  if (!ui::choice(app, name, label, &index, kNames, 4)) return false;
  *scale = kPhScales[index];
  return true;
}

}  // namespace twapp::fields
