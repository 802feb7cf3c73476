// Seawater physical properties: practical salinity from what people measure, and density.
// Temperatures are ITS-90 degrees C at this API; the UNESCO (1983) formulas are written in
// IPTS-68 internally (t68 = 1.00024 t90). Pressure in dbar (0 = surface).
#pragma once

#include "tidewright/result.hpp"

namespace tw::seawater {

// Density of seawater, UNESCO EOS-80 (Millero & Poisson 1981; UNESCO 1983 Tech. Pap. 44) [kg/m3].
double density_eos80_kg_m3(double salinity, double temperature_c, double pressure_dbar = 0.0);

// Density in kg/L at the surface, the factor between per-kg and per-litre units.
double density_kg_per_l(double salinity, double temperature_c);

// Pure water density (SMOW, Bigg 1967 as used in EOS-80) [kg/m3].
double pure_water_density_kg_m3(double temperature_c);

// PSS-78 practical salinity from conductivity ratio R = C(S,t,p)/C(35,15,0) (UNESCO 1983).
Result<double> salinity_from_conductivity_ratio(double ratio, double temperature_c,
                                                double pressure_dbar = 0.0);
// PSS-78 inverse: conductivity ratio for a salinity.
Result<double> conductivity_ratio_from_salinity(double salinity, double temperature_c,
                                                double pressure_dbar = 0.0);
// C(35, 15 C IPTS-68, 0) = 42.914 mS/cm (UNESCO 1983).
inline constexpr double kConductivityAtS35T15mS_cm = 42.914;
Result<double> salinity_from_conductivity_ms_cm(double conductivity_ms_cm, double temperature_c);
Result<double> conductivity_ms_cm_from_salinity(double salinity, double temperature_c);

// Specific gravity as read on a refractometer or hydrometer: the density of the sample at
// sample_temperature_c divided by the density of pure water at reference_temperature_c.
// The common hobby convention is 25/25 C (common practice: no single source).
struct SpecificGravityReference {
  double sample_temperature_c = 25.0;
  double reference_temperature_c = 25.0;
};
double specific_gravity_from_salinity(double salinity, const SpecificGravityReference& ref = {});
Result<double> salinity_from_specific_gravity(double specific_gravity,
                                              const SpecificGravityReference& ref = {});
Result<double> salinity_from_density(double density_kg_m3, double temperature_c);

}  // namespace tw::seawater
