// Seawater composition at the conditions: totals scaled by salinity, measured values override.
#include "tidewright/carbonate/carbonate.hpp"

namespace tw::carbonate {

namespace {
// Option -> formula table for total boron (style: one table maps an option to its function).
double total_boron(BoronOption option, double salinity) {
  switch (option) {
    case BoronOption::Uppstrom1974: return total_boron_uppstrom1974(salinity);
    case BoronOption::Lee2010: return total_boron_lee2010(salinity);
  }
  return total_boron_uppstrom1974(salinity);
}
}  // namespace

Totals compute_totals(const Conditions& conditions) {
  const double s = conditions.salinity;
  Totals t;
  // A measured value replaces the salinity ratio (issue 18: salt mixes); boron_source() says which.
  t.boron = conditions.total_boron_umol_kg ? *conditions.total_boron_umol_kg * 1e-6
                                           : total_boron(conditions.boron, s);
  t.sulfate = total_sulfate_morris_riley1966(s);
  t.fluoride = total_fluoride_riley1965(s);
  t.calcium = conditions.calcium_umol_kg ? *conditions.calcium_umol_kg * 1e-6
                                         : calcium_riley_tongudai1967(s);
  t.phosphate = conditions.phosphate_umol_kg * 1e-6;
  t.silicate = conditions.silicate_umol_kg * 1e-6;
  return t;
}

}  // namespace tw::carbonate
