// Safety limits of the planner: one table of defaults with their sources and hard bounds, on
// both sides (ceilings and largest changes; floors), and the rules for tightening, loosening and
// overriding (design.md safety model).
#include <algorithm>

#include <fmt/format.h>

#include "plan_internal.hpp"
#include "tidewright/common/units.hpp"

namespace tw::plan {

namespace {
constexpr auto kUp = LimitSide::Upper;
constexpr auto kFloor = LimitSide::Floor;
// Defaults: common practice of reef keeping unless a source is named. Hard bounds are chosen
// here as the point past which the plan refuses to go without an explicit override; for the
// Omega ceiling it is Moras et al. (2022): aragonite precipitated above Omega 7 on CaO/Ca(OH)2
// particles. `lowest`/`highest` keep a setting meaningful (a pH limit above 7, the rest above 0).
const std::array<LimitSpec, kLimitCount> kSpecs = {{
    {LimitId::AlkalinityRisePerDay, "alkalinity_rise_dkh_per_day", "largest rise of alkalinity in any 24 hours",
     "dKH", 1.0, 1.5, "common practice; hard bound chosen here", kUp, 0, 1e9},
    {LimitId::CalciumRisePerDay, "calcium_rise_mg_l_per_day", "largest rise of calcium in any 24 hours", "mg/L",
     20.0, 30.0, "common practice; hard bound chosen here", kUp, 0, 1e9},
    {LimitId::MagnesiumRisePerDay, "magnesium_rise_mg_l_per_day", "largest rise of magnesium in any 24 hours",
     "mg/L", 50.0, 100.0, "common practice; hard bound chosen here", kUp, 0, 1e9},
    {LimitId::PhAfterDose, "ph_after_dose_total", "highest pH (total scale) right after a dose, fully mixed", "pH",
     8.45, 8.6, "common practice; hard bound chosen here", kUp, 7.5, 1e9},
    {LimitId::OmegaAragoniteAfterDose, "omega_aragonite_after_dose",
     "highest aragonite saturation right after a dose, fully mixed", "", 5.0, 7.0,
     "Moras et al. 2022, Biogeosciences 19:3537: no precipitation at Omega 5, aragonite above 7", kUp, 0, 1e9},
    {LimitId::AlkalinityCeiling, "alkalinity_max_dkh", "highest alkalinity at any time", "dKH", 12.0, 14.0,
     "common practice; hard bound chosen here", kUp, 0, 1e9},
    {LimitId::CalciumCeiling, "calcium_max_mg_l", "highest calcium at any time", "mg/L", 500.0, 550.0,
     "common practice; hard bound chosen here", kUp, 0, 1e9},
    {LimitId::MagnesiumCeiling, "magnesium_max_mg_l", "highest magnesium at any time", "mg/L", 1500.0, 1600.0,
     "common practice; hard bound chosen here", kUp, 0, 1e9},
    {LimitId::AlkalinityFallPerDay, "alkalinity_fall_dkh_per_day", "largest fall of alkalinity in any 24 hours",
     "dKH", 1.0, 1.5, "common practice (swings either way stress corals); hard bound chosen here", kUp, 0, 1e9},
    {LimitId::CalciumFallPerDay, "calcium_fall_mg_l_per_day", "largest fall of calcium in any 24 hours", "mg/L",
     20.0, 30.0, "common practice; hard bound chosen here", kUp, 0, 1e9},
    {LimitId::MagnesiumFallPerDay, "magnesium_fall_mg_l_per_day", "largest fall of magnesium in any 24 hours",
     "mg/L", 50.0, 100.0, "common practice; hard bound chosen here", kUp, 0, 1e9},
    {LimitId::AlkalinityStepPerDose, "alkalinity_step_dkh_per_dose", "largest change of alkalinity from one dose",
     "dKH", 0.5, 1.0, "common practice (split the day's amount into several doses); hard bound chosen here", kUp, 0,
     1e9},
    {LimitId::CalciumStepPerDose, "calcium_step_mg_l_per_dose", "largest change of calcium from one dose", "mg/L",
     10.0, 20.0, "common practice; hard bound chosen here", kUp, 0, 1e9},
    {LimitId::MagnesiumStepPerDose, "magnesium_step_mg_l_per_dose", "largest change of magnesium from one dose",
     "mg/L", 25.0, 50.0, "common practice; hard bound chosen here", kUp, 0, 1e9},
    {LimitId::AlkalinityFloor, "alkalinity_min_dkh", "lowest alkalinity at any time", "dKH", 6.0, 5.0,
     "common practice for calcifying corals; hard bound chosen here", kFloor, 0, 20},
    {LimitId::CalciumFloor, "calcium_min_mg_l", "lowest calcium at any time", "mg/L", 350.0, 300.0,
     "common practice; hard bound chosen here", kFloor, 0, 700},
    {LimitId::MagnesiumFloor, "magnesium_min_mg_l", "lowest magnesium at any time", "mg/L", 1150.0, 1000.0,
     "common practice; hard bound chosen here", kFloor, 0, 2000},
    {LimitId::PhFloor, "ph_min_total", "lowest pH (total scale) at any time", "pH", 7.7, 7.5,
     "common practice; hard bound chosen here", kFloor, 7.0, 8.6},
    {LimitId::OmegaAragoniteFloor, "omega_aragonite_min", "lowest aragonite saturation at any time", "", 2.0, 1.5,
     "common practice for reef systems; hard bound after bivalve larvae, which suffer below about 1.5 "
     "(Waldbusser et al. 2015, Nature Climate Change 5:273; from memory)",
     kFloor, 0, 10},
}};
}  // namespace

const std::array<LimitSpec, kLimitCount>& limit_specs() { return kSpecs; }

const LimitSpec& limit_spec(LimitId id) { return kSpecs[static_cast<std::size_t>(id)]; }

namespace {
bool is_daily_rate(LimitId id) {
  switch (id) {
    case LimitId::AlkalinityRisePerDay: case LimitId::CalciumRisePerDay: case LimitId::MagnesiumRisePerDay:
    case LimitId::AlkalinityFallPerDay: case LimitId::CalciumFallPerDay: case LimitId::MagnesiumFallPerDay:
      return true;
    default:
      return false;
  }
}
}  // namespace

double level_room_sd() { return estimate::z95(); }
const char* room_band(LimitId id) { return is_daily_rate(id) ? "the 99.7 % band" : "the 95 % band"; }

Result<LimitId> limit_from_key(const std::string& key) {
  std::vector<std::string> keys;
  for (const auto& s : kSpecs) {
    if (key == s.key) return s.id;
    keys.emplace_back(s.key);
  }
  return Error{"limits", fmt::format("limit \"{}\" is unknown; did you mean \"{}\"?", key, detail::nearest(key, keys))};
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
    if (!(set.value > spec.lowest) || set.value > spec.highest) {
      return Error{field, fmt::format("{} {:g} is outside the accepted range: above {:g}{} (default {:g} {}, {})",
                                      field, set.value, spec.lowest,
                                      spec.highest < 1e9 ? fmt::format(" and at most {:g}", spec.highest) : "",
                                      spec.default_value, spec.unit, spec.source)};
    }
    const bool floor = spec.side == LimitSide::Floor;
    if (spec.past_hard_bound(set.value)) {
      if (!set.override_hard_bound || set.reason.empty()) {
        return Error{field, fmt::format("{} {:g} {} is past the hard {} {:g} (accepted: {}; going further needs an "
                                        "explicit override with a reason)",
                                        field, set.value, spec.unit, floor ? "floor" : "ceiling", spec.hard_bound,
                                        floor ? fmt::format("{:g} or higher", spec.hard_bound)
                                              : fmt::format("above {:g} up to {:g}", spec.lowest, spec.hard_bound))};
      }
      l.record.push_back(fmt::format("OVERRIDE: the {} set to {:g}{}, past the hard {} {:g} (default {:g}, {}); "
                                     "reason given: {}",
                                     spec.description, set.value, spec.unit_suffix(), floor ? "floor" : "ceiling", spec.hard_bound,
                                     spec.default_value, spec.source, set.reason));
    } else if (spec.loosens(set.value)) {
      l.record.push_back(fmt::format("loosened: the {} set to {:g}{} (default {:g}, {})", spec.description, set.value, spec.unit_suffix(),
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

namespace detail {
// Levenshtein distance, for "did you mean" in messages about unknown keys.
std::string nearest(const std::string& word, const std::vector<std::string>& known) {
  std::string best;
  std::size_t best_d = SIZE_MAX;
  for (const auto& k : known) {
    std::vector<std::size_t> row(k.size() + 1);
    for (std::size_t j = 0; j <= k.size(); ++j) row[j] = j;
    for (std::size_t i = 1; i <= word.size(); ++i) {
      std::size_t diag = row[0];
      row[0] = i;
      for (std::size_t j = 1; j <= k.size(); ++j) {
        const std::size_t up = row[j];
        row[j] = std::min({row[j] + 1, row[j - 1] + 1, diag + (word[i - 1] == k[j - 1] ? 0 : 1)});
        diag = up;
      }
    }
    if (row[k.size()] < best_d) {
      best_d = row[k.size()];
      best = k;
    }
  }
  return best;
}
}  // namespace detail

std::string cap_in_words(const std::string& capped_by) {
  for (const LimitSpec& spec : limit_specs()) {
    if (capped_by == spec.key) return std::string("the ") + spec.description;
  }
  if (capped_by == "max_dose") return "the pump's largest single dose";
  if (capped_by == "max_dose x doses_per_day") return "the pump's largest dose times its doses per day";
  if (capped_by == "max_per_day") return "the pump's largest amount per day";
  if (capped_by == "reservoir") return "what is left in the reservoir";
  if (capped_by == "evaporation_l_per_day") return "the evaporation the top-off replaces";
  return capped_by;
}

}  // namespace tw::plan
