// Continuous sources (a calcium reactor or any flow-through feed) described by measured
// output: flow and effluent alkalinity/calcium (and optionally magnesium) -> net daily addition.
#include <cmath>

#include <fmt/format.h>

#include "tidewright/common/ranges.hpp"
#include "tidewright/additives/additives.hpp"
#include "tidewright/common/units.hpp"

namespace tw::additives {

// The effluent replaces tank water one for one, so what reaches the tank each day is
// flow x (effluent - tank) for each parameter. Alkalinity: dKH x 0.35665 meq/L (facts.md 5).
// Check: 100 mL/min, effluent 20 dKH vs tank 8 dKH -> 144 L/day x 12 dKH x 0.35665 = 616 meq/day.
Result<DailyAddition> daily_addition(const ContinuousSource& source, const TankLevels& tank, double system_volume_l) {
  if (auto s = ranges::check("flow_ml_per_min", source.flow_ml_per_min, ranges::kReactorFlowMlPerMin); !s) {
    return s.error();
  }
  if (auto s = ranges::check("effluent_alkalinity_dkh", source.effluent_alkalinity_dkh, ranges::kReactorAlkalinityDkh);
      !s) {
    return s.error();
  }
  if (auto s = ranges::check("effluent_calcium_mg_l", source.effluent_calcium_mg_l, ranges::kReactorCalciumMgL); !s) {
    return s.error();
  }
  if (source.effluent_magnesium_mg_l >= 0) {
    if (auto s = ranges::check("effluent_magnesium_mg_l", source.effluent_magnesium_mg_l, ranges::kReactorMagnesiumMgL);
        !s) {
      return s.error();
    }
  }
  if (auto s = ranges::check("tank.alkalinity_dkh", tank.alkalinity_dkh, ranges::kAlkalinityDkh); !s) return s.error();
  if (auto s = ranges::check("tank.calcium_mg_l", tank.calcium_mg_l, ranges::kCalciumMgL); !s) return s.error();
  if (auto s = ranges::check("tank.magnesium_mg_l", tank.magnesium_mg_l, ranges::kMagnesiumMgL); !s) return s.error();
  if (auto s = ranges::check("system_volume_l", system_volume_l, ranges::kSystemVolumeL); !s) return s.error();

  const double litres_per_day = source.flow_ml_per_min * 1440.0 / 1000.0;
  DailyAddition out;
  out.alkalinity_meq_per_day =
      litres_per_day * (source.effluent_alkalinity_dkh - tank.alkalinity_dkh) * units::kMeqPerLPerDKH;
  out.calcium_mg_per_day = litres_per_day * (source.effluent_calcium_mg_l - tank.calcium_mg_l);
  if (source.effluent_magnesium_mg_l >= 0) {
    out.magnesium_mg_per_day = litres_per_day * (source.effluent_magnesium_mg_l - tank.magnesium_mg_l);
  } else {
    out.notes.push_back("effluent magnesium not measured: no magnesium change counted");
  }
  out.per_day.alkalinity_eq = out.alkalinity_meq_per_day / 1000.0;
  out.per_day.calcium_mol = out.calcium_mg_per_day / 1000.0 / atomic_weight_iupac(Element::Ca);
  out.per_day.magnesium_mol = out.magnesium_mg_per_day / 1000.0 / atomic_weight_iupac(Element::Mg);
  out.alkalinity_dkh_per_day = out.alkalinity_meq_per_day / system_volume_l / units::kMeqPerLPerDKH;
  out.calcium_mg_l_per_day = out.calcium_mg_per_day / system_volume_l;
  out.magnesium_mg_l_per_day = out.magnesium_mg_per_day / system_volume_l;
  if (std::abs(out.alkalinity_meq_per_day) > 1e-12) {
    out.calcium_mg_per_meq = out.calcium_mg_per_day / out.alkalinity_meq_per_day;
    // Dissolving CaCO3 gives 20.04 mg Ca per meq (facts.md 5); a reactor far from it is worth a
    // second test (test error, or media other than aragonite/calcite).
    if (out.calcium_mg_per_meq > 0 && std::abs(out.calcium_mg_per_meq / 20.04 - 1.0) > 0.35) {
      out.notes.push_back(fmt::format(
          "net output has {:.1f} mg calcium per meq alkalinity; dissolving calcium carbonate gives 20.0 "
          "per meq: retest the effluent",
          out.calcium_mg_per_meq));
    }
  }
  if (out.alkalinity_meq_per_day < 0 || out.calcium_mg_per_day < 0) {
    out.notes.push_back("effluent is below the tank level for at least one parameter: the source removes it");
  }
  out.notes.push_back(
      "reactor effluent is rich in CO2: it lowers tank pH, which this daily figure does not show");
  return out;
}

Result<Coverage> coverage(double added_per_day, double consumed_per_day, double flow_ml_per_min) {
  if (!(consumed_per_day > 0)) {
    return Error{"consumed_per_day", fmt::format("consumption {:g} a day must be above 0 to compare with",
                                                 consumed_per_day)};
  }
  if (!std::isfinite(added_per_day)) return Error{"added_per_day", "the daily addition is not a number"};
  Coverage c;
  c.share = added_per_day / consumed_per_day;
  c.matches = std::abs(c.share - 1.0) <= 0.15;
  if (c.share > 0 && flow_ml_per_min > 0) c.matching_flow_ml_per_min = flow_ml_per_min / c.share;
  return c;
}

}  // namespace tw::additives
