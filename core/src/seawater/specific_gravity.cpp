// Salinity from what a hobbyist or hatchery reads on a refractometer or hydrometer (specific
// gravity at stated sample and reference temperatures) and from a measured density, by
// inverting EOS-80 (seawater_density.cpp) with a bracketed solve over salinity 0..42.
//
// Specific gravity here is SG = rho(S, t_sample, 0) / rho_water(t_ref): the sample's density
// at its own temperature over pure water's at the reference temperature, the definition used
// for hydrometers calibrated "t_sample/t_ref" (common practice: no single source). A
// refractometer calibrated in SG reports the same quantity for its stated pair, usually 25/25 C
// for reef use (common practice: no single source).
//   Check (computed here from EOS-80 and SMOW): S 35 at 25/25 C -> SG 1.02637
//   (1023.343 / 997.048, facts.md 4 gives rho(35, 25 C) = 1023.341).
#include <cmath>
#include <string>

#include <fmt/format.h>

#include "seawater_internal.hpp"
#include "tidewright/seawater/seawater.hpp"

namespace tw::seawater {
namespace {

constexpr double kSalinityLo = 0.0;   // EOS-80 range (kEos80Validity)
constexpr double kSalinityHi = 42.0;

Status check_sg_temperatures(const SpecificGravityReference& ref) {
  const ValidityRange& v = kEos80Validity;
  if (auto s = detail::check_range_of("sample_temperature_c", ref.sample_temperature_c,
                                      v.temperature_min_c, v.temperature_max_c, "C", v.source);
      !s)
    return s;
  return detail::check_range_of("reference_temperature_c", ref.reference_temperature_c,
                                kReferenceTemperatureMinC, kReferenceTemperatureMaxC, "C",
                                "pure water density (Bigg 1967)");
}

// Salinity in kSalinityLo..kSalinityHi with f(S) == value, f increasing in S. Values within
// `slack` outside the range (the rounding of the printed bounds) are taken as the bound.
template <class F>
Result<double> invert_over_salinity(F&& f, double value, double slack, const char* field,
                                    const std::string& range_text, const std::string& conditions) {
  const double lo = f(kSalinityLo);
  const double hi = f(kSalinityHi);
  if (!std::isfinite(value) || value < lo - slack || value > hi + slack) {
    const std::string head = std::isfinite(value)
                                 ? fmt::format("{} {:g} is outside the accepted range", field, value)
                                 : fmt::format("{} is not a number; accepted range is", field);
    return Error{field, fmt::format("{} {} {} (practical salinity 0 to 42, {} validity)", head,
                                    range_text, conditions, kEos80Validity.source)};
  }
  if (value <= lo) return kSalinityLo;
  if (value >= hi) return kSalinityHi;
  const detail::RootResult r = detail::solve_bracketed(f, value, kSalinityLo, kSalinityHi);
  if (!r.converged) {
    return Error{field, fmt::format("{} {:g}: the salinity solve did not converge in {} "
                                    "iterations (please report this input)",
                                    field, value, r.iterations)};
  }
  return r.x;
}

}  // namespace

double specific_gravity_from_salinity(double salinity, const SpecificGravityReference& ref) {
  return density_eos80_kg_m3(salinity, ref.sample_temperature_c, 0.0) /
         pure_water_density_kg_m3(ref.reference_temperature_c);
}

Result<double> specific_gravity_checked(double salinity, const SpecificGravityReference& ref) {
  if (auto s = detail::check_range_of("salinity", salinity, kSalinityLo, kSalinityHi, "",
                                      kEos80Validity.source);
      !s)
    return s.error();
  if (auto s = check_sg_temperatures(ref); !s) return s.error();
  return specific_gravity_from_salinity(salinity, ref);
}

Result<double> salinity_from_specific_gravity(double specific_gravity,
                                              const SpecificGravityReference& ref) {
  if (auto s = check_sg_temperatures(ref); !s) return s.error();
  auto f = [&](double s) { return specific_gravity_from_salinity(s, ref); };
  const std::string range =
      fmt::format("{:.5f} to {:.5f}", f(kSalinityLo), f(kSalinityHi));
  const std::string conditions =
      fmt::format("for sample {:g} C / reference {:g} C", ref.sample_temperature_c,
                  ref.reference_temperature_c);
  return invert_over_salinity(f, specific_gravity, 5e-6, "specific_gravity", range, conditions);
}

Result<double> salinity_from_density(double density_kg_m3, double temperature_c,
                                     double pressure_dbar) {
  if (auto s = check_eos80_inputs(kSalinityLo, temperature_c, pressure_dbar); !s) return s.error();
  if (std::isfinite(density_kg_m3) && density_kg_m3 >= 0.9 && density_kg_m3 <= 1.1) {
    return Error{"density_kg_m3",
                 fmt::format("density_kg_m3 {:g} looks like kg/L or g/cm3; give kg/m3 (for "
                             "example {:g})",
                             density_kg_m3, density_kg_m3 * 1000.0)};
  }
  auto f = [&](double s) { return density_eos80_kg_m3(s, temperature_c, pressure_dbar); };
  const std::string range = fmt::format("{:.3f} to {:.3f} kg/m3", f(kSalinityLo), f(kSalinityHi));
  const std::string conditions =
      fmt::format("at {:g} C and {:g} dbar", temperature_c, pressure_dbar);
  return invert_over_salinity(f, density_kg_m3, 5e-4, "density_kg_m3", range, conditions);
}

}  // namespace tw::seawater
