// Tank arithmetic for additives (change per litre of a system, grams for a rise) and the
// Additive that planner and journal dose: per gram of a dry compound, per mL of a stock,
// of limewater or of a labelled product, with the cautions to print beside it.
#include <cmath>

#include <fmt/format.h>

#include "tidewright/common/ranges.hpp"
#include "tidewright/additives/additives.hpp"
#include "tidewright/common/units.hpp"

namespace tw::additives {

const char* to_string(DoseUnit unit) { return unit == DoseUnit::Gram ? "g" : "mL"; }

// Per-litre change in `volume_l` litres. Alkalinity: eq -> meq/L -> dKH with
// 1 dKH = 0.35665 meq/L (facts.md 5). Ions: mol x molar mass -> mg/L.
LitreChange change_per_litre(const ChemicalChange& c, double volume_l) {
  assert(volume_l > 0 && "change_per_litre needs a positive volume");
  const double k = 1000.0 / volume_l;  // mol -> mmol/L
  LitreChange out;
  out.alkalinity_meq_l = c.alkalinity_eq * k;
  out.alkalinity_dkh = out.alkalinity_meq_l / units::kMeqPerLPerDKH;
  out.dic_mmol_l = c.dic_mol * k;
  out.calcium_mg_l = c.calcium_mol * k * atomic_weight_iupac(Element::Ca);
  out.magnesium_mg_l = c.magnesium_mol * k * atomic_weight_iupac(Element::Mg);
  out.sodium_mg_l = c.sodium_mol * k * atomic_weight_iupac(Element::Na);
  out.potassium_mg_l = c.potassium_mol * k * atomic_weight_iupac(Element::K);
  out.chloride_mg_l = c.chloride_mol * k * atomic_weight_iupac(Element::Cl);
  const double so4 = atomic_weight_iupac(Element::S) + 4 * atomic_weight_iupac(Element::O);
  out.sulfate_mg_l = c.sulfate_mol * k * so4;
  return out;
}

double rise_of(Parameter p, const ChemicalChange& c, double volume_l) {
  const LitreChange l = change_per_litre(c, volume_l);
  switch (p) {
    case Parameter::Alkalinity: return l.alkalinity_dkh;
    case Parameter::Calcium: return l.calcium_mg_l;
    case Parameter::Magnesium: return l.magnesium_mg_l;
    default: break;  // not a dosed parameter
  }
  return 0.0;
}

double amount_for_rise(Parameter p, double rise, double volume_l) {
  switch (p) {
    case Parameter::Alkalinity: return rise * units::kMeqPerLPerDKH * volume_l / 1000.0;
    case Parameter::Calcium: return rise * volume_l / 1000.0 / atomic_weight_iupac(Element::Ca);
    case Parameter::Magnesium: return rise * volume_l / 1000.0 / atomic_weight_iupac(Element::Mg);
    default: break;  // not a dosed parameter
  }
  return 0.0;
}

namespace {
double per_mole_of(Parameter p, const ChemicalChange& c) {
  switch (p) {
    case Parameter::Alkalinity: return c.alkalinity_eq;
    case Parameter::Calcium: return c.calcium_mol;
    case Parameter::Magnesium: return c.magnesium_mol;
    default: break;  // not a dosed parameter
  }
  return 0.0;
}
}  // namespace

// Check values (facts.md 5, computed there from IUPAC weights): per 100 L and 1 dKH NaHCO3
// 3.00 g, Na2CO3 1.89 g, NaOH 1.43 g, Ca(OH)2 1.32 g; per 100 L and 10 mg/L Ca CaCl2.2H2O 3.67 g.
Result<double> grams_for_rise(CompoundId id, Parameter p, double rise, double volume_l) {
  if (auto s = ranges::check("volume_l", volume_l, ranges::kSystemVolumeL); !s) return s.error();
  if (!is_dosed(p)) return Error{"parameter", "only alkalinity, calcium and magnesium are dosed"};
  if (auto s = ranges::check("rise", rise, ranges::of_rise(p)); !s) return s.error();
  const Compound& c = compound(id);
  const double per_mole = per_mole_of(p, c.per_mole);
  if (per_mole <= 0) {
    return Error{"compound", fmt::format("{} does not raise {}", c.key, parameter_name(p))};
  }
  return amount_for_rise(p, rise, volume_l) / per_mole * c.molar_mass_g_mol();
}

// ---------------------------------------------------------------- Additive
Additive additive_from_compound(CompoundId id) {
  const Compound& c = compound(id);
  Additive a;
  a.key = c.key;
  a.name = c.name;
  a.unit = DoseUnit::Gram;
  a.per_unit = c.per_mole.scaled(1.0 / c.molar_mass_g_mol());
  a.caustic = c.caustic;
  a.compounds = {id};
  a.origin.compound = id;
  return a;
}

Result<Additive> additive_from_stock(const StockRecipe& recipe) {
  auto strength = stock_strength(recipe);
  if (!strength) return strength.error();
  Additive a;
  a.key = recipe.name.empty() ? "stock" : recipe.name;
  a.name = recipe.name.empty() ? "stock solution" : recipe.name;
  a.unit = DoseUnit::Millilitre;
  a.per_unit = strength->per_ml;
  a.caustic = strength->caustic;
  for (const auto& ing : recipe.ingredients) a.compounds.push_back(ing.compound);
  a.limewater = recipe.ingredients.size() == 1 &&
                recipe.ingredients.front().compound == CompoundId::CalciumHydroxide;
  a.origin.stock = recipe;
  return a;
}

Result<Additive> additive_from_label(const LabelClaim& claim) {
  auto strength = strength_from_label(claim);
  if (!strength) return strength.error();
  Additive a;
  a.key = claim.name.empty() ? "product" : claim.name;
  a.name = claim.name.empty() ? "labelled product" : claim.name;
  a.unit = DoseUnit::Millilitre;
  a.per_unit = strength->per_ml;
  a.caustic = claim.caustic;
  a.origin.label = claim;
  return a;
}

Result<Additive> limewater_additive(double temperature_c, double fraction_of_saturation) {
  if (auto s = check_range("fraction_of_saturation", fraction_of_saturation, 0.01, 1.0, ""); !s) {
    return s.error();
  }
  auto lw = saturated_limewater(temperature_c);
  if (!lw) return lw.error();
  const double mol_per_ml = lw->calcium_hydroxide_mol_per_l / 1000.0 * fraction_of_saturation;
  Additive a;
  a.key = "limewater";
  a.name = fraction_of_saturation < 1.0
               ? fmt::format("Limewater ({:.0f} % of saturation at {:g} C)", 100 * fraction_of_saturation,
                             temperature_c)
               : fmt::format("Limewater (saturated at {:g} C)", temperature_c);
  a.unit = DoseUnit::Millilitre;
  a.per_unit = compound(CompoundId::CalciumHydroxide).per_mole.scaled(mol_per_ml);
  a.caustic = true;
  a.limewater = true;
  a.compounds = {CompoundId::CalciumHydroxide};
  a.origin.limewater = LimewaterSpec{temperature_c, fraction_of_saturation};
  return a;
}

ChemicalChange dose_effect(const Additive& additive, double amount) {
  return additive.per_unit.scaled(amount);
}

std::vector<std::string> cautions_for(const Additive& additive) {
  std::vector<std::string> out;
  for (const CompoundId id : additive.compounds) {
    const Compound& c = compound(id);
    if (!c.signal_word.empty()) {
      std::string line = fmt::format("{}: {}", c.name, c.signal_word);
      for (const auto& h : c.hazard_statements) line += "; " + h;
      out.push_back(line);
    }
    for (const auto& caution : c.cautions) out.push_back(fmt::format("{}: {}", c.name, caution));
  }
  if (additive.caustic) {
    out.push_back(fmt::format(
        "{} is caustic (a strong base): it burns skin and eyes and can kill livestock if dosed too fast. "
        "Follow the supplier's safety data sheet, local codes and licensed practice; this advice does not "
        "replace them.",
        additive.name));
  }
  return out;
}

}  // namespace tw::additives
