// solve(): from any two of alkalinity, DIC, pH, pCO2/fCO2 and carbonate ion to the full
// state. Validates inputs, maps each pair to a direct formula or to a root finder
// (carbonate_solver.cpp), turns "no root" into a typed Error naming the field, and builds
// the state (carbonate_derived.cpp).
//
// Pairs (unordered) and how they are solved, h = [H+] total, a = carbonate fractions:
//   alk+DIC, alk+pCO2/fCO2, alk+CO3      iterate on h
//   alk+pH    DIC = (TA - noncarbonate)/((HCO3 + 2 CO3)/DIC)
//   DIC+pH    direct
//   DIC+CO2*  (1 - r) h^2 - r K1 h - r K1 K2 = 0, r = CO2*/DIC
//   DIC+CO3   h^2/(K1K2) + h/K2 + 1 - DIC/CO3 = 0 (cancellation-free root)
//   pH+CO2*   DIC = CO2* (1 + K1/h + K1K2/h^2);  pH+CO3  DIC = CO3 (h^2/(K1K2) + h/K2 + 1)
//   CO2*+CO3  h = sqrt(CO2* K1 K2/CO3)
//   pCO2+fCO2 not independent: refused.
#include <cmath>
#include <limits>
#include <utility>

#include <fmt/format.h>

#include "carbonate_internal.hpp"

