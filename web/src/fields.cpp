#include "fields.hpp"

#include "actions.hpp"
#include "format.hpp"
#include "local_time.hpp"
#include "platform.hpp"
#include "tidewright/common/datetime.hpp"
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

// "Now" or a local date and time the user types or steps back by an hour or a day.
void when(AppState& app, const std::string& prefix, std::optional<std::int64_t>* when_s) {
  int chosen = when_s->has_value() ? 1 : 0;
  const char* const whens[] = {"Now", "Earlier"};
  if (ui::choice(app, prefix + ".when", "When", &chosen, whens, 2)) {
    if (chosen == 1) *when_s = platform::now_unix_seconds() / 60 * 60;
    else when_s->reset();
  }
  if (!when_s->has_value()) return;
  std::string text = local_time::text(**when_s);
  if (ui::text_field(app, prefix + ".time", "Date and time (your local time)", &text, "for example 2026-12-01 07:30")) {
    auto t = tw::datetime::parse_datetime(text, local_time::parse_options());
    if (!t) notify(app, t.error().message, true);
    else *when_s = *t;
  }
  const float half = (ImGui::GetContentRegionAvail().x - ImGui::GetStyle().ItemSpacing.x) / 2;
  if (ui::button(app, prefix + ".time.hour_earlier", "1 hour earlier", half, ui::Tone::Quiet)) **when_s -= 3600;
  ImGui::SameLine();
  if (ui::button(app, prefix + ".time.day_earlier", "1 day earlier", half, ui::Tone::Quiet)) **when_s -= 86400;
}

}  // namespace twapp::fields
