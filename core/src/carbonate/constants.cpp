// compute_constants: every equilibrium constant at the conditions, the pH-scale ratios, and
// warnings where a formula is used outside its calibration range. The formulas live in
// constants_formulas.cpp; the tables below map each option to its formula.
#include <cmath>
#include <cstddef>
#include <string>

#include <fmt/format.h>

#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/common/ranges.hpp"

namespace tw::carbonate {

const char* to_string(K1K2Option option) {
  switch (option) {
    case K1K2Option::Lueker2000: return "lueker2000";
    case K1K2Option::Millero2010: return "millero2010";
  }
  return "lueker2000";
}
const char* to_string(BoronOption option) {
  switch (option) {
    case BoronOption::Uppstrom1974: return "uppstrom1974";
    case BoronOption::Lee2010: return "lee2010";
  }
  return "uppstrom1974";
}
const char* to_string(FluorideOption option) {
  switch (option) {
    case FluorideOption::PerezFraga1987: return "perezfraga1987";
    case FluorideOption::DicksonRiley1979: return "dicksonriley1979";
  }
  return "perezfraga1987";
}

const char* to_string(ConstantsConvention option) {
  switch (option) {
    case ConstantsConvention::ReferencePackages: return "co2sys";
    case ConstantsConvention::Guide2007: return "guide2007";
  }
  return "co2sys";
}

namespace {

// Finds text (case-insensitive, trimmed) among the to_string names of the options.
template <class Option, std::size_t N>
Result<Option> option_from_string(const std::string& text, const std::string& field,
                                  const Option (&options)[N]) {
  std::string t;
  for (char c : text) {
    if (c == ' ' || c == '\t') continue;
    t += static_cast<char>((c >= 'A' && c <= 'Z') ? c - 'A' + 'a' : c);
  }
  std::string names;
  for (Option o : options) {
    if (t == to_string(o)) return o;
    names += names.empty() ? "" : ", ";
    names += to_string(o);
  }
  return Error{field, fmt::format("{} '{}' is not known; accepted: {}", field, text, names)};
}

}  // namespace

Result<K1K2Option> k1k2_from_string(const std::string& text, const std::string& field) {
  static constexpr K1K2Option all[] = {K1K2Option::Lueker2000, K1K2Option::Millero2010};
  return option_from_string(text, field, all);
}
Result<BoronOption> boron_from_string(const std::string& text, const std::string& field) {
  static constexpr BoronOption all[] = {BoronOption::Uppstrom1974, BoronOption::Lee2010};
  return option_from_string(text, field, all);
}
Result<FluorideOption> fluoride_from_string(const std::string& text, const std::string& field) {
  static constexpr FluorideOption all[] = {FluorideOption::PerezFraga1987,
                                           FluorideOption::DicksonRiley1979};
  return option_from_string(text, field, all);
}
Result<ConstantsConvention> convention_from_string(const std::string& text,
                                                   const std::string& field) {
  static constexpr ConstantsConvention all[] = {ConstantsConvention::ReferencePackages,
                                                ConstantsConvention::Guide2007};
  return option_from_string(text, field, all);
}

namespace {

void warn_if_outside(const ValidityRange& range, double salinity, double temperature_c,
                     std::vector<std::string>& warnings) {
  if (!outside(range, salinity, temperature_c)) return;
  warnings.push_back(fmt::format(
      "salinity {:g} / temperature {:g} C is outside the calibration range of {} for {} "
      "(S {:g} to {:g}, {:g} to {:g} C{}); values are extrapolated",
      salinity, temperature_c, range.source, range.quantity, range.salinity_min,
      range.salinity_max, range.temperature_min_c, range.temperature_max_c,
      range.from_memory ? "; range from memory" : ""));
}

Status check_conditions(const Conditions& c) {
  if (auto s = check_range("salinity", c.salinity, kSalinityMin, kSalinityMax, ""); !s) return s;
  if (auto s = check_range("temperature_c", c.temperature_c, kTemperatureMinC, kTemperatureMaxC, "C");
      !s)
    return s;
  if (c.calcium_umol_kg) {
    if (auto s = check_range("calcium_umol_kg", *c.calcium_umol_kg, 0.0, kCalciumMaxUmolKg, "umol/kg");
        !s)
      return s;
  }
  if (c.total_boron_umol_kg) {
    if (auto s = ranges::check("total_boron_umol_kg", *c.total_boron_umol_kg, ranges::kTotalBoronUmolKg); !s)
      return s;
  }
  if (c.magnesium_umol_kg) {
    if (auto s = ranges::check("magnesium_umol_kg", *c.magnesium_umol_kg, ranges::kMagnesiumUmolKg); !s)
      return s;
  }
  if (auto s = check_range("phosphate_umol_kg", c.phosphate_umol_kg, 0.0, kNutrientMaxUmolKg, "umol/kg");
      !s)
    return s;
  return check_range("silicate_umol_kg", c.silicate_umol_kg, 0.0, kNutrientMaxUmolKg, "umol/kg");
}

// The Mg/Ca correction (Conditions::mg_ca_correction): refused unless magnesium and calcium
// are measured and the water lies inside the MyAMI polynomial's range (carbonate_formulas.hpp
// 6); never extrapolated, never applied without being asked for.
//
// Our choice, beyond the source: the factors applied are the polynomial at the water's Mg and
// Ca divided by the polynomial at modern seawater (same T and S). The full model gives exactly
// 1 for modern seawater; the polynomial alone is up to 9e-4 away from 1 there (computed here
// over 0-40 C, S 30-40), so the division keeps water of natural composition on the
// uncorrected constants and leaves only the composition's effect.
Result<MgCaCorrection> mg_ca_correction_of(const Conditions& c) {
  const char* field = "mg_ca_correction";
  if (!c.magnesium_umol_kg || !c.calcium_umol_kg)
    return Error{field, "mg_ca_correction needs the water's measured magnesium and calcium"};
  if (c.salinity < kMyamiSalinityMin || c.salinity > kMyamiSalinityMax ||
      c.temperature_c < kMyamiTemperatureMinC || c.temperature_c > kMyamiTemperatureMaxC)
    return Error{field, fmt::format("mg_ca_correction holds for salinity {:g} to {:g} and {:g} to {:g} C "
                                    "(the MyAMI polynomial's range, Hain et al. 2015); this water is at "
                                    "salinity {:g}, {:g} C",
                                    kMyamiSalinityMin, kMyamiSalinityMax, kMyamiTemperatureMinC,
                                    kMyamiTemperatureMaxC, c.salinity, c.temperature_c)};
  MgCaCorrection out;
  // umol/kg at the water's salinity -> mol/kg at salinity 35, as the model takes them
  out.magnesium_mol_kg_s35 = *c.magnesium_umol_kg * 1e-6 * 35.0 / c.salinity;
  out.calcium_mol_kg_s35 = *c.calcium_umol_kg * 1e-6 * 35.0 / c.salinity;
  if (out.magnesium_mol_kg_s35 > kMyamiIonMaxMolKg || out.calcium_mol_kg_s35 > kMyamiIonMaxMolKg)
    return Error{field, fmt::format("mg_ca_correction holds for magnesium and calcium up to {:g} mmol/kg each at "
                                    "salinity 35 (the MyAMI polynomial's range); this water has Mg {:.1f} and "
                                    "Ca {:.1f} mmol/kg at salinity 35",
                                    kMyamiIonMaxMolKg * 1000.0, out.magnesium_mol_kg_s35 * 1000.0,
                                    out.calcium_mol_kg_s35 * 1000.0)};
  const MyamiFactors water = myami_factors_polynomial_hain2015(
      c.temperature_c, c.salinity, out.magnesium_mol_kg_s35, out.calcium_mol_kg_s35);
  const MyamiFactors modern = myami_factors_polynomial_hain2015(
      c.temperature_c, c.salinity, kMyamiModernMagnesiumMolKg, kMyamiModernCalciumMolKg);
  MyamiFactors& f = out.factors;
  f.k0 = water.k0 / modern.k0;
  f.k1 = water.k1 / modern.k1;
  f.k2 = water.k2 / modern.k2;
  f.kb = water.kb / modern.kb;
  f.kw = water.kw / modern.kw;
  f.ks = water.ks / modern.ks;
  f.ksp = water.ksp / modern.ksp;
  out.note = fmt::format(
      "Mg/Ca correction of the constants applied (Hain et al. 2015, MyAMI model, polynomial approximation): "
      "Mg {:.1f} and Ca {:.2f} mmol/kg at salinity 35 against seawater's {:.1f} and {:.2f}; K1 x{:.4f}, "
      "K2 x{:.4f}, KB x{:.4f}, KW x{:.4f}, KS x{:.4f}, K0 x{:.4f}, Ksp x{:.4f}; valid for salinity {:g} to {:g}, "
      "{:g} to {:g} C, Mg and Ca up to {:g} mmol/kg, within about 0.25 % of the full model",
      out.magnesium_mol_kg_s35 * 1000.0, out.calcium_mol_kg_s35 * 1000.0, kMyamiModernMagnesiumMolKg * 1000.0,
      kMyamiModernCalciumMolKg * 1000.0, f.k1, f.k2, f.kb, f.kw, f.ks, f.k0, f.ksp, kMyamiSalinityMin,
      kMyamiSalinityMax, kMyamiTemperatureMinC, kMyamiTemperatureMaxC, kMyamiIonMaxMolKg * 1000.0);
  return out;
}

}  // namespace

std::optional<K1K2Suggestion> suggest_k1k2(const Conditions& c) {
  if (c.k1k2 != K1K2Option::Lueker2000) return std::nullopt;
  if (!outside(kRangeLueker2000, c.salinity, c.temperature_c)) return std::nullopt;
  if (outside(kRangeMillero2010, c.salinity, c.temperature_c)) return std::nullopt;
  return K1K2Suggestion{
      K1K2Option::Millero2010,
      fmt::format("salinity {:g} at {:g} C is outside the range of the default K1 K2 set, Lueker et "
                  "al. (2000), S {:g} to {:g} and {:g} to {:g} C; Millero (2010), fitted to real "
                  "seawater and estuarine water over S {:g} to {:g} and {:g} to {:g} C, is the set "
                  "suggested for this water",
                  c.salinity, c.temperature_c, kRangeLueker2000.salinity_min,
                  kRangeLueker2000.salinity_max, kRangeLueker2000.temperature_min_c,
                  kRangeLueker2000.temperature_max_c, kRangeMillero2010.salinity_min,
                  kRangeMillero2010.salinity_max, kRangeMillero2010.temperature_min_c,
                  kRangeMillero2010.temperature_max_c)};
}

Result<Constants> compute_constants(const Conditions& conditions) {
  if (auto ok = check_conditions(conditions); !ok) return ok.error();
  const double s = conditions.salinity, tc = conditions.temperature_c, tk = tc + 273.15;
  Constants k;
  k.conditions = conditions;
  k.totals = compute_totals(conditions);
  k.boron = boron_source(conditions);
  MyamiFactors f;  // all 1 unless the Mg/Ca correction is asked for
  if (conditions.mg_ca_correction) {
    auto correction = mg_ca_correction_of(conditions);
    if (!correction) return correction.error();
    f = correction->factors;
    k.mg_ca_correction = std::move(correction).value();
  }
  auto& w = k.warnings;
  if (k.mg_ca_correction) w.push_back(k.mg_ca_correction->note);

  k.k0 = std::exp(ln_k0_weiss1974(s, tk)) * f.k0;
  warn_if_outside(kRangeWeiss1974, s, tc, w);

  // Bisulfate and fluoride first: they define the pH scales (a corrected KS moves them too,
  // as in the MyAMI model, where the total-scale H+ follows the bisulfate equilibrium).
  k.ks_free = std::exp(ln_ks_free_dickson1990(s, tk)) * f.ks;
  warn_if_outside(kRangeDickson1990S, s, tc, w);
  k.free_to_total = 1.0 + k.totals.sulfate / k.ks_free;
  const bool guide = conditions.convention == ConstantsConvention::Guide2007;
  switch (conditions.fluoride) {
    case FluorideOption::PerezFraga1987:
      if (guide) {  // the Guide reads the fit as total scale
        k.kf = std::exp(ln_kf_total_perez_fraga1987(s, tk));
        k.kf_free = k.kf / k.free_to_total;
      } else {      // CO2SYS-MATLAB v3 and PyCO2SYS read it as free scale
        k.kf_free = std::exp(ln_kf_free_perez_fraga1987(s, tk));
        k.kf = k.kf_free * k.free_to_total;
      }
      warn_if_outside(kRangePerezFraga1987, s, tc, w);
      break;
    case FluorideOption::DicksonRiley1979:
      k.kf_free = std::exp(ln_kf_free_dickson_riley1979(s, tk));
      k.kf = k.kf_free * k.free_to_total;
      warn_if_outside(kRangeDicksonRiley1979, s, tc, w);
      break;
  }
  k.sws_to_total = k.free_to_total / (k.free_to_total + k.totals.fluoride / k.kf_free);
  k.nbs_activity_coefficient = nbs_activity_coefficient_takahashi1982(s, tk);
  warn_if_outside(kRangeTakahashi1982, s, tc, w);
  k.ph_free_minus_total = std::log10(k.free_to_total);
  k.ph_sws_minus_total = std::log10(k.sws_to_total);
  k.ph_nbs_minus_total = k.ph_sws_minus_total - std::log10(k.nbs_activity_coefficient);

  k.calcium = calcium_source(conditions);
  if (k.calcium.low_salinity) w.push_back(k.calcium.note);

  switch (conditions.k1k2) {
    case K1K2Option::Lueker2000:
      k.k1 = std::pow(10.0, -pk1_total_lueker2000(s, tk));
      k.k2 = std::pow(10.0, -pk2_total_lueker2000(s, tk));
      warn_if_outside(kRangeLueker2000, s, tc, w);
      k.k1k2_suggestion = suggest_k1k2(conditions);
      if (k.k1k2_suggestion) w.push_back(k.k1k2_suggestion->reason);
      break;
    case K1K2Option::Millero2010: {
      const PkPair pk = k1_k2_sws_millero2010(s, tk);  // seawater scale -> total scale
      k.k1 = std::pow(10.0, -pk.pk1) * k.sws_to_total;
      k.k2 = std::pow(10.0, -pk.pk2) * k.sws_to_total;
      warn_if_outside(kRangeMillero2010, s, tc, w);
      break;
    }
  }

  k.k1 *= f.k1;
  k.k2 *= f.k2;

  k.kb = std::exp(ln_kb_total_dickson1990(s, tk)) * f.kb;
  warn_if_outside(kRangeDickson1990B, s, tc, w);
  if (guide) {  // the Guide's total-scale forms
    k.kw = std::exp(ln_kw_total_millero1995(s, tk));
    k.k1p = std::exp(ln_k1p_total_millero1995(s, tk));
    k.k2p = std::exp(ln_k2p_total_millero1995(s, tk));
    k.k3p = std::exp(ln_k3p_total_millero1995(s, tk));
    k.ksi = std::exp(ln_ksi_total_millero1995(s, tk));
  } else {      // seawater-scale fits times the actual factor, as CO2SYS.m and PyCO2SYS do
    k.kw = std::exp(ln_kw_sws_millero1995(s, tk)) * k.sws_to_total;
    k.k1p = std::exp(ln_k1p_sws_yao_millero1995(s, tk)) * k.sws_to_total;
    k.k2p = std::exp(ln_k2p_sws_yao_millero1995(s, tk)) * k.sws_to_total;
    k.k3p = std::exp(ln_k3p_sws_yao_millero1995(s, tk)) * k.sws_to_total;
    k.ksi = std::exp(ln_ksi_sws_yao_millero1995(s, tk)) * k.sws_to_total;
  }
  k.kw *= f.kw;
  warn_if_outside(kRangeMillero1995W, s, tc, w);
  if (k.totals.phosphate > 0 || k.totals.silicate > 0) warn_if_outside(kRangeMillero1995PSi, s, tc, w);
  k.ksp_calcite = std::pow(10.0, log10_ksp_calcite_mucci1983(s, tk)) * f.ksp;
  k.ksp_aragonite = std::pow(10.0, log10_ksp_aragonite_mucci1983(s, tk)) * f.ksp;
  warn_if_outside(kRangeMucci1983, s, tc, w);
  k.fco2_per_pco2 = fugacity_coefficient_co2_weiss1974(tk, 1.0);
  return k;
}

}  // namespace tw::carbonate
