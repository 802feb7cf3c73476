// Salinity drift from dosing: the sodium, potassium, chloride and sulfate that additives leave
// in the water once the carbonate and calcium they came with are used up. A plan that ramps the
// levels up doses more on its first days than it does to hold them; averaging those days into
// the weekly water change over-states it (issue 18: 19 %/week in the demo against about 9.5 % at
// steady state). So the water change comes from the holding days alone, and the ramp's extra
// salinity is a one-off figure stated beside it.
//
// Steady state with a weekly change of a fraction f of the water (well mixed, common practice):
// each week the dosing adds 7 r and the change removes f e of an excess e, so e = 7 r / f, and
// holding e at the tolerance T takes f = 7 r / T.
#include <algorithm>
#include <numeric>

#include <fmt/format.h>

#include "tidewright/plan/plan.hpp"

namespace tw::plan {

double salinity_added(const additives::ChemicalChange& c, double mass_kg) {
  // IUPAC atomic weights; SO4 = 32.06 + 4 x 15.999.
  const double grams = c.sodium_mol * 22.990 + c.potassium_mol * 39.098 + c.chloride_mol * 35.45 +
                       c.sulfate_mol * 96.062;
  return grams / mass_kg * 35.0 / 35.16504;
}

SalinityDrift salinity_drift(const std::vector<double>& per_day, int ramp_days, double tolerance) {
  SalinityDrift d;
  const int days = static_cast<int>(per_day.size());
  if (days == 0 || tolerance <= 0) return d;
  d.over_horizon = std::accumulate(per_day.begin(), per_day.end(), 0.0);
  d.per_day = d.over_horizon / days;
  d.ramp_days = std::clamp(ramp_days, 0, days);
  d.holding_seen = d.ramp_days < days;
  if (d.holding_seen) {
    const double holding = std::accumulate(per_day.begin() + d.ramp_days, per_day.end(), 0.0);
    d.holding_per_day = holding / (days - d.ramp_days);
    const double ramp = d.over_horizon - holding;
    d.ramp_extra = std::max(0.0, ramp - d.holding_per_day * d.ramp_days);
  } else {
    d.holding_per_day = d.per_day;  // no holding day in the horizon: the average is all there is
  }
  d.water_change_percent_per_week = 100.0 * 7.0 * d.holding_per_day / tolerance;
  return d;
}

std::string salinity_drift_text(const SalinityDrift& d, int horizon_days, double tolerance) {
  std::string out = fmt::format(
      "salinity drift: the sodium, chloride and sulfate left by dosing add {:.4f} salinity units a day while the "
      "levels are held; a water change of {:.1f} % a week keeps the excess at or below {:g} salinity units (top off "
      "with fresh water only)",
      d.holding_per_day, d.water_change_percent_per_week, tolerance);
  if (!d.holding_seen) {
    out += fmt::format("; the plan is still ramping after {} days, so this figure includes ramp doses and will fall "
                       "once the levels are held",
                       horizon_days);
  } else if (d.ramp_days > 0) {
    out += fmt::format("; the ramp (days 1-{}) adds {:.3f} salinity units more, once: check salinity after it",
                       d.ramp_days, d.ramp_extra);
  }
  out += fmt::format(" ({:.3f} over all {} days)", d.over_horizon, horizon_days);
  return out;
}

}  // namespace tw::plan
