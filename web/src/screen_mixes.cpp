// Mixes: stock solutions both ways, with the solubility check shown. From a recipe (grams per
// litre of finished solution) to what 1 mL adds; or from a wanted effect ("1 mL raises 100 L
// by 0.1 dKH") to the recipe. The core (tw::additives) computes and refuses what would not
// dissolve. Map: 1. form  2. strength  3. solubility  4. draw_mixes.
#include <algorithm>
#include <string>

#include "tidewright/common/ranges.hpp"
#include "actions.hpp"
#include "actions_dosing.hpp"
#include "fields.hpp"
#include "format.hpp"
#include "screens.hpp"
#include "theme.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

namespace add = tw::additives;
namespace jn = tw::journal;

// A rise of `p` shown in the user's unit, and back (core: dKH, mg/L).
double rise_shown(const AppState& app, int p, double core) {
  const auto u = fields::units(app);
  if (p == 0) return fmtx::alkalinity_from_dkh(core, u.alkalinity);
  return ion_shown(core, u.calcium_magnesium, p == 1 ? tw::units::Ion::Calcium : tw::units::Ion::Magnesium);
}
double rise_core(const AppState& app, int p, double shown) {
  const auto u = fields::units(app);
  if (p == 0) return fmtx::alkalinity_to_dkh(shown, u.alkalinity);
  return ion_from_shown(shown, u.calcium_magnesium, p == 1 ? tw::units::Ion::Calcium : tw::units::Ion::Magnesium);
}
std::string rise_unit(const AppState& app, int p) {
  const auto u = fields::units(app);
  return p == 0 ? fmtx::alkalinity_shown(u.alkalinity).unit : tw::units::to_string(u.calcium_magnesium);
}
int rise_decimals(const AppState& app, int p) {
  const auto u = fields::units(app);
  return p == 0 ? fmtx::alkalinity_shown(u.alkalinity).decimals + 1 : ion_decimals(u.calcium_magnesium) + 1;
}

// ---------------------------------------------------------------- 1. Form
void draw_form(AppState& app, MixesForm& f) {
  const auto u = fields::units(app);
  const auto& list = mix_compounds();
  ui::card_begin(app);
  std::vector<std::string> formulas;
  for (add::CompoundId id : list) {
    const add::Compound& k = add::compound(id);
    formulas.push_back(k.label.empty() ? k.formula : k.label);  // soda ash and baked soda share Na2CO3
  }
  std::vector<const char*> labels;
  for (const std::string& s : formulas) labels.push_back(s.c_str());
  f.compound = std::clamp(f.compound, 0, static_cast<int>(list.size()) - 1);
  ui::choice(app, "mixes.compound", "Compound", &f.compound, labels.data(), static_cast<int>(labels.size()));
  ImGui::PushFont(app.ui.fonts.bold);
  ui::wrapped(add::compound(list[static_cast<size_t>(f.compound)]).name.c_str());
  ImGui::PopFont();
  fields::temperature(app, "mixes.temperature", "Where the stock is kept", &f.temperature_c, u.temperature,
                      tw::ranges::kStockTemperatureC);
  if (f.direction == MixDirection::RecipeToStrength) {
    ui::number_field(app, "mixes.grams", {"Grams per litre of finished solution", "g/L", 1, 5, 0.1, tw::ranges::kStockGPerL.hi},
                     &f.grams_per_l);
    ui::dim_text("Weigh the compound as sold (with its water of crystallisation), dissolve, and make up to the litre.");
  } else {
    const char* const params[] = {"Alkalinity", "Calcium", "Magnesium"};
    if (ui::choice(app, "mixes.param", "Effect on", &f.parameter, params, 3)) {
      f.rise = f.parameter == 0 ? 0.1 : f.parameter == 1 ? 1.0 : 1.0;
    }
    const int dec = rise_decimals(app, f.parameter);
    double r = rise_shown(app, f.parameter, f.rise);
    const std::string unit = rise_unit(app, f.parameter);
    const tw::ranges::Range rise = tw::ranges::of_rise(static_cast<tw::Parameter>(std::clamp(f.parameter, 0, 2)));
    if (ui::number_field(app, "mixes.rise", {"Raises by", unit.c_str(), dec, f.parameter == 0 ? 0.01 : 0.1,
                                             rise_shown(app, f.parameter, rise.lo), rise_shown(app, f.parameter, rise.hi)},
                         &r)) {
      f.rise = rise_core(app, f.parameter, r);
    }
    ui::number_field(app, "mixes.dose_ml", {"For a dose of", "mL", 1, 0.5, tw::ranges::kMixDoseMl.lo,
                                                 tw::ranges::kMixDoseMl.hi},
                     &f.dose_ml);
    double v = tw::units::volume_from_litres(f.tank_volume_l, u.volume);
    if (ui::number_field(app, "mixes.tank_volume",
                         {"In a water volume of", fmtx::volume_unit_text(u.volume), 0, 10,
                          tw::units::volume_from_litres(tw::ranges::kSystemVolumeL.lo, u.volume),
                          tw::units::volume_from_litres(tw::ranges::kSystemVolumeL.hi, u.volume)},
                         &v)) {
      f.tank_volume_l = tw::units::volume_to_litres(v, u.volume);
    }
  }
  ui::card_end(app);
}

