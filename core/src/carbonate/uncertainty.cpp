// Linear uncertainty propagation through the carbonate solver (Orr et al. 2018, Mar. Chem.
// 207:84): each source is nudged both ways, the state re-solved by solve() of carbonate.hpp,
// and the central difference taken as the derivative. See uncertainty.hpp.
//
// Map: 1. the output table  2. range checks  3. sources (how each one is nudged)
//      4. the propagation
#include "tidewright/carbonate/uncertainty.hpp"

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>

#include <fmt/format.h>

namespace tw::carbonate {

// ---------------------------------------------------------------- 1. Outputs
#define TW_OUTPUT(name) OutputField{#name, &CarbonateState::name, &CarbonateOutputs::name}
const std::array<OutputField, 17> kOutputFields = {
    TW_OUTPUT(ph_total),        TW_OUTPUT(ph_sws),         TW_OUTPUT(ph_free),
    TW_OUTPUT(ph_nbs),          TW_OUTPUT(alkalinity_umol_kg), TW_OUTPUT(dic_umol_kg),
    TW_OUTPUT(pco2_uatm),       TW_OUTPUT(fco2_uatm),      TW_OUTPUT(co2_umol_kg),
    TW_OUTPUT(hco3_umol_kg),    TW_OUTPUT(co3_umol_kg),    TW_OUTPUT(borate_umol_kg),
    TW_OUTPUT(hydroxide_umol_kg), TW_OUTPUT(omega_aragonite), TW_OUTPUT(omega_calcite),
    TW_OUTPUT(revelle_factor),  TW_OUTPUT(buffer_capacity_umol_kg)};
#undef TW_OUTPUT

CarbonateOutputs outputs_of(const CarbonateState& state) {
  CarbonateOutputs out;
  for (const auto& f : kOutputFields) out.*f.output = state.*f.state;
  return out;
}

Range range95(double value, double u, double floor) {
  return {std::max(floor, value - kCoverageFactor95 * u), value + kCoverageFactor95 * u};
}

int decimals_for_uncertainty(double u) {
  if (!(u > 0.0) || !std::isfinite(u)) return 6;
  // Metrology's usual rounding of an uncertainty: two significant digits when its first
  // digit is 1 or 2 (0.20 dKH, 0.15), one otherwise (0.05 pH, 0.6) [common practice].
  const int exponent = static_cast<int>(std::floor(std::log10(u)));
  const double leading = u / std::pow(10.0, exponent);
  const int d = -exponent + (leading < 3.0 ? 1 : 0);
  return std::clamp(d, 0, 6);
}

bool taken_as_exact(double value, double u) {
  return !(u > 1e-9 * std::max(std::fabs(value), 1.0));
}

double output_floor(const OutputField& field) {
  const std::string name = field.name;
  if (name.rfind("ph_", 0) == 0) return -std::numeric_limits<double>::infinity();
  return 0.0;
}

// ---------------------------------------------------------------- 2. Range checks
double max_uncertainty(Quantity q, double value) {
  switch (q) {
    case Quantity::PH: return kMaxUncertaintyPh;
    case Quantity::Alkalinity:
    case Quantity::DIC:
    case Quantity::PCO2:
    case Quantity::FCO2:
    case Quantity::Carbonate: return kMaxUncertaintyRelative * value;
  }
  return 0.0;
}

namespace {

Status check_u(const std::string& what, double u, double max, const char* unit) {
  if (u >= 0.0 && u <= max) return Ok{};  // false for NaN
  return Error{"u(" + what + ")",
               fmt::format("the standard uncertainty of {} {:g} {} is outside the accepted range "
                           "0 to {:g} {}",
                           what, u, unit, max, unit)};
}

const char* unit_of(Quantity q) {
  switch (q) {
    case Quantity::PH: return "pH units";
    case Quantity::PCO2:
    case Quantity::FCO2: return "uatm";
    default: return "umol/kg";
  }
}

Status check_all(const Conditions& c, const InputPair& in, const InputUncertainties& u) {
  const Measurement* m[2] = {&in.first, &in.second};
  const double um[2] = {u.first, u.second};
  for (int i = 0; i < 2; ++i)
    if (auto s = check_u(to_string(m[i]->quantity), um[i], max_uncertainty(m[i]->quantity, m[i]->value),
                         unit_of(m[i]->quantity));
        !s)
      return s;
  if (auto s = check_u("ph_scale_conversion", u.ph_scale_conversion, kMaxUncertaintyPh, "pH units"); !s)
    return s;
  if (auto s = check_u("salinity", u.salinity, kMaxUncertaintySalinity, ""); !s) return s;
  if (auto s = check_u("temperature_c", u.temperature_c, kMaxUncertaintyTemperatureC, "C"); !s) return s;
  if (auto s = check_u("calcium_umol_kg", u.calcium_umol_kg,
                       kMaxUncertaintyRelative * c.calcium_umol_kg.value_or(0.0), "umol/kg");
      !s)
    return s;
  if (auto s = check_u("total_boron_umol_kg", u.total_boron_umol_kg,
                       kMaxUncertaintyRelative * c.total_boron_umol_kg.value_or(0.0), "umol/kg");
      !s)
    return s;
  if (auto s = check_u("magnesium_umol_kg", u.magnesium_umol_kg,
                       kMaxUncertaintyRelative * c.magnesium_umol_kg.value_or(0.0), "umol/kg");
      !s)
    return s;
  if (auto s = check_u("phosphate_umol_kg", u.phosphate_umol_kg, kMaxUncertaintyNutrientUmolKg, "umol/kg"); !s)
    return s;
  if (auto s = check_u("silicate_umol_kg", u.silicate_umol_kg, kMaxUncertaintyNutrientUmolKg, "umol/kg"); !s)
    return s;
  if (u.constants) {
    const ConstantUncertainties& k = *u.constants;
    const std::pair<const char*, double> pks[] = {{"pk0", k.pk0}, {"pk1", k.pk1}, {"pk2", k.pk2},
                                                  {"pkb", k.pkb}, {"pkw", k.pkw},
                                                  {"pksp_aragonite", k.pksp_aragonite},
                                                  {"pksp_calcite", k.pksp_calcite}};
    for (const auto& [name, value] : pks)
      if (auto s = check_u(name, value, kMaxUncertaintyConstantPk, "pK units"); !s) return s;
    if (auto s = check_u("boron_relative", k.boron_relative, kMaxUncertaintyBoronRelative, "(fraction)"); !s)
      return s;
  }
  return Ok{};
}

// ---------------------------------------------------------------- 3. Sources
// A source: its name, standard uncertainty, step for the difference, the lowest value the
// nudged quantity may take (minus the step below it gives a one-sided difference), and how a
// nudge of `delta` changes the problem. Nudges either the inputs, the conditions (constants
// recomputed) or the computed constants directly.
struct Problem {
  Conditions conditions;
  InputPair inputs;
  Constants constants;
};
struct Source {
  std::string name;
  double u = 0;
  double step = 0;
  bool one_sided = false;  // the value sits at a bound: forward difference
  std::function<Result<Problem>(Problem, double)> nudge;
};

Result<Problem> recompute(Problem p) {
  auto k = compute_constants(p.conditions);
  if (!k) return k.error();
  p.constants = std::move(k).value();
  return p;
}

// pK up by delta: K times 10^-delta.
double k_nudged(double k, double delta) { return k * std::pow(10.0, -delta); }

std::vector<Source> sources_of(const Problem& base, const InputUncertainties& u) {
  std::vector<Source> out;
  const auto add = [&](std::string name, double uu, double step, bool one_sided,
                       std::function<Result<Problem>(Problem, double)> nudge) {
    if (uu > 0.0) out.push_back({std::move(name), uu, step, one_sided, std::move(nudge)});
  };
  const auto input_step = [](const Measurement& m) {
    return m.quantity == Quantity::PH ? 1e-6 : 1e-6 * std::max(std::fabs(m.value), 1.0);
  };
  const Measurement& a = base.inputs.first;
  const Measurement& b = base.inputs.second;
  add(to_string(a.quantity), u.first, input_step(a), a.value - input_step(a) < 0.0,
      [](Problem p, double d) -> Result<Problem> { p.inputs.first.value += d; return p; });
  add(to_string(b.quantity), u.second, input_step(b), b.value - input_step(b) < 0.0,
      [](Problem p, double d) -> Result<Problem> { p.inputs.second.value += d; return p; });
  const bool has_ph = a.quantity == Quantity::PH || b.quantity == Quantity::PH;
  if (has_ph && base.inputs.ph_scale != PhScale::Total) {
    // The measured pH stays; its conversion to the total scale moves (the offset of its scale).
    add("ph_scale_conversion", u.ph_scale_conversion, 1e-6, false, [](Problem p, double d) -> Result<Problem> {
      switch (p.inputs.ph_scale) {
        case PhScale::Seawater: p.constants.ph_sws_minus_total += d; break;
        case PhScale::Free: p.constants.ph_free_minus_total += d; break;
        case PhScale::NBS: p.constants.ph_nbs_minus_total += d; break;
        case PhScale::Total: break;
      }
      return p;
    });
  }
  add("salinity", u.salinity, 1e-5, false, [](Problem p, double d) {
    p.conditions.salinity += d;
    return recompute(std::move(p));
  });
  add("temperature_c", u.temperature_c, 1e-5, false, [](Problem p, double d) {
    p.conditions.temperature_c += d;
    return recompute(std::move(p));
  });
  // With the Mg/Ca correction on, calcium and magnesium also move the constants: those
  // nudges recompute them. Otherwise calcium enters only the saturation's product.
  const bool corrected = base.conditions.mg_ca_correction;
  if (base.conditions.calcium_umol_kg)
    add("calcium_umol_kg", u.calcium_umol_kg, 1e-6 * std::max(*base.conditions.calcium_umol_kg, 1.0),
        false, [corrected](Problem p, double d) -> Result<Problem> {
          if (corrected) {
            *p.conditions.calcium_umol_kg += d;
            return recompute(std::move(p));
          }
          p.constants.totals.calcium += d * 1e-6;
          return p;
        });
  if (corrected && base.conditions.magnesium_umol_kg)
    add("magnesium_umol_kg", u.magnesium_umol_kg, 1e-6 * std::max(*base.conditions.magnesium_umol_kg, 1.0),
        false, [](Problem p, double d) -> Result<Problem> {
          *p.conditions.magnesium_umol_kg += d;
          return recompute(std::move(p));
        });
  const bool boron_measured = base.conditions.total_boron_umol_kg.has_value();
  if (boron_measured)
    add("total_boron_umol_kg", u.total_boron_umol_kg, 1e-6 * std::max(*base.conditions.total_boron_umol_kg, 1.0),
        false, [](Problem p, double d) -> Result<Problem> {
          p.constants.totals.boron += d * 1e-6;
          return p;
        });
  add("phosphate_umol_kg", u.phosphate_umol_kg, 1e-4, base.conditions.phosphate_umol_kg < 1e-4,
      [](Problem p, double d) -> Result<Problem> {
        p.constants.totals.phosphate += d * 1e-6;
        return p;
      });
  add("silicate_umol_kg", u.silicate_umol_kg, 1e-4, base.conditions.silicate_umol_kg < 1e-4,
      [](Problem p, double d) -> Result<Problem> {
        p.constants.totals.silicate += d * 1e-6;
        return p;
      });
  if (u.constants) {
    const ConstantUncertainties& c = *u.constants;
    using Member = double Constants::*;
    const std::pair<const char*, std::pair<double, Member>> pks[] = {
        {"pk0", {c.pk0, &Constants::k0}},
        {"pk1", {c.pk1, &Constants::k1}},
        {"pk2", {c.pk2, &Constants::k2}},
        {"pkb", {c.pkb, &Constants::kb}},
        {"pkw", {c.pkw, &Constants::kw}},
        {"pksp_aragonite", {c.pksp_aragonite, &Constants::ksp_aragonite}},
        {"pksp_calcite", {c.pksp_calcite, &Constants::ksp_calcite}}};
    for (const auto& [name, spec] : pks) {
      const Member member = spec.second;
      add(name, spec.first, 1e-6, false, [member](Problem p, double d) -> Result<Problem> {
        p.constants.*member = k_nudged(p.constants.*member, d);
        return p;
      });
    }
    // Relative: a nudge d multiplies total boron by (1 + d). The ratio's uncertainty; a
    // measured boron carries its own instead (above).
    if (!boron_measured)
      add("boron_relative", c.boron_relative, 1e-6, false, [](Problem p, double d) -> Result<Problem> {
        p.constants.totals.boron *= 1.0 + d;
        return p;
      });
  }
  return out;
}

Result<CarbonateOutputs> outputs_after(const Problem& base, const Source& s, double delta) {
  auto p = s.nudge(base, delta);
  if (!p) return p.error();
  auto st = solve(p->constants, p->inputs);
  if (!st) return st.error();
  return outputs_of(*st);
}

}  // namespace

// ---------------------------------------------------------------- 4. Propagation
Result<UncertainState> solve_with_uncertainty(const Conditions& conditions, const InputPair& inputs,
                                              const InputUncertainties& uncertainties) {
  auto k = compute_constants(conditions);
  if (!k) return k.error();
  auto st = solve(*k, inputs);
  if (!st) return st.error();
  if (auto s = check_all(conditions, inputs, uncertainties); !s) return s.error();

  const Problem base{conditions, inputs, std::move(k).value()};
  UncertainState out;
  out.state = std::move(st).value();
  const CarbonateOutputs centre = outputs_of(out.state);
  CarbonateOutputs variance;
  for (const Source& s : sources_of(base, uncertainties)) {
    auto up = outputs_after(base, s, s.step);
    Result<CarbonateOutputs> down = centre;
    double span = s.step;
    if (!s.one_sided) {
      down = outputs_after(base, s, -s.step);
      span = 2.0 * s.step;
    }
    if (!up || !down)  // a nudge of a millionth should never fail; say which source did
      return Error{"u(" + s.name + ")",
                   fmt::format("the state could not be re-solved with {} nudged by {:g}: {}", s.name,
                               s.step, (!up ? up.error() : down.error()).message)};
    UncertaintySource src{s.name, s.u, {}, {}};
    for (const auto& f : kOutputFields) {
      const double d = ((*up).*f.output - (*down).*f.output) / span;
      src.derivative.*f.output = d;
      src.contribution.*f.output = std::fabs(d) * s.u;
      variance.*f.output += (d * s.u) * (d * s.u);
    }
    out.sources.push_back(std::move(src));
  }
  for (const auto& f : kOutputFields) out.u.*f.output = std::sqrt(variance.*f.output);
  return out;
}

Result<UncertainState> equilibrate_with_air_with_uncertainty(const Conditions& conditions,
                                                             double alkalinity_umol_kg,
                                                             double air_co2_ppm,
                                                             InputUncertainties uncertainties) {
  auto k = compute_constants(conditions);
  if (!k) return k.error();
  auto state = equilibrate_with_air(*k, alkalinity_umol_kg, air_co2_ppm);  // checks the air's CO2
  if (!state) return state.error();
  uncertainties.second = 0.0;
  return solve_with_uncertainty(conditions,
                                {{Quantity::Alkalinity, alkalinity_umol_kg},
                                 {Quantity::PCO2, air_pco2_uatm(*k, air_co2_ppm)}},
                                uncertainties);
}

}  // namespace tw::carbonate
