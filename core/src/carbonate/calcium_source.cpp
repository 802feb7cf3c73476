// Where the calcium of a saturation state comes from (issue 18): a measured value, or the
// seawater ratio of Riley & Tongudai (1967) scaled by salinity. Saturation (Omega) is
// proportional to calcium, so water whose calcium does not follow salinity gets Omega, and any
// dose to an Omega target, off by the same share. The note says which was used and, for
// low-salinity water, how far the scaled value can be off.
//
// Mixing model (two end-members, conservative mixing of salinity and calcium, the usual first
// look at an estuary): water of salinity S made of a fraction f = S / 35 of seawater at S 35
// and 1 - f of fresh water with calcium Ca_fresh holds
//     Ca = f Ca_sw(35) + (1 - f) Ca_fresh,
// while scaling by salinity gives f Ca_sw(35). The share the scaled value misses is
//     (1 - f) Ca_fresh / (f Ca_sw(35))   [relative to the scaled value].
// Fresh-water calcium: world-average river water about 13.4 mg/kg (Meybeck 1979, Rev. Geol.
// Dyn. Geogr. Phys. 21:215; from memory, unverified); hard-water rivers carry several times
// more, 50 mg/kg taken here as an example (common practice: no single source).
// Check value: S 5 -> f = 0.142857, Ca_sw(35) = 0.02128/40.078 x 35/1.80655 mol/kg = 10.287
// mmol/kg = 412.3 mg/kg, scaled 58.90 mg/kg; with 13.4 mg/kg fresh water the missed share is
// 0.857143 x 13.4 / 58.90 = 19.5 %, with 50 mg/kg 72.8 %.
#include <algorithm>

#include <fmt/format.h>

#include "tidewright/carbonate/carbonate.hpp"

namespace tw::carbonate {

namespace {
constexpr double kCalciumGMol = 40.078;       // IUPAC
constexpr double kRiverCalciumMgKg = 13.4;    // world-average river water (Meybeck 1979, from memory)
constexpr double kHardRiverCalciumMgKg = 50;  // a hard-water river (example, common practice)
constexpr double kLowSalinity = 30;           // below this the note gives the possible error
}  // namespace

double calcium_scaling_missed_share(double salinity, double fresh_calcium_mg_kg) {
  if (salinity <= 0) return 0;
  const double f = std::min(1.0, salinity / 35.0);
  const double scaled_mg_kg = calcium_riley_tongudai1967(salinity) * kCalciumGMol * 1000.0;
  return (1.0 - f) * fresh_calcium_mg_kg / scaled_mg_kg;
}

CalciumSource calcium_source(const Conditions& c) {
  CalciumSource out;
  if (c.calcium_umol_kg) {
    out.measured = true;
    out.calcium_umol_kg = *c.calcium_umol_kg;
    out.note = fmt::format("calcium as measured, {:.0f} umol/kg ({:.1f} mg/kg)", out.calcium_umol_kg,
                           out.calcium_umol_kg * kCalciumGMol / 1000.0);
    return out;
  }
  out.calcium_umol_kg = calcium_riley_tongudai1967(c.salinity) * 1e6;
  out.note = fmt::format("calcium from salinity (seawater ratio, Riley & Tongudai 1967): {:.0f} umol/kg ({:.1f} "
                         "mg/kg); saturation is proportional to it",
                         out.calcium_umol_kg, out.calcium_umol_kg * kCalciumGMol / 1000.0);
  if (c.salinity < kLowSalinity) {
    out.low_salinity = true;
    out.note += fmt::format(
        "; at salinity {:g} water mixed from seawater and river water also carries the river's calcium, so the real "
        "calcium and saturation can be {:.0f} % higher with average river water ({:g} mg/kg, Meybeck 1979) and "
        "{:.0f} % higher with hard fresh water ({:g} mg/kg): measure calcium and enter it",
        c.salinity, 100.0 * calcium_scaling_missed_share(c.salinity, kRiverCalciumMgKg), kRiverCalciumMgKg,
        100.0 * calcium_scaling_missed_share(c.salinity, kHardRiverCalciumMgKg), kHardRiverCalciumMgKg);
  }
  return out;
}

}  // namespace tw::carbonate