// ---------------------------------------------------------------- 2. Strength
void draw_strength(AppState& app, const MixesForm& f, const MixesCache& c) {
  const auto u = fields::units(app);
  const add::StockStrength& s = *c.strength;
  ui::card_begin(app);
  if (c.recipe) {
    ui::dim_text("Recipe");
    ImGui::PushFont(app.ui.fonts.big);
    ImGui::TextUnformatted(fmtx::fixed(c.recipe->grams_per_l, c.recipe->grams_per_l < 10 ? 2 : 1).c_str());
    ImGui::PopFont();
    ImGui::SameLine(0, 0.4f * ui::em(app));
    ImGui::PushFont(app.ui.fonts.bold);
    ImGui::TextUnformatted("g per litre");
    ImGui::PopFont();
    ui::record(app, "mixes.recipe");
    ui::wrapped(("Dissolve " + fmtx::fixed(c.recipe->grams_per_l, 1) + " g of " +
                 add::compound(c.recipe->compound).name + " and make up to 1 L.").c_str());
  }
  ui::heading(app, "What 1 mL adds");
  if (s.alkalinity_meq_per_ml != 0) {
    ui::label_value(app, "Alkalinity", fmtx::fixed(s.alkalinity_meq_per_ml, 3) + " meq");
  }
  if (s.dic_mmol_per_ml != 0) ui::label_value(app, "DIC", fmtx::fixed(s.dic_mmol_per_ml, 3) + " mmol");
  if (s.calcium_mg_per_ml != 0) ui::label_value(app, "Calcium", fmtx::fixed(s.calcium_mg_per_ml, 1) + " mg");
  if (s.magnesium_mg_per_ml != 0) ui::label_value(app, "Magnesium", fmtx::fixed(s.magnesium_mg_per_ml, 1) + " mg");
  ui::record(app, "mixes.per_ml");
  // In the user's terms: 1 mL in 100 L (or 100 gal).
  const double vol_l = u.volume == tw::units::VolumeUnit::UsGallon ? tw::units::us_gallons_to_litres(100) : 100.0;
  const std::string vol_text = fmtx::volume_text(vol_l, u.volume);
  const add::LitreChange ch = add::change_per_litre(s.per_ml, vol_l);
  std::string effect = "1 mL in " + vol_text + " raises";
  bool any = false;
  if (ch.alkalinity_dkh != 0) {
    effect += " alkalinity by " + fmtx::fixed(fmtx::alkalinity_from_dkh(ch.alkalinity_dkh, u.alkalinity), rise_decimals(app, 0) + 1) +
              " " + fmtx::alkalinity_shown(u.alkalinity).unit;
    any = true;
  }
  if (ch.calcium_mg_l != 0) {
    effect += std::string(any ? "," : "") + " calcium by " +
              fmtx::fixed(ion_shown(ch.calcium_mg_l, u.calcium_magnesium, tw::units::Ion::Calcium), rise_decimals(app, 1) + 1) +
              " " + tw::units::to_string(u.calcium_magnesium);
    any = true;
  }
  if (ch.magnesium_mg_l != 0) {
    effect += std::string(any ? "," : "") + " magnesium by " +
              fmtx::fixed(ion_shown(ch.magnesium_mg_l, u.calcium_magnesium, tw::units::Ion::Magnesium),
                          rise_decimals(app, 2) + 1) +
              " " + tw::units::to_string(u.calcium_magnesium);
    any = true;
  }
  if (any) {
    ui::wrapped((effect + ".").c_str());
    ui::record(app, "mixes.effect");
  }
  (void)f;
  // Saturation bar.
  ui::heading(app, "Solubility check");
  const float e = ui::em(app);
  const float w = ImGui::GetContentRegionAvail().x;
  const ImVec2 p = ImGui::GetCursorScreenPos();
  const float frac = static_cast<float>(std::clamp(s.saturation_fraction, 0.0, 1.0));
  const ImU32 col = s.saturation_fraction > 0.9 ? theme::kError : s.saturation_fraction > 0.8 ? theme::kWarning : theme::kAccent;
  ImDrawList* d = ImGui::GetWindowDrawList();
  d->AddRectFilled(p, ImVec2(p.x + w, p.y + 1.2f * e), theme::kSurfaceHigh, 0.3f * e);
  d->AddRectFilled(p, ImVec2(p.x + w * frac, p.y + 1.2f * e), col, 0.3f * e);
  d->AddLine(ImVec2(p.x + 0.8f * w, p.y - 0.2f * e), ImVec2(p.x + 0.8f * w, p.y + 1.4f * e), theme::kText, 1.5f);
  ImGui::Dummy(ImVec2(w, 1.5f * e));
  ui::record(app, "mixes.saturation");
  ui::wrapped(("At " + fmtx::fixed(100 * s.saturation_fraction, 0) + "% of saturation at " +
               fmtx::temperature_text(c.key.temperature_c, u.temperature) + ". The mark is at 80%: stronger stocks may "
               "crystallise when the room cools (common practice: stay below about 80%).").c_str());
  for (const std::string& n : s.notes) ui::colored_wrapped(theme::kWarning, ("\u2022 " + n).c_str());
  ui::card_end(app);
}

