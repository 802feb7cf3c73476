// Seawater physical properties: practical salinity from what people measure, and density.
//
// Map of this header
//   1. Validity ranges (data attached to the formulas, so callers can say "outside ...")
//   2. Everyday API: ITS-90 degrees C, pressure in dbar (0 = surface), practical salinity
//      - density (EOS-80), pure water density
//      - PSS-78 salinity <-> conductivity ratio and conductivity in mS/cm
//      - specific gravity (refractometer / hydrometer) <-> salinity; density -> salinity
//   3. Published formulas term by term (IPTS-68 temperatures, as printed in UNESCO 1983)
//
// Temperatures are ITS-90 degrees C at the everyday API; the UNESCO (1983) formulas are written
// in IPTS-68 (t68 = 1.00024 t90, Saunders 1990, as used by UNESCO-era codes) and the everyday
// API converts internally. Section 3 takes t68 directly, so the UNESCO tables can be checked
// term by term.
//
// Range policy (chosen here, applies to every Result-returning call below):
//   - inputs outside the validity range of the formula are refused with a tw::Error whose
//     message names the field and the accepted range; no silent extrapolation;
//   - PSS-78 results outside 2 <= S <= 42 are refused too (the scale is defined only there),
//     with the message giving the accepted conductivity range at that temperature;
//   - density and specific-gravity inversions accept salinity 0 to 42 (EOS-80 range), the
//     message gives the accepted density or specific-gravity range at those temperatures.
// The plain `double` functions do no checking: their arguments must lie in the stated range
// (programmer error otherwise, asserted in debug builds). They never return NaN for inputs in
// range.
#pragma once

#include "tidewright/common/result.hpp"

