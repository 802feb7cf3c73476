// Hatchery dose chemistry shared by the flow-through, batch and table modes.
//
// Map of this file
//   1. Names and parsing of buffers, compounds and targets
//   2. Settings validation
//   3. The treatment chain: intake -> dose (closed system) -> gas exchange on the way
//   4. Dose for a target with one fixed recipe (bisection on added alkalinity)
//   5. Blend: the largest carbonate share that keeps the pH under the ceiling
//   6. plan_treatment / apply_dose
#include <algorithm>
#include <cctype>
#include <cmath>
#include <optional>

#include <fmt/format.h>

#include "tidewright/common/ranges.hpp"
#include "tidewright/hatchery/hatchery.hpp"
#include "hatchery_internal.hpp"

namespace tw::hatchery {

namespace cb = tw::carbonate;

cb::Conditions conditions_of(const Water& water) {
  cb::Conditions c;
  c.salinity = water.salinity;
  c.temperature_c = water.temperature_c;
  c.k1k2 = water.k1k2;
  c.calcium_umol_kg = water.calcium_umol_kg;
  c.total_boron_umol_kg = water.total_boron_umol_kg;
  c.magnesium_umol_kg = water.magnesium_umol_kg;
  c.mg_ca_correction = water.mg_ca_correction;
  return c;
}

// ================================================================ 1. Names
const char* to_string(Buffer buffer) {
  switch (buffer) {
    case Buffer::SodiumCarbonate: return "carbonate";
    case Buffer::SodiumBicarbonate: return "bicarbonate";
    case Buffer::SodiumHydroxide: return "hydroxide";
    case Buffer::Blend: return "blend";
  }
  return "?";
}

Result<Buffer> buffer_from_string(const std::string& text) {
  const std::string t = detail::lower(text);
  if (t == "carbonate" || t == "na2co3" || t == "sodium-carbonate") return Buffer::SodiumCarbonate;
  if (t == "bicarbonate" || t == "nahco3" || t == "sodium-bicarbonate") return Buffer::SodiumBicarbonate;
  if (t == "hydroxide" || t == "naoh" || t == "sodium-hydroxide") return Buffer::SodiumHydroxide;
  if (t == "blend") return Buffer::Blend;
  return Error{"additive", "additive '" + text +
                               "' is not known; accepted: carbonate, bicarbonate, hydroxide, blend"};
}

const char* to_string(Compound compound) {
  switch (compound) {
    case Compound::SodiumCarbonate: return "sodium carbonate";
    case Compound::SodiumBicarbonate: return "sodium bicarbonate";
    case Compound::SodiumHydroxide: return "sodium hydroxide";
  }
  return "?";
}

const char* formula_of(Compound compound) {
  switch (compound) {
    case Compound::SodiumCarbonate: return "Na2CO3";
    case Compound::SodiumBicarbonate: return "NaHCO3";
    case Compound::SodiumHydroxide: return "NaOH";
  }
  return "?";
}

const char* to_string(TargetKind kind) {
  switch (kind) {
    case TargetKind::OmegaAragonite: return "omega_aragonite";
    case TargetKind::PH: return "ph";
    case TargetKind::AlkalinityRise: return "alkalinity_rise";
  }
  return "?";
}

// Per mole of compound (facts.md 5, from the TA definition of Dickson 1981).
double DoseMix::alkalinity_umol_kg() const {
  return 2.0 * carbonate_umol_kg + bicarbonate_umol_kg + hydroxide_umol_kg;
}
double DoseMix::dic_umol_kg() const { return carbonate_umol_kg + bicarbonate_umol_kg; }

// ================================================================ 2. Validation
namespace detail {

std::string lower(std::string s) {
  std::transform(s.begin(), s.end(), s.begin(),
                 [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return s;
}

std::string target_field(TargetKind kind) {
  switch (kind) {
    case TargetKind::OmegaAragonite: return "target_omega";
    case TargetKind::PH: return "target_ph";
    case TargetKind::AlkalinityRise: return "target_alkalinity_rise";
  }
  return "target";
}

std::string describe_target(const Target& t) {
  switch (t.kind) {
    case TargetKind::OmegaAragonite: return fmt::format("Omega ar {:.2f}", t.value);
    case TargetKind::PH: return fmt::format("pH {:.2f} ({} scale)", t.value, cb::to_string(t.ph_scale));
    case TargetKind::AlkalinityRise: return fmt::format("an alkalinity rise of {:.0f} umol/kg", t.value);
  }
  return "?";
}

double ph_on_scale(const cb::CarbonateState& s, cb::PhScale scale) {
  switch (scale) {
    case cb::PhScale::Total: return s.ph_total;
    case cb::PhScale::Seawater: return s.ph_sws;
    case cb::PhScale::Free: return s.ph_free;
    case cb::PhScale::NBS: return s.ph_nbs;
  }
  return s.ph_total;
}

Status validate_settings(const Settings& s) {
  const Target& t = s.target;
  Status st = Ok{};
  switch (t.kind) {
    case TargetKind::OmegaAragonite: st = ranges::check("target_omega", t.value, ranges::kHatcheryTargetOmega); break;
    case TargetKind::PH: st = ranges::check("target_ph", t.value, ranges::kHatcheryTargetPh); break;
    case TargetKind::AlkalinityRise:
      st = check_range("target_alkalinity_rise", t.value, 0.0, kMaxAddedAlkalinityUmolKg, "umol/kg");
      break;
  }
  if (!st) return st;
  if (auto r = ranges::check("ph_ceiling", s.limits.ph_ceiling, ranges::kHatcheryPhCeiling); !r) return r;
  if (auto r = check_range("mixing_omega_ceiling", s.limits.mixing_omega_ceiling, 1.0, 20.0, ""); !r) return r;
  if (auto r = degassing_fraction(s.gas); !r) return r.error();
  if (auto r = ranges::check("air_co2_ppm", s.gas.air_co2_ppm, ranges::kRoomCo2Ppm); !r) return r;
  if (auto r = ranges::check("stock_temperature_c", s.stock.temperature_c, ranges::kStockTemperatureC); !r) return r;
  if (auto r = check_range("stock_fraction_of_saturation", s.stock.fraction_of_saturation, 0.05, 1.0, ""); !r) return r;
  if (s.stock.strength_g_per_l) {
    if (auto r = ranges::check("stock_g_per_l", *s.stock.strength_g_per_l, ranges::kStockGPerL); !r) return r;
    if (!(*s.stock.strength_g_per_l > 0)) {
      return Error{"stock_g_per_l", fmt::format("stock_g_per_l {:g} must be above 0 (accepted: above 0 to {:g} g/L)",
                                                *s.stock.strength_g_per_l, ranges::kStockGPerL.hi)};
    }
  }
  return Ok{};
}

// ================================================================ 3. Treatment chain
Result<Line> solve_intake(const Water& water) {
  auto k = cb::compute_constants(conditions_of(water));
  if (!k) return k.error();
  auto s = cb::solve(*k, water.measurements);
  if (!s) return s.error();
  return Line{std::move(k).value(), std::move(s).value()};
}

Result<Chain> run_chain(const Line& line, const DoseMix& dose, double phi, double air_co2_ppm) {
  const double ta = line.intake.alkalinity_umol_kg + dose.alkalinity_umol_kg();
  const double dic = line.intake.dic_umol_kg + dose.dic_umol_kg();
  auto mixed = cb::solve_alkalinity_dic(line.constants, ta, dic);
  if (!mixed) return mixed.error();
  Chain out{mixed.value(), mixed.value()};
  if (phi > 0.0) {
    // Gas exchange keeps alkalinity and relaxes DIC toward air equilibrium (header, Method).
    auto air = cb::equilibrate_with_air(line.constants, ta, air_co2_ppm);
    if (!air) return air.error();
    const double dic_tank = dic + phi * (air->dic_umol_kg - dic);
    auto tank = cb::solve_alkalinity_dic(line.constants, ta, dic_tank);
    if (!tank) return tank.error();
    out.at_tanks = std::move(tank).value();
  }
  return out;
}

double metric(const Chain& chain, const Settings& s, double intake_alkalinity_umol_kg) {
  const cb::CarbonateState& st =
      s.target_point == TargetPoint::AtTanks ? chain.at_tanks : chain.after_mixing;
  switch (s.target.kind) {
    case TargetKind::OmegaAragonite: return st.omega_aragonite;
    case TargetKind::PH: return ph_on_scale(st, s.target.ph_scale);
    case TargetKind::AlkalinityRise: return st.alkalinity_umol_kg - intake_alkalinity_umol_kg;
  }
  return 0.0;
}

double highest_ph(const Chain& chain, cb::PhScale scale) {
  return std::max(ph_on_scale(chain.after_mixing, scale), ph_on_scale(chain.at_tanks, scale));
}

DoseMix dose_from_recipe(const Recipe& r, double added_alkalinity_umol_kg) {
  DoseMix d;
  d.carbonate_umol_kg = r.carbonate_share * added_alkalinity_umol_kg / 2.0;
  d.bicarbonate_umol_kg = r.bicarbonate_share * added_alkalinity_umol_kg;
  d.hydroxide_umol_kg = r.hydroxide_share * added_alkalinity_umol_kg;
  return d;
}

// ================================================================ 4. Dose for one recipe
// Bisection on the added alkalinity A in [0, kMaxAddedAlkalinityUmolKg] for metric(A) = target.
// Omega and pH rise with A for carbonate and hydroxide, and Omega for bicarbonate; a metric
// that does not reach the target at the upper bound is reported as unreachable.
Result<DoseSearch> dose_for_recipe(const Line& line, const Recipe& recipe, const Settings& s,
                                   double phi) {
  const double ta0 = line.intake.alkalinity_umol_kg;
  DoseSearch out;
  if (s.target.kind == TargetKind::AlkalinityRise) {
    out.dose = dose_from_recipe(recipe, s.target.value);
    auto c = run_chain(line, out.dose, phi, s.gas.air_co2_ppm);
    if (!c) return c.error();
    out.chain = std::move(c).value();
    out.reachable = true;
    out.dose_needed = s.target.value > 0.0;
    return out;
  }
  auto at = [&](double a) { return run_chain(line, dose_from_recipe(recipe, a), phi, s.gas.air_co2_ppm); };
  auto c0 = at(0.0);
  if (!c0) return c0.error();
  if (metric(*c0, s, ta0) >= s.target.value) {
    out.chain = std::move(c0).value();
    out.reachable = true;
    out.dose_needed = false;
    return out;
  }
  double lo = 0.0, hi = kMaxAddedAlkalinityUmolKg;
  auto chi = at(hi);
  if (!chi) return chi.error();
  if (metric(*chi, s, ta0) < s.target.value) {
    out.chain = std::move(chi).value();
    out.reachable = false;
    return out;
  }
  for (int i = 0; i < 200 && hi - lo > 1e-5; ++i) {
    const double mid = 0.5 * (lo + hi);
    auto cm = at(mid);
    if (!cm) return cm.error();
    (metric(*cm, s, ta0) < s.target.value ? lo : hi) = mid;
  }
  out.dose = dose_from_recipe(recipe, hi);
  auto ch = at(hi);
  if (!ch) return ch.error();
  out.chain = std::move(ch).value();
  out.reachable = true;
  return out;
}

// ================================================================ 5. Blend
// Largest carbonate share f in [0,1] (rest bicarbonate) whose dose meets the target with the
// pH at or under the ceiling (method in hatchery.hpp). Without gas exchange the pH at the
// target rises with f; with gas exchange on the way a large bicarbonate dose degasses a lot and
// the curve can turn, so f is first scanned on a grid of 1/20 from f = 1 down, and the
// boundary between the largest feasible grid share and the next one is refined by bisection.
// When no share is feasible the result is the reachable share with the lowest pH (for the
// refusal message).
Result<BlendSearch> blend_for_target(const Line& line, const Settings& s, double phi) {
  const double ceiling = s.limits.ph_ceiling;
  const cb::PhScale scale = s.limits.ph_ceiling_scale;
  auto at = [&](double f) { return dose_for_recipe(line, Recipe{f, 1.0 - f, 0.0}, s, phi); };
  auto feasible = [&](const DoseSearch& d) {
    return d.reachable && (!d.dose_needed || highest_ph(d.chain, scale) <= ceiling);
  };
  constexpr int kGrid = 20;
  std::optional<BlendSearch> lowest;  // reachable, lowest pH
  for (int k = kGrid; k >= 0; --k) {
    const double f = static_cast<double>(k) / kGrid;
    auto d = at(f);
    if (!d) return d.error();
    if (feasible(*d)) {
      if (k == kGrid || !d->dose_needed) return BlendSearch{f, std::move(d).value()};
      double lo = f, hi = static_cast<double>(k + 1) / kGrid;
      for (int i = 0; i < 40 && hi - lo > 1e-6; ++i) {
        const double mid = 0.5 * (lo + hi);
        auto m = at(mid);
        if (!m) return m.error();
        (feasible(*m) ? lo : hi) = mid;
      }
      auto best = at(lo);
      if (!best) return best.error();
      return BlendSearch{lo, std::move(best).value()};
    }
    if (d->reachable && (!lowest || highest_ph(d->chain, scale) < highest_ph(lowest->search.chain, scale))) {
      lowest = BlendSearch{f, std::move(d).value()};
    }
  }
  if (lowest) return *lowest;
  auto none = at(0.0);
  if (!none) return none.error();
  return BlendSearch{0.0, std::move(none).value()};
}

}  // namespace detail

// ================================================================ 6. Public calls
Result<double> degassing_fraction(const GasExchange& gas) {
  if (gas.fraction) {
    if (auto r = check_range("degas_fraction", *gas.fraction, 0.0, 1.0, ""); !r) return r.error();
    return *gas.fraction;
  }
  if (!gas.residence_time_min) return 0.0;
  if (auto r = ranges::check("residence_time_min", *gas.residence_time_min, ranges::kResidenceTimeMin); !r)
    return r.error();
  if (auto r = check_range("exchange_time_constant_min", gas.exchange_time_constant_min, 0.1, 10000.0, "min"); !r)
    return r.error();
  return 1.0 - std::exp(-*gas.residence_time_min / gas.exchange_time_constant_min);
}

namespace {

Treatment make_treatment(const detail::Line& line, const detail::Chain& chain,
                         const DoseMix& dose, double phi) {
  Treatment t;
  t.intake = line.intake;
  t.after_mixing = chain.after_mixing;
  t.at_tanks = chain.at_tanks;
  t.degassing_fraction = phi;
  t.dose = dose;
  t.warnings = line.constants.warnings;
  t.calcium_source = line.constants.calcium.note;
  return t;
}

}  // namespace

Result<Treatment> plan_treatment(const Water& water, const Settings& s) {
  if (auto v = detail::validate_settings(s); !v) return v.error();
  if (s.confidence) return detail::treatment_to_confidence(water, s);
  const double phi = degassing_fraction(s.gas).value();
  auto line = detail::solve_intake(water);
  if (!line) return line.error();
  const double ceiling = s.limits.ph_ceiling;
  const cb::PhScale scale = s.limits.ph_ceiling_scale;
  const std::string what = detail::describe_target(s.target);
  const std::string field = detail::target_field(s.target.kind);

  if (s.target.kind == TargetKind::PH && s.target.ph_scale == scale && s.target.value > ceiling) {
    return Error{"ph_ceiling", fmt::format("target {} is above the pH ceiling {:.2f}; raise ph_ceiling "
                                           "(accepted 7.0 to 9.3) or lower the target", what, ceiling)};
  }
  detail::DoseSearch found;
  double share = 1.0;
  if (s.buffer == Buffer::Blend) {
    auto b = detail::blend_for_target(*line, s, phi);
    if (!b) return b.error();
    found = b->search;
    share = b->carbonate_share;
  } else {
    const detail::Recipe r = s.buffer == Buffer::SodiumCarbonate     ? detail::Recipe{1, 0, 0}
                             : s.buffer == Buffer::SodiumBicarbonate ? detail::Recipe{0, 1, 0}
                                                                     : detail::Recipe{0, 0, 1};
    auto d = detail::dose_for_recipe(*line, r, s, phi);
    if (!d) return d.error();
    found = std::move(d).value();
    share = s.buffer == Buffer::SodiumCarbonate ? 1.0 : 0.0;
  }
  const char* name = s.buffer == Buffer::Blend ? "a carbonate + bicarbonate blend" : to_string(s.buffer);
  if (!found.reachable) {
    return Error{field, fmt::format("{} cannot be reached with {} within {:.0f} umol/kg of added "
                                    "alkalinity; lower {} or choose another additive",
                                    what, name, detail::kMaxAddedAlkalinityUmolKg, field)};
  }
  const double ph_max = detail::highest_ph(found.chain, scale);
  if (found.dose_needed && ph_max > ceiling + 1e-9) {
    const bool at_tanks = detail::ph_on_scale(found.chain.at_tanks, scale) >
                          detail::ph_on_scale(found.chain.after_mixing, scale);
    std::string why;
    if (at_tanks) {
      auto bare = detail::run_chain(*line, DoseMix{}, phi, s.gas.air_co2_ppm);
      if (bare && detail::ph_on_scale(bare->at_tanks, scale) > ceiling) {
        why = fmt::format("; gas exchange alone takes the undosed water to pH {:.3f} at the tanks",
                          detail::ph_on_scale(bare->at_tanks, scale));
      }
    }
    return Error{"ph_ceiling",
                 fmt::format("reaching {} with {} needs pH {:.3f} ({} scale) {}, above the pH ceiling "
                             "{:.2f}{}; raise ph_ceiling (accepted 7.0 to 9.3), lower {}{}",
                             what, name, ph_max, cb::to_string(scale),
                             at_tanks ? "at the tanks" : "after mixing", ceiling, why, field,
                             s.buffer == Buffer::Blend ? "" : ", or use the blend")};
  }
  Treatment t = make_treatment(*line, found.chain, found.dose, phi);
  t.carbonate_share = share;
  t.dose_needed = found.dose_needed;
  if (!found.dose_needed && ph_max > ceiling) {
    t.warnings.push_back(fmt::format("the water is already above the pH ceiling {:.2f} ({} scale) "
                                     "without any dose", ceiling, cb::to_string(scale)));
  }
  return t;
}

Result<Treatment> apply_dose(const Water& water, const DoseMix& dose, const Settings& s) {
  if (auto v = detail::validate_settings(s); !v) return v.error();
  const double phi = degassing_fraction(s.gas).value();
  auto line = detail::solve_intake(water);
  if (!line) return line.error();
  auto chain = detail::run_chain(*line, dose, phi, s.gas.air_co2_ppm);
  if (!chain) return chain.error();
  Treatment t = make_treatment(*line, *chain, dose, phi);
  t.dose_needed = dose.alkalinity_umol_kg() > 0.0;
  const double added = dose.alkalinity_umol_kg();
  t.carbonate_share = added > 0.0 ? 2.0 * dose.carbonate_umol_kg / added : 0.0;
  return t;
}

}  // namespace tw::hatchery
