// Hatchery flow-through buffering: flow units, stock strength within solubility, metering
// pump rates, the point-of-injection estimate, cautions, and the flow plan.
//
// Map of this file
//   1. Flow units
//   2. Compounds: catalog lookups (molar mass, solubility, hazards)
//   3. Stock strength (saturation estimate and default)
//   4. Point-of-injection estimate (local Omega while the stock is still diluting)
//   5. Cautions
//   6. plan_flow
#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "hatchery_internal.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/additives/additives.hpp"
#include "tidewright/hatchery/hatchery.hpp"
#include "tidewright/seawater/seawater.hpp"

namespace tw::hatchery {

namespace cb = tw::carbonate;
namespace ad = tw::additives;

// ================================================================ 1. Flow units
const char* to_string(FlowUnit unit) {
  return unit == FlowUnit::LitrePerMinute ? "L/min" : "m3/h";
}

Result<FlowUnit> flow_unit_from_string(const std::string& text) {
  const std::string t = detail::lower(text);
  if (t == "l/min" || t == "lpm" || t == "l_min") return FlowUnit::LitrePerMinute;
  if (t == "m3/h" || t == "m3h" || t == "m3_h" || t == "cmh") return FlowUnit::CubicMetrePerHour;
  return Error{"flow_unit", "flow_unit '" + text + "' is not known; accepted: L/min, m3/h"};
}

// 1 m3/h = 1000 L / 60 min (exact).
double flow_to_l_per_min(double value, FlowUnit unit) {
  return unit == FlowUnit::LitrePerMinute ? value : value * 1000.0 / 60.0;
}
double flow_from_l_per_min(double l_per_min, FlowUnit unit) {
  return unit == FlowUnit::LitrePerMinute ? l_per_min : l_per_min * 60.0 / 1000.0;
}

// ================================================================ 2. Compounds
namespace detail {

ad::CompoundId catalog_id(Compound c) {
  switch (c) {
    case Compound::SodiumCarbonate: return ad::CompoundId::SodiumCarbonate;
    case Compound::SodiumBicarbonate: return ad::CompoundId::SodiumBicarbonate;
    case Compound::SodiumHydroxide: return ad::CompoundId::SodiumHydroxide;
  }
  return ad::CompoundId::SodiumCarbonate;
}

double molar_mass_g_mol(Compound c) { return ad::compound(catalog_id(c)).molar_mass_g_mol(); }

std::vector<std::pair<Compound, double>> components(const DoseMix& d) {
  std::vector<std::pair<Compound, double>> out;
  if (d.carbonate_umol_kg > 0) out.emplace_back(Compound::SodiumCarbonate, d.carbonate_umol_kg);
  if (d.bicarbonate_umol_kg > 0) out.emplace_back(Compound::SodiumBicarbonate, d.bicarbonate_umol_kg);
  if (d.hydroxide_umol_kg > 0) out.emplace_back(Compound::SodiumHydroxide, d.hydroxide_umol_kg);
  return out;
}

std::vector<Compound> compounds_of(Buffer b) {
  switch (b) {
    case Buffer::SodiumCarbonate: return {Compound::SodiumCarbonate};
    case Buffer::SodiumBicarbonate: return {Compound::SodiumBicarbonate};
    case Buffer::SodiumHydroxide: return {Compound::SodiumHydroxide};
    case Buffer::Blend: return {Compound::SodiumCarbonate, Compound::SodiumBicarbonate};
  }
  return {};
}

}  // namespace detail

// ================================================================ 3. Stock strength
namespace {

// Default sodium hydroxide stock: a 1 mol/L solution (40 g/L, about 4 % by mass), our choice,
// so that a metering-pump stock stays out of the Skin Corr. 1A band (>= 5 %, facts.md 11;
// band from memory: unverified). Stronger stocks are accepted up to saturation, with a warning.
constexpr double kHydroxideDefaultGPerL = 40.0;
constexpr double kHydroxideCorrosiveGPerL = 50.0;  // about 5 % by mass

bool fits(ad::CompoundId id, double g_per_l, double temperature_c) {
  ad::StockRecipe r;
  r.name = "hatchery stock";
  r.ingredients = {ad::Ingredient{id, g_per_l}};
  r.temperature_c = temperature_c;
  auto s = ad::stock_strength(r);
  return s.ok() && s->saturation_fraction <= 1.0;
}

}  // namespace

// The additive catalog's stock check (solid taking its crystal volume in the finished litre)
// decides; the strength where it reaches saturation is found by bisection, 1e-3 g/L.
Result<double> stock_saturation_g_per_l(Compound compound, double temperature_c) {
  if (auto r = ranges::check("stock_temperature_c", temperature_c, ranges::kStockTemperatureC); !r) return r.error();
  const ad::CompoundId id = detail::catalog_id(compound);
  // The catalog tabulates NaOH only to 25 C (from memory); it is more soluble when warmer, so
  // the 25 C value is used above 25 C (the safe side).
  if (compound == Compound::SodiumHydroxide) temperature_c = std::min(temperature_c, 25.0);
  auto sol = ad::solubility_at(ad::compound(id), temperature_c);
  if (!sol) return sol.error();
  double lo = 0.0, hi = 10.0 * sol->g_anhydrous_per_100g_water + 1.0;  // g/L <= 10 x g/100 g
  if (!fits(id, 1e-3, temperature_c)) {
    return Error{"stock_temperature_c", fmt::format("no stock of {} fits at {:g} C", to_string(compound), temperature_c)};
  }
  for (int i = 0; i < 100 && hi - lo > 1e-3; ++i) {
    const double mid = 0.5 * (lo + hi);
    (fits(id, mid, temperature_c) ? lo : hi) = mid;
  }
  return lo;
}

Result<double> stock_strength_g_per_l(Compound compound, const StockOptions& stock) {
  auto sat = stock_saturation_g_per_l(compound, stock.temperature_c);
  if (!sat) return sat.error();
  if (stock.strength_g_per_l) {
    if (auto r = check_range("stock_g_per_l", *stock.strength_g_per_l, 0.1, *sat, "g/L"); !r) {
      Error e = r.error();
      e.message += fmt::format(" (saturation of {} at {:g} C)", to_string(compound), stock.temperature_c);
      return e;
    }
    return *stock.strength_g_per_l;
  }
  if (auto r = check_range("stock_fraction_of_saturation", stock.fraction_of_saturation, 0.05, 1.0, ""); !r)
    return r.error();
  if (compound == Compound::SodiumHydroxide) return std::min(kHydroxideDefaultGPerL, stock.fraction_of_saturation * *sat);
  // Carbonate solubility falls steeply in the cold (facts.md 6: 21.8 g/100 g at 20 C, 12.2 at
  // 10 C), so the default also stays under 95 % of saturation 5 C colder than the stock room
  // (our margin, common practice: no single source).
  double strength = stock.fraction_of_saturation * *sat;
  if (stock.temperature_c >= 5.0) {
    auto colder = stock_saturation_g_per_l(compound, stock.temperature_c - 5.0);
    if (colder) strength = std::min(strength, 0.95 * *colder);
  }
  return strength;
}

// ================================================================ 4. Point of injection
namespace detail {

// Omega aragonite of a parcel that is one volume of stock in (1 + dilution) volumes, where
// `dilution` is the volumes of intake water per volume of stock. Seawater and stock mix by
// mass (stock density taken as 1 kg/L, a few percent low for these stocks); salinity (and
// with it Ca, B, SO4, F) dilutes with the seawater; the sodium of the stock is not counted
// in the constants. A rough local estimate, not a published model.
Result<double> local_omega(const Line& line, const Water& water, Compound c, double stock_g_per_l,
                           double dilution) {
  const double rho_sw = seawater::density_kg_per_l(water.salinity, water.temperature_c);
  const double mass_sw = dilution * rho_sw, mass = mass_sw + 1.0;  // kg per (1 L stock)
  const double mol = stock_g_per_l / molar_mass_g_mol(c);          // mol per L of stock
  const ad::ChemicalChange per = ad::compound(catalog_id(c)).per_mole;
  const double ta = (mass_sw * line.intake.alkalinity_umol_kg + mol * per.alkalinity_eq * 1e6) / mass;
  const double dic = (mass_sw * line.intake.dic_umol_kg + mol * per.dic_mol * 1e6) / mass;
  cb::Conditions cond = line.constants.conditions;
  cond.salinity = water.salinity * mass_sw / mass;
  auto k = cb::compute_constants(cond);
  if (!k) return k.error();
  auto s = cb::solve_alkalinity_dic(*k, ta, dic);
  if (!s) return s.error();
  return s->omega_aragonite;
}

// Smallest dilution (water : stock by volume) at which the local Omega ar is at or below
// `ceiling`, by bisection on log(dilution) between 1 and the full-mixing dilution. 0 when
// even a 1:1 mix stays below; `full` itself when full mixing is above (caller warns).
Result<double> dilution_needed(const Line& line, const Water& water, Compound c,
                               double stock_g_per_l, double full, double ceiling) {
  auto at_full = local_omega(line, water, c, stock_g_per_l, full);
  if (!at_full) return at_full.error();
  if (*at_full > ceiling) return full;
  auto at_one = local_omega(line, water, c, stock_g_per_l, 1.0);
  if (at_one && *at_one <= ceiling) return 0.0;
  double lo = 0.0, hi = std::log(full);
  for (int i = 0; i < 60 && hi - lo > 1e-4; ++i) {
    const double mid = 0.5 * (lo + hi);
    auto om = local_omega(line, water, c, stock_g_per_l, std::exp(mid));
    (om && *om <= ceiling ? hi : lo) = mid;
  }
  return std::exp(hi);
}

}  // namespace detail

// ================================================================ 5. Cautions
std::vector<std::string> cautions_for(const std::vector<Compound>& compounds) {
  std::vector<std::string> out;
  for (Compound c : compounds) {
    const ad::Compound& k = ad::compound(detail::catalog_id(c));
    std::string hazards;
    for (const std::string& h : k.hazard_statements) hazards += (hazards.empty() ? "" : "; ") + h;
    // GHS classes (facts.md 11): NaOH Skin Corr. 1A (EU CLP Annex VI); Na2CO3 Eye Irrit. 2
    // (ILO ICSC 1135); NaHCO3 usually not classified (from memory: unverified).
    const char* ghs_class = c == Compound::SodiumHydroxide   ? "Skin Corr. 1A, Eye Dam. 1 - "
                            : c == Compound::SodiumCarbonate ? "Eye Irrit. 2 - "
                                                             : "";
    if (!k.signal_word.empty() || !hazards.empty()) {
      out.push_back(fmt::format("{} ({}): {}{}{}{}{}", to_string(c), formula_of(c), k.signal_word,
                                k.signal_word.empty() ? "" : ", ", ghs_class, hazards,
                                k.hazard_source.empty() ? "" : " [" + k.hazard_source + "]"));
    }
    if (c == Compound::SodiumHydroxide) {
      out.push_back("NaOH is caustic: face shield or goggles, gloves and apron when making or refilling the "
                    "stock; keep an eyewash at hand; pump lines and fittings rated for strong bases (common practice)");
    }
    for (const std::string& line : k.cautions) out.push_back(fmt::format("{}: {}", formula_of(c), line));
  }
  out.push_back("Food-production hatcheries: these figures are estimates from a carbonate model; follow "
                "your local regulations and licensed practice for treating culture water, and confirm "
                "pH and alkalinity by measurement after any change.");
  return out;
}

// ================================================================ 6. plan_flow
Result<FlowPlan> plan_flow(const Water& intake, double flow_l_per_min, const Settings& s) {
  if (auto r = ranges::check("flow", flow_l_per_min, ranges::kIntakeFlowLPerMin); !r) return r.error();
  auto treatment = plan_treatment(intake, s);
  if (!treatment) return treatment.error();
  auto line = detail::solve_intake(intake);
  if (!line) return line.error();

  FlowPlan plan;
  plan.flow_l_per_min = flow_l_per_min;
  plan.treatment = std::move(treatment).value();
  plan.warnings = plan.treatment.warnings;
  plan.cautions = cautions_for(detail::compounds_of(s.buffer));
  const double rho = seawater::density_kg_per_l(intake.salinity, intake.temperature_c);
  const double kg_per_min = flow_l_per_min * rho;
  const double ceiling = s.limits.mixing_omega_ceiling;

  if (!plan.treatment.dose_needed) {
    plan.warnings.push_back(fmt::format("the intake already meets {}: no dose needed",
                                        detail::describe_target(s.target)));
  }
  for (const auto& [c, umol] : detail::components(plan.treatment.dose)) {
    StockLine sl;
    sl.compound = c;
    sl.umol_per_kg = umol;
    sl.grams_per_hour = umol * 1e-6 * detail::molar_mass_g_mol(c) * kg_per_min * 60.0;
    sl.grams_per_day = sl.grams_per_hour * 24.0;
    auto sat = stock_saturation_g_per_l(c, s.stock.temperature_c);
    if (!sat) return sat.error();
    auto strength = stock_strength_g_per_l(c, s.stock);
    if (!strength) return strength.error();
    sl.saturation_g_per_l = *sat;
    sl.stock_g_per_l = *strength;
    sl.pump_ml_per_min = sl.grams_per_hour / 60.0 / sl.stock_g_per_l * 1000.0;
    sl.stock_litres_per_day = sl.pump_ml_per_min * 1440.0 / 1000.0;
    sl.full_mixing_dilution = flow_l_per_min * 1000.0 / sl.pump_ml_per_min;
    auto need = detail::dilution_needed(*line, intake, c, sl.stock_g_per_l, sl.full_mixing_dilution, ceiling);
    if (!need) return need.error();
    sl.injection_dilution_needed = *need;
    if (*need > 0.0) {
      plan.warnings.push_back(fmt::format(
          "point of injection: the {} stock ({:.0f} g/L) stays above Omega ar {:.1f} until diluted "
          "about {:.0f}:1 in the water (full mixing {:.0f}:1); inject into fast, turbulent flow away "
          "from surfaces (precipitation on particles above Omega ar 5-7, Moras et al. 2022)",
          formula_of(c), sl.stock_g_per_l, ceiling, *need, sl.full_mixing_dilution));
    }
    if (c != Compound::SodiumHydroxide && s.stock.temperature_c >= 5.0) {
      auto colder = stock_saturation_g_per_l(c, s.stock.temperature_c - 5.0);
      if (colder && *colder < sl.stock_g_per_l) {
        plan.warnings.push_back(fmt::format(
            "{} stock at {:.0f} g/L would crystallise if it cooled to {:.0f} C (saturation {:.0f} g/L "
            "there): keep it at {:.0f} C or make it weaker", formula_of(c), sl.stock_g_per_l,
            s.stock.temperature_c - 5.0, *colder, s.stock.temperature_c));
      }
    }
    if (c == Compound::SodiumHydroxide && sl.stock_g_per_l >= kHydroxideCorrosiveGPerL) {
      plan.warnings.push_back(fmt::format("NaOH stock {:.0f} g/L is about {:.0f} % by mass: Skin Corr. 1A "
                                          "(H314, >= 5 %); a 40 g/L (1 mol/L) stock is safer to meter",
                                          sl.stock_g_per_l, sl.stock_g_per_l / 10.0));
    }
    if (sl.pump_ml_per_min < 0.1) {
      plan.warnings.push_back(fmt::format("{} pump rate {:.3f} mL/min is very low for a metering "
                                          "pump: consider a weaker stock (stock_g_per_l)", formula_of(c), sl.pump_ml_per_min));
    }
    plan.lines.push_back(sl);
  }
  // Hartmann et al. (2023, Biogeosciences 20:781): CO2-equilibrated alkaline additions carry the
  // lowest risk of alkalinity loss below a rise of 2400 umol/kg (about natural seawater TA).
  if (plan.treatment.dose.alkalinity_umol_kg() > 2400.0) {
    plan.warnings.push_back(fmt::format("added alkalinity {:.0f} umol/kg is above 2400 (Hartmann et al. 2023: "
                                        "larger additions risk carbonate loss); check the intake readings",
                                        plan.treatment.dose.alkalinity_umol_kg()));
  }
  const double om_mix = plan.treatment.after_mixing.omega_aragonite;
  if (om_mix > ceiling) {
    plan.warnings.push_back(fmt::format("precipitation risk: Omega ar {:.2f} after mixing is above "
                                        "{:.1f} (Moras et al. 2022 saw no precipitation at about 5, "
                                        "aragonite on particles above 7)", om_mix, ceiling));
  }
  const double ph_mix = plan.treatment.after_mixing.ph_total, ph_tank = plan.treatment.at_tanks.ph_total;
  if (plan.treatment.degassing_fraction > 0.0 && std::fabs(ph_tank - ph_mix) >= 0.01) {
    plan.warnings.push_back(fmt::format("gas exchange on the way moves pH_T from {:.3f} to {:.3f} and "
                                        "Omega ar from {:.2f} to {:.2f} before the tanks", ph_mix, ph_tank,
                                        om_mix, plan.treatment.at_tanks.omega_aragonite));
  }
  return plan;
}

}  // namespace tw::hatchery