namespace tw::seawater {

// ---------------------------------------------------------------- 1. Validity ranges
struct ValidityRange {
  double salinity_min, salinity_max;            // practical salinity
  double temperature_min_c, temperature_max_c;  // ITS-90 degrees C (the 0.01 C gap to t68 is ignored)
  double pressure_min_dbar, pressure_max_dbar;
  const char* source;
};
// EOS-80: S 0..42, t -2..40 C, p 0..10000 dbar (UNESCO 1983; range from memory: unverified).
inline constexpr ValidityRange kEos80Validity{0.0, 42.0, -2.0, 40.0, 0.0, 10000.0,
                                              "EOS-80 (UNESCO 1983)"};
// PSS-78: S 2..42, t -2..35 C, p 0..10000 dbar (UNESCO 1983; facts.md 4 "from memory:
// unverified" for the salinity bounds; the temperature bounds are from memory too).
inline constexpr ValidityRange kPss78Validity{2.0, 42.0, -2.0, 35.0, 0.0, 10000.0,
                                              "PSS-78 (UNESCO 1983)"};
// Reference temperature of a specific gravity: the pure-water formula's range, 0..40 C.
inline constexpr double kReferenceTemperatureMinC = 0.0;
inline constexpr double kReferenceTemperatureMaxC = 40.0;

// t68 = 1.00024 t90 (Saunders 1990), used to feed the IPTS-68 formulas of UNESCO 1983.
inline constexpr double kIpts68PerIts90 = 1.00024;
inline constexpr double t68_from_t90(double t90_c) { return kIpts68PerIts90 * t90_c; }

// ---------------------------------------------------------------- 2. Everyday API (ITS-90)
// Density of seawater, UNESCO EOS-80 (Millero & Poisson 1981; UNESCO 1983 Tech. Pap. 44) [kg/m3].
// Unchecked: arguments must be inside kEos80Validity (check with check_eos80_inputs).
double density_eos80_kg_m3(double salinity, double temperature_c, double pressure_dbar = 0.0);

// Density in kg/L at the surface, the factor between per-kg and per-litre units.
double density_kg_per_l(double salinity, double temperature_c);

// Pure water density (SMOW, Bigg 1967 as used in EOS-80) [kg/m3]. Unchecked, 0..40 C.
double pure_water_density_kg_m3(double temperature_c);

// Ok when salinity, temperature_c and pressure_dbar are inside kEos80Validity; otherwise the
// error names the first offending field ("salinity", "temperature_c", "pressure_dbar").
Status check_eos80_inputs(double salinity, double temperature_c, double pressure_dbar = 0.0);
// Checked density: check_eos80_inputs, then density_eos80_kg_m3.
Result<double> density_eos80_checked_kg_m3(double salinity, double temperature_c,
                                           double pressure_dbar = 0.0);

// PSS-78 practical salinity from conductivity ratio R = C(S,t,p)/C(35,15,0) (UNESCO 1983).
// Fields in errors: "conductivity_ratio", "temperature_c", "pressure_dbar".
Result<double> salinity_from_conductivity_ratio(double ratio, double temperature_c,
                                                double pressure_dbar = 0.0);
// PSS-78 inverse: conductivity ratio for a salinity (bracketed solve of the forward formula,
// to 1e-12 in R). Fields in errors: "salinity", "temperature_c", "pressure_dbar".
Result<double> conductivity_ratio_from_salinity(double salinity, double temperature_c,
                                                double pressure_dbar = 0.0);
// C(35, 15 C IPTS-68, 0) = 42.914 mS/cm (UNESCO 1983).
inline constexpr double kConductivityAtS35T15mS_cm = 42.914;
// Conductivity in mS/cm at the sample temperature (not compensated to 25 C; a meter that shows
// a temperature-compensated value wants temperature_c = its reference, usually 25 C).
// Field in errors: "conductivity_ms_cm" (plus those above).
Result<double> salinity_from_conductivity_ms_cm(double conductivity_ms_cm, double temperature_c,
                                                double pressure_dbar = 0.0);
Result<double> conductivity_ms_cm_from_salinity(double salinity, double temperature_c,
                                                double pressure_dbar = 0.0);

// Specific gravity as read on a refractometer or hydrometer: the density of the sample at
// sample_temperature_c divided by the density of pure water at reference_temperature_c,
// both at the surface: SG = rho(S, t_sample, 0) / rho_water(t_ref).
// The common hobby convention is 25/25 C (common practice: no single source); older
// hydrometers use 60/60 F (15.56/15.56 C), some lab tables 20/4 C.
struct SpecificGravityReference {
  double sample_temperature_c = 25.0;     // accepted -2..40 C (EOS-80)
  double reference_temperature_c = 25.0;  // accepted 0..40 C (pure water formula)
};
// Unchecked: salinity 0..42 and the temperatures in the ranges above.
double specific_gravity_from_salinity(double salinity, const SpecificGravityReference& ref = {});
// Checked forward. Fields in errors: "salinity", "sample_temperature_c", "reference_temperature_c".
Result<double> specific_gravity_checked(double salinity, const SpecificGravityReference& ref = {});
// Inverse by a bracketed solve over salinity 0..42. The accepted specific gravity range is
// that of salinity 0..42 at the given temperatures (about 1.0000 to 1.0318 at 25/25 C).
// Field in errors: "specific_gravity" (plus the two temperature fields).
Result<double> salinity_from_specific_gravity(double specific_gravity,
                                              const SpecificGravityReference& ref = {});
// Inverse of EOS-80 over salinity 0..42 at the given temperature and pressure.
// Field in errors: "density_kg_m3" (plus "temperature_c", "pressure_dbar"). A value that looks
// like kg/L or g/cm3 (0.9 to 1.1) is refused with a hint to multiply by 1000.
Result<double> salinity_from_density(double density_kg_m3, double temperature_c,
                                     double pressure_dbar = 0.0);

// ---------------------------------------------------------------- 3. Published formulas (t68)
// Each function: UNESCO 1983 (Fofonoff & Millard, Unesco Tech. Pap. Mar. Sci. 44); see the
// comment at its definition for the equation, validity and check value. t68 in IPTS-68 deg C,
// p in dbar (converted to bar inside where the paper uses bar).
namespace eos80 {
double pure_water_density_smow_kg_m3(double t68);                           // rho_w
double density_one_atm_kg_m3(double salinity, double t68);                  // rho(S,t,0)
double secant_bulk_modulus_pure_water_bar(double t68, double pressure_dbar);  // K_w(t,p)
double secant_bulk_modulus_bar(double salinity, double t68, double pressure_dbar);  // K(S,t,p)
double density_kg_m3(double salinity, double t68, double pressure_dbar);    // rho(S,t,p)
}  // namespace eos80

namespace pss78 {
double rt_conductivity_ratio_temperature(double t68);                       // r_t
double rp_conductivity_ratio_pressure(double ratio, double t68, double pressure_dbar);  // R_p
double salinity_from_rt(double rt_ratio, double t68);                       // S(R_t, t)
double salinity_from_ratio(double ratio, double t68, double pressure_dbar);  // S(R, t, p)
}  // namespace pss78

}  // namespace tw::seawater