// ---------------------------------------------------------------- 3. Solubility
void draw_solubility(AppState& app, const MixesCache& c) {
  const auto u = fields::units(app);
  const auto& list = mix_compounds();
  const add::Compound& k = add::compound(list[static_cast<size_t>(std::clamp(c.key.compound, 0, static_cast<int>(list.size()) - 1))]);
  if (c.solubility) {
    ui::dim_text(("Solubility of " + k.formula + " at " + fmtx::temperature_text(c.key.temperature_c, u.temperature) + ": " +
                  fmtx::fixed(c.solubility->g_anhydrous_per_100g_water, 1) + " g (anhydrous) per 100 g water. Source: " +
                  c.solubility->source + (c.solubility->note.empty() ? "" : ". " + c.solubility->note))
                     .c_str());
  } else if (!c.solubility_error.empty()) {
    ui::dim_text(c.solubility_error.c_str());
  }
  if (!k.note.empty()) ui::dim_text(k.note.c_str());
}

}  // namespace

// ---------------------------------------------------------------- 4. The screen
void draw_mixes(AppState& app) {
  MixesForm& f = app.ui.dosing.mixes;
  ui::panes_begin(app);  // wide: the recipe beside what it makes
  ui::heading(app, "Stock solutions");
  int dir = static_cast<int>(f.direction);
  const char* const dirs[] = {"From a recipe", "For an effect"};
  if (ui::choice(app, "mixes.direction", "", &dir, dirs, 2)) f.direction = static_cast<MixDirection>(dir);
  draw_form(app, f);
  ui::panes_next(app);
  refresh_mixes(app);
  const MixesCache& c = app.ui.dosing.mixes_cache;
  if (!c.error.empty()) {
    ui::card_begin(app);
    ui::colored_wrapped(theme::kError, c.error.c_str());
    ui::record(app, "mixes.error");
    ui::card_end(app);
  }
  if (c.strength) draw_strength(app, f, c);
  draw_solubility(app, c);
  if (!c.cautions.empty()) {
    ui::heading(app, "Cautions");
    for (const std::string& line : c.cautions) ui::colored_wrapped(theme::kWarning, ("\u2022 " + line).c_str());
    ui::record(app, "mixes.cautions");
  }
  ui::panes_end(app);
}

}  // namespace twapp