namespace tw::carbonate {

const char* to_string(Quantity q) {
  switch (q) {
    case Quantity::Alkalinity: return "alkalinity";
    case Quantity::DIC: return "dic";
    case Quantity::PH: return "ph";
    case Quantity::PCO2: return "pco2";
    case Quantity::FCO2: return "fco2";
    case Quantity::Carbonate: return "co3";
  }
  return "?";
}

namespace {

using detail::Root;
using detail::RootStatus;

const char* field_name(Quantity q) {
  switch (q) {
    case Quantity::Alkalinity: return "alkalinity_umol_kg";
    case Quantity::DIC: return "dic_umol_kg";
    case Quantity::PH: return "ph";
    case Quantity::PCO2: return "pco2_uatm";
    case Quantity::FCO2: return "fco2_uatm";
    case Quantity::Carbonate: return "co3_umol_kg";
  }
  return "?";
}

// Accepts 0 < value <= hi (no string is built unless the value is refused).
Status check_positive(const char* field, double value, double hi, const char* unit) {
  if (std::isfinite(value) && value > 0.0 && value <= hi) return Ok{};
  return Error{field, fmt::format("{} {:g} {} is outside the accepted range: above 0 up to {:g} {}",
                                  field, value, unit, hi, unit)};
}
Status check_closed(const char* field, double value, double lo, double hi, const char* unit) {
  if (value >= lo && value <= hi) return Ok{};  // false for NaN
  return check_range(field, value, lo, hi, unit);
}

// The same ranges as check_measurement, without building a Status: the solve path asks this
// first and words the error only for a refused value.
bool measurement_in_range(const Measurement& m) {
  const double v = m.value;  // every comparison below is false for NaN
  switch (m.quantity) {
    case Quantity::Alkalinity: return v >= 0.0 && v <= kAlkalinityMaxUmolKg;
    case Quantity::DIC: return v > 0.0 && v <= kDicMaxUmolKg;
    case Quantity::PH: return v >= kPhMin && v <= kPhMax;
    case Quantity::PCO2:
    case Quantity::FCO2: return v > 0.0 && v <= kCo2MaxUatm;
    case Quantity::Carbonate: return v > 0.0 && v <= kCarbonateMaxUmolKg;
  }
  return false;
}

Status check_measurement(const Measurement& m) {
  switch (m.quantity) {
    case Quantity::Alkalinity:
      return check_closed(field_name(m.quantity), m.value, 0.0, kAlkalinityMaxUmolKg, "umol/kg");
    case Quantity::DIC: return check_positive(field_name(m.quantity), m.value, kDicMaxUmolKg, "umol/kg");
    case Quantity::PH: return check_closed("ph", m.value, kPhMin, kPhMax, "");
    case Quantity::PCO2:
    case Quantity::FCO2: return check_positive(field_name(m.quantity), m.value, kCo2MaxUatm, "uatm");
    case Quantity::Carbonate:
      return check_positive(field_name(m.quantity), m.value, kCarbonateMaxUmolKg, "umol/kg");
  }
  return Error{"inputs", "unknown quantity"};
}

Error root_error(RootStatus status, const std::string& field, const std::string& what) {
  switch (status) {
    case RootStatus::NoRootAboveRange:
      return {field, fmt::format("no state with pH (total scale) between {:g} and {:g} has {}: "
                                 "it would need a pH above {:g}; check the inputs",
                                 kPhMin, kPhMax, what, kPhMax)};
    case RootStatus::NoRootBelowRange:
      return {field, fmt::format("no state with pH (total scale) between {:g} and {:g} has {}: "
                                 "it would need a pH below {:g}; check the inputs",
                                 kPhMin, kPhMax, what, kPhMin)};
    case RootStatus::NotConverged:
    case RootStatus::Ok: break;
  }
  return {"solver", fmt::format("the pH solver did not converge for {}", what)};
}

// h (total) and DIC (mol/kg) of the state, or an Error.
struct Core {
  double h = 0, dic = 0;
  int iterations = 0;
  double other_h = 0;  // alkalinity + CO3 only: h of the second state, if there is one
  double alk_umol_kg = 0, co3_umol_kg = 0;
  // pH_T of h. Taken straight from the input when a pH was given (no log10 of a just-made
  // exp: cheaper, and the input pH comes back exactly), else -log10(h), computed once.
  double ph_total = std::numeric_limits<double>::quiet_NaN();
};

Result<Core> solve_core(const Constants& k, Measurement a, Measurement b, PhScale scale,
                        const SolverOptions& o) {
  if (a.quantity == b.quantity)
    return Error{"inputs", fmt::format("both inputs are {}; give two different quantities",
                                       to_string(a.quantity))};
  if (static_cast<int>(a.quantity) > static_cast<int>(b.quantity)) std::swap(a, b);
  if (a.quantity == Quantity::PCO2 && b.quantity == Quantity::FCO2)
    return Error{"inputs", "pCO2 and fCO2 are not independent (fCO2 = pCO2 x fugacity "
                           "coefficient); pair one of them with alkalinity, DIC, pH or CO3"};
  const auto mol = [](double umol) { return umol * 1e-6; };
  const auto co2_of = [&](const Measurement& m) {
    const double fco2 = m.quantity == Quantity::PCO2 ? m.value * k.fco2_per_pco2 : m.value;
    return k.k0 * fco2 * 1e-6;
  };
  const auto total_of_ph = [&](double ph) { return ph - ph_offset_from_total(k, scale); };
  const auto h_of_ph = [&](double ph) {
    constexpr double kLn10 = 2.302585092994046;  // exp is cheaper than pow(10, x)
    return std::exp(-kLn10 * total_of_ph(ph));
  };
  const double k1k2 = k.k1 * k.k2;
  const Quantity qa = a.quantity, qb = b.quantity;
  const bool b_is_co2 = qb == Quantity::PCO2 || qb == Quantity::FCO2;
  Core c;

  if (qa == Quantity::Alkalinity && qb == Quantity::DIC) {
    const Root r = detail::solve_h_alkalinity_dic(k, mol(a.value), mol(b.value), o);
    if (r.status != RootStatus::Ok)
      return root_error(r.status, "alkalinity_umol_kg",
                        fmt::format("alkalinity_umol_kg {:g} and dic_umol_kg {:g}", a.value, b.value));
    c = {r.h, mol(b.value), r.iterations};
  } else if (qa == Quantity::Alkalinity && qb == Quantity::PH) {
    const double h = h_of_ph(b.value);
    const double nc = detail::noncarbonate_alkalinity(k, h).value;
    const double excess = mol(a.value) - nc;
    if (!(excess > 0.0))
      return Error{"alkalinity_umol_kg",
                   fmt::format("alkalinity_umol_kg {:g} is not above the alkalinity of borate, "
                               "hydroxide and the other non-carbonate bases at pH {:g} ({:.1f} "
                               "umol/kg): no positive DIC fits this pair",
                               a.value, b.value, nc * 1e6)};
    c = {h, excess / detail::carbonate_alkalinity_per_dic(k, h).value, 0};
    c.ph_total = total_of_ph(b.value);
  } else if (qa == Quantity::Alkalinity && b_is_co2) {
    const Root r = detail::solve_h_alkalinity_co2(k, mol(a.value), co2_of(b), o);
    if (r.status != RootStatus::Ok)
      return root_error(r.status, "alkalinity_umol_kg",
                        fmt::format("alkalinity_umol_kg {:g} and {} {:g}", a.value,
                                    field_name(qb), b.value));
    const double co2 = co2_of(b), h = r.h;
    c = {h, co2 * (1.0 + k.k1 / h + k1k2 / (h * h)), r.iterations};
  } else if (qa == Quantity::Alkalinity && qb == Quantity::Carbonate) {
    double other_h = 0.0;
    const Root r = detail::solve_h_alkalinity_co3(k, mol(a.value), mol(b.value), o, &other_h);
    if (r.status == RootStatus::NoRootAboveRange)
      return Error{"alkalinity_umol_kg",
                   fmt::format("alkalinity_umol_kg {:g} is less than the least alkalinity any "
                               "water with co3_umol_kg {:g} can have at pH {:g} to {:g}",
                               a.value, b.value, kPhMin, kPhMax)};
    if (r.status != RootStatus::Ok)
      return root_error(r.status, "alkalinity_umol_kg",
                        fmt::format("alkalinity_umol_kg {:g} and co3_umol_kg {:g}", a.value, b.value));
    const double h = r.h;
    c = {h, mol(b.value) * (h * h / k1k2 + h / k.k2 + 1.0), r.iterations, other_h, a.value,
         b.value};
  } else if (qa == Quantity::DIC && qb == Quantity::PH) {
    c = {h_of_ph(b.value), mol(a.value), 0};
    c.ph_total = total_of_ph(b.value);
  } else if (qa == Quantity::DIC && b_is_co2) {
    const double dic = mol(a.value), r = co2_of(b) / dic;
    if (!(r < 1.0))
      return Error{field_name(qb),
                   fmt::format("{} {:g} means more dissolved CO2 than dic_umol_kg {:g} "
                               "holds: no pH fits this pair",
                               field_name(qb), b.value, a.value)};
    const double h = (r * k.k1 + std::sqrt(r * r * k.k1 * k.k1 + 4.0 * (1.0 - r) * r * k1k2)) /
                     (2.0 * (1.0 - r));
    c = {h, dic, 0};
  } else if (qa == Quantity::DIC && qb == Quantity::Carbonate) {
    const double dic = mol(a.value), co3 = mol(b.value);
    if (!(co3 < dic))
      return Error{"co3_umol_kg", fmt::format("co3_umol_kg {:g} is not less than dic_umol_kg {:g}: "
                                              "no pH fits this pair",
                                              b.value, a.value)};
    // h^2/(K1K2) + h/K2 - (DIC/CO3 - 1) = 0, root written without cancellation.
    const double qa2 = 1.0 / k1k2, qb1 = 1.0 / k.k2, qc = dic / co3 - 1.0;
    c = {2.0 * qc / (qb1 + std::sqrt(qb1 * qb1 + 4.0 * qa2 * qc)), dic, 0};
  } else if (qa == Quantity::PH && b_is_co2) {
    const double h = h_of_ph(a.value);
    c = {h, co2_of(b) * (1.0 + k.k1 / h + k1k2 / (h * h)), 0};
    c.ph_total = total_of_ph(a.value);
  } else if (qa == Quantity::PH && qb == Quantity::Carbonate) {
    const double h = h_of_ph(a.value);
    c = {h, mol(b.value) * (h * h / k1k2 + h / k.k2 + 1.0), 0};
    c.ph_total = total_of_ph(a.value);
  } else {  // CO2* + CO3
    c = {std::sqrt(co2_of(a) * k1k2 / mol(b.value)), 0, 0};
    c.dic = mol(b.value) * (c.h * c.h / k1k2 + c.h / k.k2 + 1.0);
  }

  if (std::isnan(c.ph_total)) c.ph_total = -std::log10(c.h);
  if (qa != Quantity::PH) {  // the pair set the pH: keep it in the solver's domain
    const double ph = c.ph_total;
    if (!(ph >= kPhMin - 1e-9 && ph <= kPhMax + 1e-9))
      return Error{field_name(qb),
                   fmt::format("{} {:g} with {} {:g} gives pH_T {:.2f}, outside the accepted range "
                               "{:g} to {:g}; check the inputs",
                               field_name(qa), a.value, field_name(qb), b.value, ph, kPhMin, kPhMax)};
  }
  if (!(c.dic > 0.0 && c.dic <= kDicMaxUmolKg * 1e-6))
    return Error{field_name(qb),
                 fmt::format("{} {:g} with {} {:g} gives DIC {:.1f} umol/kg, outside the accepted "
                             "range 0 to {:g}; check the inputs",
                             field_name(qa), a.value, field_name(qb), b.value, c.dic * 1e6,
                             kDicMaxUmolKg)};
  return c;
}

Result<CarbonateState> finish(const Constants& k, const Core& c) {
  // One Result, built in place and returned by NRVO (every return names it): the state (about
  // 150 bytes) is never copied, which is a fifth of a solve in WebAssembly.
  Result<CarbonateState> out{std::in_place};
  CarbonateState& st = out.value();
  detail::fill_state(k, c.h, c.ph_total, c.dic, st);
  st.iterations = c.iterations;
  if (!std::isfinite(st.revelle_factor + st.buffer_capacity_umol_kg + st.pco2_uatm +
                     st.alkalinity_umol_kg + st.ph_nbs)) {
    out = Error{"solver", "the carbonate state has a value that is not finite"};
    return out;
  }
  if (!k.warnings.empty()) st.warnings = k.warnings;
  if (c.other_h > 0.0)
    st.warnings.push_back(fmt::format(
        "alkalinity {:g} and CO3 {:g} umol/kg fit two states; the one at pH_T {:.4f} is "
        "returned, the other (hydroxide-dominated) is at pH_T {:.4f}",
        c.alk_umol_kg, c.co3_umol_kg, st.ph_total, -std::log10(c.other_h)));
  return out;
}

}  // namespace

Result<CarbonateState> solve(const Constants& constants, const InputPair& inputs,
                             const SolverOptions& options) {
  if (!measurement_in_range(inputs.first))
    if (auto s = check_measurement(inputs.first); !s) return s.error();
  if (!measurement_in_range(inputs.second))
    if (auto s = check_measurement(inputs.second); !s) return s.error();
  auto core = solve_core(constants, inputs.first, inputs.second, inputs.ph_scale, options);
  if (!core) return core.error();
  return finish(constants, *core);
}

// The common pair without the dispatch (planners call it in inner loops).
Result<CarbonateState> solve_alkalinity_dic(const Constants& constants, double alkalinity_umol_kg,
                                            double dic_umol_kg) {
  const Measurement alk{Quantity::Alkalinity, alkalinity_umol_kg}, dic{Quantity::DIC, dic_umol_kg};
  if (!measurement_in_range(alk))
    if (auto s = check_measurement(alk); !s) return s.error();
  if (!measurement_in_range(dic))
    if (auto s = check_measurement(dic); !s) return s.error();
  const Root r = detail::solve_h_alkalinity_dic(constants, alkalinity_umol_kg * 1e-6,
                                                dic_umol_kg * 1e-6, SolverOptions{});
  if (r.status != RootStatus::Ok)  // the general path words the error
    return solve(constants, InputPair{alk, dic});
  Core core{r.h, dic_umol_kg * 1e-6, r.iterations};
  core.ph_total = -std::log10(r.h);
  return finish(constants, core);
}

}  // namespace tw::carbonate
