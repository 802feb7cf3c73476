// Where the total boron of the equilibria comes from (issue 18, salt mixes): a measured value,
// or the `boron` option's seawater ratio scaled by salinity (Uppstrom 1974 or Lee et al. 2010,
// carbonate_formulas.hpp 2). Artificial salt mixes need not hold boron in the seawater ratio,
// and borate carries part of the alkalinity (about 100 of 2300 umol/kg at pH_T 8.05), so a
// measured value can move pH, pCO2 and saturation computed from alkalinity. Measured boron is
// used only when given (Conditions::total_boron_umol_kg); the note says which was used.
#include <fmt/format.h>

#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/common/units.hpp"

namespace tw::carbonate {

namespace {
const char* boron_ratio_source(BoronOption option) {
  switch (option) {
    case BoronOption::Uppstrom1974: return "Uppstrom 1974";
    case BoronOption::Lee2010: return "Lee et al. 2010";
  }
  return "Uppstrom 1974";
}
// umol/kg -> mg/kg of boron
double mg_kg(double umol_kg) { return umol_kg * units::kMolarMassB / 1000.0; }
}  // namespace

BoronSource boron_source(const Conditions& c) {
  BoronSource out;
  Conditions scaled = c;  // the option's ratio, through the one option table (composition.cpp)
  scaled.total_boron_umol_kg.reset();
  out.scaled_umol_kg = compute_totals(scaled).boron * 1e6;
  if (c.total_boron_umol_kg) {
    out.measured = true;
    out.boron_umol_kg = *c.total_boron_umol_kg;
    out.note = fmt::format(
        "total boron as measured, {:.0f} umol/kg ({:.2f} mg/kg), in place of {:.0f} umol/kg from salinity "
        "(seawater ratio, {})",
        out.boron_umol_kg, mg_kg(out.boron_umol_kg), out.scaled_umol_kg, boron_ratio_source(c.boron));
    return out;
  }
  out.boron_umol_kg = out.scaled_umol_kg;
  out.note = fmt::format("total boron from salinity (seawater ratio, {}): {:.0f} umol/kg ({:.2f} mg/kg)",
                         boron_ratio_source(c.boron), out.boron_umol_kg, mg_kg(out.boron_umol_kg));
  return out;
}

}  // namespace tw::carbonate
