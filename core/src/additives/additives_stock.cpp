// Stock solutions: recipe (g per L of finished solution) -> strength per mL, checked against
// solubility and against mixes that precipitate; the inverse (a recipe for a wanted effect per
// mL); and a user's own product described only by its label claim.
#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "tidewright/common/ranges.hpp"
#include "tidewright/additives/additives.hpp"

namespace tw::additives {

namespace {

// Lowest density of liquid water over 0..45 C is about 0.990 kg/L (from memory: unverified);
// using it, and letting each solid take its crystal volume, under-states the water in the
// finished litre, so the solubility check errs toward refusing.
constexpr double kWaterKgPerLConservative = 0.990;

std::string ingredient_field(std::size_t i) { return fmt::format("ingredients[{}].grams_per_l", i); }

struct WaterEstimate {
  double free_water_g = 0;
};

Result<WaterEstimate> estimate_water(const StockRecipe& recipe) {
  double solid_volume_ml = 0, released_water_g = 0;
  for (const auto& ing : recipe.ingredients) {
    const Compound& c = compound(ing.compound);
    solid_volume_ml += ing.grams_per_l / c.crystal_density_g_ml;
    released_water_g += ing.grams_per_l * (1.0 - c.anhydrous_molar_mass_g_mol() / c.molar_mass_g_mol());
  }
  const double water_g = (1000.0 - solid_volume_ml) * kWaterKgPerLConservative + released_water_g;
  if (solid_volume_ml >= 900.0 || water_g <= 0) {
    return Error{"ingredients", fmt::format("the solids take about {:.0f} mL of the litre; no stock that strong "
                                            "can be made (accepted: solids under 900 mL per L)",
                                            solid_volume_ml)};
  }
  return WaterEstimate{water_g};
}

// Mixes that precipitate in the bottle: calcium or magnesium together with carbonate,
// bicarbonate or hydroxide; calcium together with sulfate (gypsum). Calcium hydroxide alone is
// limewater and fine.
Status check_compatible(const StockRecipe& recipe) {
  bool calcium = false, magnesium = false, sulfate = false, base = false;
  std::size_t base_index = 0, sulfate_index = 0;
  for (std::size_t i = 0; i < recipe.ingredients.size(); ++i) {
    const Compound& c = compound(recipe.ingredients[i].compound);
    if (recipe.ingredients[i].grams_per_l <= 0) continue;
    calcium = calcium || c.per_mole.calcium_mol > 0;
    magnesium = magnesium || c.per_mole.magnesium_mol > 0;
    if (c.per_mole.alkalinity_eq > 0 && c.id != CompoundId::CalciumHydroxide) {
      base = true;
      base_index = i;
    }
    if (c.per_mole.sulfate_mol > 0) {
      sulfate = true;
      sulfate_index = i;
    }
  }
  const bool lime = std::any_of(recipe.ingredients.begin(), recipe.ingredients.end(), [](const Ingredient& g) {
    return g.compound == CompoundId::CalciumHydroxide && g.grams_per_l > 0;
  });
  if (lime && recipe.ingredients.size() > 1) {
    return Error{"ingredients", "calcium hydroxide (limewater) must be the only ingredient of its stock: with "
                                "other salts it precipitates or changes strength (accepted: limewater alone)"};
  }
  if ((calcium || magnesium) && base) {
    return Error{ingredient_field(base_index),
                 "calcium or magnesium in the same stock as carbonate, bicarbonate or hydroxide precipitates "
                 "(accepted: keep alkalinity and calcium/magnesium in separate stocks)"};
  }
  if (calcium && sulfate) {
    return Error{ingredient_field(sulfate_index),
                 "calcium and sulfate in one stock precipitate as gypsum (accepted: separate stocks)"};
  }
  return Ok{};
}

}  // namespace

Result<StockStrength> stock_strength(const StockRecipe& recipe) {
  if (recipe.ingredients.empty()) {
    return Error{"ingredients", "a stock needs at least one ingredient (accepted: 1 or more)"};
  }
  if (auto s = ranges::check("temperature_c", recipe.temperature_c, ranges::kStockTemperatureC); !s) return s.error();
  for (std::size_t i = 0; i < recipe.ingredients.size(); ++i) {
    const auto& ing = recipe.ingredients[i];
    if (auto s = ranges::check(ingredient_field(i), ing.grams_per_l, ranges::kStockGPerL); !s) return s.error();
    if (compound(ing.compound).phase == Phase::Gas) {
      return Error{fmt::format("ingredients[{}].compound", i),
                   fmt::format("{} is a gas and cannot be weighed into a stock (accepted: solid compounds)",
                               compound(ing.compound).key)};
    }
  }
  if (auto s = check_compatible(recipe); !s) return s.error();
  auto water = estimate_water(recipe);
  if (!water) return water.error();

  StockStrength out;
  for (std::size_t i = 0; i < recipe.ingredients.size(); ++i) {
    const auto& ing = recipe.ingredients[i];
    const Compound& c = compound(ing.compound);
    auto sol = solubility_at(c, recipe.temperature_c);
    if (!sol) return sol.error();
    const double anhydrous_ratio = c.anhydrous_molar_mass_g_mol() / c.molar_mass_g_mol();
    const double max_anhydrous_g = sol->g_anhydrous_per_100g_water / 100.0 * water->free_water_g;
    double grams = ing.grams_per_l;
    const double fraction = ing.grams_per_l * anhydrous_ratio / max_anhydrous_g;
    if (fraction > 1.0) {
      const double limit_g_l = max_anhydrous_g / anhydrous_ratio;
      if (c.id == CompoundId::CalciumHydroxide) {
        grams = limit_g_l;  // limewater: the excess settles; strength is that of saturation
        out.notes.push_back(fmt::format(
            "calcium hydroxide above saturation at {:g} C: about {:.2f} g/L dissolves, the rest settles; "
            "strength is that of saturated limewater",
            recipe.temperature_c, limit_g_l));
      } else {
        return Error{ingredient_field(i),
                     fmt::format("{} {:g} g/L is over its solubility at {:g} C (accepted: up to about {:.0f} g/L "
                                 "of {} per litre of finished solution; {})",
                                 ingredient_field(i), ing.grams_per_l, recipe.temperature_c, limit_g_l, c.formula,
                                 c.solubility_source)};
      }
    }
    out.saturation_fraction = std::max(out.saturation_fraction, std::min(fraction, 1.0));
    if (fraction > 0.9 && c.id != CompoundId::CalciumHydroxide) {
      out.notes.push_back(fmt::format("{} is at {:.0f} % of saturation: it may crystallise if the stock cools",
                                      c.formula, 100 * fraction));
    }
    if (!sol->note.empty()) out.notes.push_back(c.formula + " solubility: " + sol->note);
    out.per_ml += c.per_mole.scaled(grams / c.molar_mass_g_mol() / 1000.0);
    out.caustic = out.caustic || c.caustic;
  }
  out.alkalinity_meq_per_ml = out.per_ml.alkalinity_eq * 1000.0;
  out.dic_mmol_per_ml = out.per_ml.dic_mol * 1000.0;
  out.calcium_mg_per_ml = out.per_ml.calcium_mol * 1000.0 * atomic_weight_iupac(Element::Ca);
  out.magnesium_mg_per_ml = out.per_ml.magnesium_mol * 1000.0 * atomic_weight_iupac(Element::Mg);
  return out;
}

Result<RecipeForEffect> recipe_for_effect(CompoundId id, const TargetEffect& target, double temperature_c) {
  if (!is_dosed(target.parameter)) return Error{"parameter", "only alkalinity, calcium and magnesium are dosed"};
  if (auto s = ranges::check("rise", target.rise, ranges::of_rise(target.parameter)); !s) return s.error();
  if (auto s = ranges::check("dose_ml", target.dose_ml, ranges::kMixDoseMl); !s) return s.error();
  if (auto s = ranges::check("tank_volume_l", target.tank_volume_l, ranges::kSystemVolumeL); !s) return s.error();
  // Grams of compound per dose = grams for the rise in the tank; per litre of stock = /dose_ml*1000.
  auto grams = grams_for_rise(id, target.parameter, target.rise, target.tank_volume_l);
  if (!grams) return grams.error();
  const double grams_per_l = *grams / target.dose_ml * 1000.0;
  StockRecipe recipe{compound(id).key, {{id, grams_per_l}}, temperature_c};
  auto strength = stock_strength(recipe);
  // Limewater never exceeds saturation, so a capped strength means the target is out of reach.
  const bool capped = strength && rise_of(target.parameter, strength->per_ml.scaled(target.dose_ml),
                                          target.tank_volume_l) < target.rise * (1.0 - 1e-9);
  if (!strength || capped) {
    if (!strength && strength.error().field != "ingredients[0].grams_per_l") return strength.error();
    // Largest recipe that passes: bisection on grams per litre.
    double lo = 0.0, hi = grams_per_l;
    for (int i = 0; i < 60; ++i) {
      const double mid = 0.5 * (lo + hi);
      auto s = stock_strength(StockRecipe{"", {{id, mid}}, temperature_c});
      const bool ok = s && s->saturation_fraction < 1.0;
      (ok ? lo : hi) = mid;
    }
    const double max_rise = target.rise * lo / grams_per_l;
    return Error{"rise", fmt::format("rise {:g} {} per {:g} mL in {:g} L needs {:.0f} g/L of {}, over its solubility "
                                     "at {:g} C (accepted: rise up to {:.3g} {} for that dose, or a larger dose)",
                                     target.rise, parameter_unit(target.parameter), target.dose_ml, target.tank_volume_l,
                                     grams_per_l, compound(id).formula, temperature_c, max_rise,
                                     parameter_unit(target.parameter))};
  }
  return RecipeForEffect{id, grams_per_l, *strength};
}

Result<double> max_stock_g_per_l(CompoundId id, double temperature_c) {
  const Compound& c = compound(id);
  if (id == CompoundId::CalciumHydroxide || c.phase == Phase::Gas) {
    return Error{"compound", fmt::format("{} has no stock strength limit to type (accepted: a dissolvable solid)", c.key)};
  }
  if (auto s = ranges::check("temperature_c", temperature_c, ranges::kStockTemperatureC); !s) return s.error();
  if (auto sol = solubility_at(c, temperature_c); !sol) return sol.error();
  const auto passes = [&](double g) { return stock_strength(StockRecipe{"", {{id, g}}, temperature_c}).ok(); };
  double lo = 0.0, hi = ranges::kStockGPerL.hi;
  if (passes(hi)) return hi;
  while (hi - lo > 0.005) {
    const double mid = 0.5 * (lo + hi);
    (passes(mid) ? lo : hi) = mid;
  }
  return std::floor(lo * 100.0) / 100.0;  // down to the 0.01 g/L: the value itself passes
}

// A label claim fixes the strength per mL of the claimed parameter; the rest of the chemistry
// is assumed: alkalinity products are sodium salts with the given DIC per equivalent, calcium
// and magnesium products are chlorides. The notes say so.
Result<StockStrength> strength_from_label(const LabelClaim& claim) {
  if (auto s = ranges::check("dose_ml", claim.dose_ml, ranges::kMixDoseMl); !s) return s.error();
  if (auto s = ranges::check("tank_volume_l", claim.tank_volume_l, ranges::kSystemVolumeL); !s) return s.error();
  if (!is_dosed(claim.parameter)) return Error{"parameter", "only alkalinity, calcium and magnesium are dosed"};
  if (auto s = ranges::check("rise", claim.rise, ranges::of_rise(claim.parameter)); !s) return s.error();
  if (auto s = check_range("dic_per_alkalinity_eq", claim.dic_per_alkalinity_eq, 0.0, 1.0, "mol/eq"); !s) {
    return s.error();
  }
  const double amount_per_ml = amount_for_rise(claim.parameter, claim.rise, claim.tank_volume_l) / claim.dose_ml;
  StockStrength out;
  switch (claim.parameter) {
    case Parameter::Alkalinity:
      out.per_ml.alkalinity_eq = amount_per_ml;
      out.per_ml.dic_mol = amount_per_ml * claim.dic_per_alkalinity_eq;
      out.per_ml.sodium_mol = amount_per_ml;
      out.notes.push_back(fmt::format(
          "assumed a sodium salt adding {:g} mol DIC per equivalent (1 bicarbonate, 0.5 carbonate, 0 hydroxide)",
          claim.dic_per_alkalinity_eq));
      break;
    case Parameter::Calcium:
      out.per_ml.calcium_mol = amount_per_ml;
      out.per_ml.chloride_mol = 2 * amount_per_ml;
      out.notes.push_back("assumed calcium chloride");
      break;
    case Parameter::Magnesium:
      out.per_ml.magnesium_mol = amount_per_ml;
      out.per_ml.chloride_mol = 2 * amount_per_ml;
      out.notes.push_back("assumed magnesium chloride");
      break;
    default: break;  // not a dosed parameter
  }
  // Stronger than any solution of these salts can be: the label or its entry is wrong.
  const double limit = claim.parameter == Parameter::Alkalinity ? 20e-3 : 10e-3;  // eq or mol per mL
  if (amount_per_ml > limit) {
    return Error{"rise", fmt::format("the label claim means {:.1f} m{} per mL, stronger than any solution of the "
                                     "usual salts (accepted: up to {:g} m{} per mL); check the numbers",
                                     amount_per_ml * 1000, claim.parameter == Parameter::Alkalinity ? "eq" : "mol",
                                     limit * 1000, claim.parameter == Parameter::Alkalinity ? "eq" : "mol")};
  }
  out.caustic = claim.caustic;
  out.alkalinity_meq_per_ml = out.per_ml.alkalinity_eq * 1000.0;
  out.dic_mmol_per_ml = out.per_ml.dic_mol * 1000.0;
  out.calcium_mg_per_ml = out.per_ml.calcium_mol * 1000.0 * atomic_weight_iupac(Element::Ca);
  out.magnesium_mg_per_ml = out.per_ml.magnesium_mol * 1000.0 * atomic_weight_iupac(Element::Mg);
  return out;
}

}  // namespace tw::additives
