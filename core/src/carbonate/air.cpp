// Equilibrium with air: the water's pCO2 equals that of moist air at 1 atm.
#include "tidewright/carbonate/carbonate.hpp"

namespace tw::carbonate {

// pCO2 = xCO2 (P - pH2O) with P = 1 atm and pH2O over seawater after Weiss & Price (1980)
// (carbonate_formulas.hpp). Check (computed here, facts.md 10): 424.61 ppm at S 35, 25 C
// gives 411.6 uatm.
double air_pco2_uatm(const Constants& constants, double air_co2_ppm) {
  const Conditions& c = constants.conditions;
  const double ph2o =
      water_vapour_pressure_weiss_price1980_atm(c.salinity, c.temperature_c + 273.15);
  return air_co2_ppm * (1.0 - ph2o);  // ppm x atm = uatm
}

Result<CarbonateState> equilibrate_with_air(const Constants& constants, double alkalinity_umol_kg,
                                            double air_co2_ppm) {
  if (auto s = check_range("air_co2_ppm", air_co2_ppm, 1.0, kCo2MaxUatm, "ppm"); !s)
    return s.error();
  return solve(constants, InputPair{{Quantity::Alkalinity, alkalinity_umol_kg},
                                    {Quantity::PCO2, air_pco2_uatm(constants, air_co2_ppm)}});
}

}  // namespace tw::carbonate
