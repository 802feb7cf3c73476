// Safety limits of the planner: one table of defaults with their sources and hard ceilings,
// and the rules for tightening, loosening and overriding (design.md safety model).
#include <fmt/format.h>

#include "tidewright/plan/plan.hpp"
#include "tidewright/common/units.hpp"

namespace tw::plan {

namespace {
// Defaults: common practice of reef keeping unless a source is named. Hard ceilings are chosen
// here as the point past which the plan refuses to go without an explicit override; for Omega
// it is Moras et al. (2022): aragonite precipitated above Omega 7 on CaO/Ca(OH)2 particles.
const std::array<LimitSpec, kLimitCount> kSpecs = {{
    {LimitId::AlkalinityRisePerDay, "alkalinity_rise_dkh_per_day", "largest rise of alkalinity in one day", "dKH/day",
     1.0, 1.5, "common practice; hard ceiling chosen here"},
    {LimitId::CalciumRisePerDay, "calcium_rise_mg_l_per_day", "largest rise of calcium in one day", "mg/L/day", 20.0,
     30.0, "common practice; hard ceiling chosen here"},
    {LimitId::MagnesiumRisePerDay, "magnesium_rise_mg_l_per_day", "largest rise of magnesium in one day", "mg/L/day",
     50.0, 100.0, "common practice; hard ceiling chosen here"},
    {LimitId::PhAfterDose, "ph_after_dose_total", "highest pH (total scale) right after a dose, fully mixed", "pH",
     8.45, 8.6, "common practice; hard ceiling chosen here"},
    {LimitId::OmegaAragoniteAfterDose, "omega_aragonite_after_dose",
     "highest aragonite saturation right after a dose, fully mixed", "", 5.0, 7.0,
     "Moras et al. 2022, Biogeosciences 19:3537: no precipitation at Omega 5, aragonite above 7"},
    {LimitId::AlkalinityCeiling, "alkalinity_max_dkh", "highest alkalinity at any time", "dKH", 12.0, 14.0,
     "common practice; hard ceiling chosen here"},
    {LimitId::CalciumCeiling, "calcium_max_mg_l", "highest calcium at any time", "mg/L", 500.0, 550.0,
     "common practice; hard ceiling chosen here"},
    {LimitId::MagnesiumCeiling, "magnesium_max_mg_l", "highest magnesium at any time", "mg/L", 1500.0, 1600.0,
     "common practice; hard ceiling chosen here"},
}};
}  // namespace

const std::array<LimitSpec, kLimitCount>& limit_specs() { return kSpecs; }

const LimitSpec& limit_spec(LimitId id) { return kSpecs[static_cast<std::size_t>(id)]; }

Result<LimitId> limit_from_key(const std::string& key) {
  std::string keys;
  for (const auto& s : kSpecs) {
    if (key == s.key) return s.id;
    keys += (keys.empty() ? "" : ", ") + std::string(s.key);
  }
  return Error{"limits", fmt::format("limit \"{}\" is unknown; accepted: {}", key, keys)};
}

Limits default_limits() {
  Limits l;
  for (const auto& s : kSpecs) l.value[static_cast<std::size_t>(s.id)] = s.default_value;
  return l;
}

Result<Limits> make_limits(const std::vector<LimitSetting>& settings) {
  Limits l = default_limits();
  for (const auto& set : settings) {
    const LimitSpec& spec = limit_spec(set.id);
    const std::string field = std::string("limits.") + spec.key;
    // A lower bound keeps every limit meaningful (pH above 7.5, the rest above zero).
    const double floor = set.id == LimitId::PhAfterDose ? 7.5 : 0.0;
    if (!(set.value > floor)) {
      return Error{field, fmt::format("{} {:g} must be above {:g} (default {:g} {}, {})", field, set.value, floor,
                                      spec.default_value, spec.unit, spec.source)};
    }
    if (set.value > spec.hard_ceiling) {
      if (!set.override_hard_ceiling || set.reason.empty()) {
        return Error{field, fmt::format("{} {:g} {} is past the hard ceiling {:g} (accepted: {:g} to {:g}; going "
                                        "further needs an explicit override with a reason)",
                                        field, set.value, spec.unit, spec.hard_ceiling, floor, spec.hard_ceiling)};
      }
      l.record.push_back(fmt::format("OVERRIDE: {} set to {:g} {}, past the hard ceiling {:g} (default {:g}, {}); "
                                     "reason given: {}",
                                     spec.key, set.value, spec.unit, spec.hard_ceiling, spec.default_value,
                                     spec.source, set.reason));
    } else if (set.value > spec.default_value) {
      l.record.push_back(fmt::format("loosened: {} set to {:g} {} (default {:g}, {})", spec.key, set.value, spec.unit,
                                     spec.default_value, spec.source));
    }
    l.value[static_cast<std::size_t>(set.id)] = set.value;
  }
  return l;
}

DailyDemand demand_from_per_litre(double alkalinity_dkh_per_day, double calcium_mg_l_per_day,
                                  double magnesium_mg_l_per_day, double volume_l) {
  DailyDemand d;
  d.alkalinity_meq_per_day = alkalinity_dkh_per_day * units::kMeqPerLPerDKH * volume_l;
  d.calcium_mg_per_day = calcium_mg_l_per_day * volume_l;
  d.magnesium_mg_per_day = magnesium_mg_l_per_day * volume_l;
  return d;
}

}  // namespace tw::plan
