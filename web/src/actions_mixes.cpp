// The Mixes screen's results (strength from a recipe, recipe for an effect) and the ion-unit
// helpers the dosing screens share.
#include "actions_dosing.hpp"

#include <algorithm>

#include "tidewright/common/units.hpp"

namespace twapp {

namespace add = tw::additives;

// ---------------------------------------------------------------- Mixes
const std::vector<add::CompoundId>& mix_compounds() {
  static const std::vector<add::CompoundId> list = [] {  // constant table built once, not app state
    std::vector<add::CompoundId> v;
    for (const add::Compound& k : add::catalog()) {
      if (k.phase == add::Phase::Solid) v.push_back(k.id);
    }
    return v;
  }();
  return list;
}

void refresh_mixes(AppState& app) {
  const MixesForm& f = app.ui.dosing.mixes;
  MixesCache& c = app.ui.dosing.mixes_cache;
  if (c.valid && c.key == f) return;
  MixesCache out;
  out.valid = true;
  out.key = f;
  out.computed_count = c.computed_count + 1;
  const auto& list = mix_compounds();
  const add::CompoundId id = list[static_cast<size_t>(std::clamp(f.compound, 0, static_cast<int>(list.size()) - 1))];
  const add::Compound& k = add::compound(id);
  if (f.direction == MixDirection::RecipeToStrength) {
    add::StockRecipe recipe;
    recipe.name = k.name;
    recipe.ingredients.push_back({id, f.grams_per_l});
    recipe.temperature_c = f.temperature_c;
    auto s = add::stock_strength(recipe);
    if (s) {
      out.strength = std::move(s).value();
    } else {
      out.error = s.error().message;
    }
  } else {
    add::TargetEffect t;
    t.parameter = static_cast<add::Parameter>(std::clamp(f.parameter, 0, 2));
    t.rise = f.rise;
    t.dose_ml = f.dose_ml;
    t.tank_volume_l = f.tank_volume_l;
    auto r = add::recipe_for_effect(id, t, f.temperature_c);
    if (r) {
      out.recipe = std::move(r).value();
      out.strength = out.recipe->strength;
    } else {
      out.error = r.error().message;
    }
  }
  auto sol = add::solubility_at(k, f.temperature_c);
  if (sol) {
    out.solubility = std::move(sol).value();
  } else {
    out.solubility_error = sol.error().message;
  }
  out.cautions = add::cautions_for(add::additive_from_compound(id));
  c = std::move(out);
}


// ---------------------------------------------------------------- ion units
double ion_shown(double mg_l, tw::units::ConcentrationUnit unit, tw::units::Ion ion) {
  if (unit == tw::units::ConcentrationUnit::MgPerL) return mg_l;
  const double d = tw::journal::kNominalDensityKgPerL;
  const double umol = tw::units::ion_to_umol_kg(mg_l, tw::units::ConcentrationUnit::MgPerL, ion, d);
  return tw::units::ion_from_umol_kg(umol, unit, ion, d);
}

double ion_from_shown(double value, tw::units::ConcentrationUnit unit, tw::units::Ion ion) {
  if (unit == tw::units::ConcentrationUnit::MgPerL) return value;
  const double d = tw::journal::kNominalDensityKgPerL;
  const double umol = tw::units::ion_to_umol_kg(value, unit, ion, d);
  return tw::units::ion_from_umol_kg(umol, tw::units::ConcentrationUnit::MgPerL, ion, d);
}

int ion_decimals(tw::units::ConcentrationUnit unit) {
  return unit == tw::units::ConcentrationUnit::MmolPerKg ? 2 : 0;
}

}  // namespace twapp
