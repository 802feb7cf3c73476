// Validation of a plan's input: each field in its accepted range, with the field named.
#include <cmath>

#include <fmt/format.h>

#include "plan_internal.hpp"
#include "tidewright/common/datetime.hpp"
#include "tidewright/common/ranges.hpp"

namespace tw::plan::detail {

namespace {
Status check_band(const std::string& field, const Band& b, const ranges::Range& accepted, double ceiling) {
  const double lo = accepted.lo, hi = accepted.hi;
  const char* unit = accepted.unit;
  if (auto s = ranges::check(field + ".target", b.target, accepted); !s) return s;
  if (auto s = check_range(field + ".low", b.low, lo, b.target, unit); !s) return s;
  if (auto s = check_range(field + ".high", b.high, b.target, hi, unit); !s) return s;
  if (b.high > ceiling) {
    return Error{field + ".high", fmt::format("{}.high {:g} {} is above the safety ceiling {:g} {} (accepted: up to "
                                              "the ceiling)",
                                              field, b.high, unit, ceiling, unit)};
  }
  return Ok{};
}
}  // namespace

Status validate_input(const PlanInput& in) {
  const SystemState& s = in.system;
  // The water as measured: the same ranges as the journal and the app (a tank that has crashed
  // to 1 dKH needs a plan more than any other); the carbonate chemistry needs salinity >= 1.
  if (auto r = ranges::check("system.volume_l", s.volume_l, ranges::kSystemVolumeL); !r) return r;
  if (auto r = ranges::check("system.salinity", s.salinity, ranges::kSalinityForCarbonateChemistry); !r) return r;
  if (auto r = ranges::check("system.temperature_c", s.temperature_c, ranges::kTemperatureC); !r) return r;
  if (auto r = ranges::check("system.alkalinity_dkh", s.alkalinity_dkh, ranges::kAlkalinityDkh); !r) return r;
  if (auto r = ranges::check("system.calcium_mg_l", s.calcium_mg_l, ranges::kCalciumMgL); !r) return r;
  if (auto r = ranges::check("system.magnesium_mg_l", s.magnesium_mg_l, ranges::kMagnesiumMgL); !r) return r;
  if (s.ph_total) {
    if (auto r = ranges::check("system.ph_total", *s.ph_total, ranges::kPh); !r) return r;
  }
  if (auto r = ranges::check("system.air_co2_ppm", s.air_co2_ppm, ranges::kRoomCo2Ppm); !r) return r;
  const Limits& l = in.limits;
  if (auto r = check_band("targets.alkalinity_dkh", in.targets.alkalinity_dkh, ranges::kAlkalinityTargetDkh,
                          l.get(LimitId::AlkalinityCeiling));
      !r)
    return r;
  if (auto r = check_band("targets.calcium_mg_l", in.targets.calcium_mg_l, ranges::kCalciumTargetMgL,
                          l.get(LimitId::CalciumCeiling));
      !r)
    return r;
  if (auto r = check_band("targets.magnesium_mg_l", in.targets.magnesium_mg_l, ranges::kMagnesiumTargetMgL,
                          l.get(LimitId::MagnesiumCeiling));
      !r)
    return r;
  // Demand and evaporation scale with the system: the table holds them per litre.
  const auto per_system = [v = s.volume_l](const ranges::Range& r, const char* unit) {
    return ranges::Range{r.lo * v, r.hi * v, unit};
  };
  if (auto r = ranges::check("demand.alkalinity_meq_per_day", in.demand.alkalinity_meq_per_day,
                             per_system(ranges::kAlkalinityDemandMeqPerLDay, "meq/day"));
      !r)
    return r;
  if (auto r = ranges::check("demand.calcium_mg_per_day", in.demand.calcium_mg_per_day,
                             per_system(ranges::kCalciumDemandMgPerLDay, "mg/day"));
      !r)
    return r;
  if (auto r = ranges::check("demand.magnesium_mg_per_day", in.demand.magnesium_mg_per_day,
                             per_system(ranges::kMagnesiumDemandMgPerLDay, "mg/day"));
      !r)
    return r;
  if (auto r = ranges::check("evaporation_l_per_day", in.evaporation_l_per_day,
                             per_system(ranges::kEvaporationFractionPerDay, "L/day"));
      !r)
    return r;
  if (in.horizon_days < ranges::kPlanHorizonDays.lo || in.horizon_days > ranges::kPlanHorizonDays.hi) {
    return Error{"horizon_days", fmt::format("horizon_days {} is outside the accepted range {:g} to {:g}", in.horizon_days,
                                             ranges::kPlanHorizonDays.lo, ranges::kPlanHorizonDays.hi)};
  }
  if (auto r = ranges::check("gas_exchange_hours", in.gas_exchange_hours, ranges::kGasExchangeHours); !r) return r;
  if (auto r = ranges::check("salinity_tolerance", in.salinity_tolerance, ranges::kSalinityTolerance); !r) return r;
  const auto most = static_cast<std::size_t>(ranges::kPlanAdditives.hi);
  if (in.deliveries.empty()) return Error{"additives", fmt::format("a plan needs at least one additive (accepted: 1 to {})", most)};
  if (in.deliveries.size() > most) return Error{"additives", fmt::format("a plan takes at most {} additives (accepted: 1 to {})", most, most)};
  if (auto r = check_start_date(in.start_date); !r) return r;
  for (std::size_t i = 0; i < in.deliveries.size(); ++i) {
    const Delivery& d = in.deliveries[i];
    const std::string f = fmt::format("additives[{}]", i);  // the plan file's own name for the list
    const auto& p = d.additive.per_unit;
    if (!(p.alkalinity_eq > 0 || p.calcium_mol > 0 || p.magnesium_mol > 0)) {
      return Error{f + ".additive", fmt::format("{}.additive \"{}\" raises none of alkalinity, calcium or magnesium "
                                                "(accepted: an additive that raises one of them)",
                                                f, d.additive.name)};
    }
    if (p.alkalinity_eq < 0 || p.calcium_mol < 0 || p.magnesium_mol < 0 || p.dic_mol < 0) {
      return Error{f + ".additive", f + ".additive removes a parameter; the planner only adds (accepted: additions)"};
    }
    if (d.doses_per_day < ranges::kDosesPerDay.lo || d.doses_per_day > ranges::kDosesPerDay.hi) {
      return Error{f + ".doses_per_day", fmt::format("{}.doses_per_day {} is outside the accepted range {:g} to {:g}", f,
                                                     d.doses_per_day, ranges::kDosesPerDay.lo, ranges::kDosesPerDay.hi)};
    }
    if (d.first_hour < 0 || d.first_hour > 23 || d.last_hour < d.first_hour || d.last_hour > 23) {
      return Error{f + ".first_hour", fmt::format("{}.first_hour {} and last_hour {} must satisfy 0 <= first_hour <= "
                                                  "last_hour <= 23",
                                                  f, d.first_hour, d.last_hour)};
    }
    const char* u = additives::to_string(d.additive.unit);
    if (auto r = check_range(f + ".max_dose", d.max_dose, ranges::kPlannedDoseMax.lo, ranges::kPlannedDoseMax.hi, u); !r) return r;
    if (auto r = check_range(f + ".min_dose", d.min_dose, 0.0, d.max_dose, u); !r) return r;
    if (auto r = check_range(f + ".max_per_day", d.max_per_day, ranges::kPlannedDailyAmount.lo, ranges::kPlannedDailyAmount.hi, u); !r) return r;
    if (auto r = check_range(f + ".reservoir", d.reservoir, ranges::kReservoirAmount.lo, ranges::kReservoirAmount.hi, u); !r) return r;
    if (auto r = ranges::check(f + ".calibration", d.calibration, ranges::kPumpCalibration); !r) return r;
  }
  return Ok{};
}

Status check_start_date(const std::string& date) {
  const auto bad = [&] {
    return Error{"start_date", fmt::format("start_date \"{}\" is not a calendar date (accepted: YYYY-MM-DD, e.g. "
                                           "2026-12-02)",
                                           date)};
  };
  if (date.size() != 10 || date[4] != '-' || date[7] != '-') return bad();
  for (std::size_t i : {0u, 1u, 2u, 3u, 5u, 6u, 8u, 9u}) {
    if (date[i] < '0' || date[i] > '9') return bad();
  }
  const int year = std::stoi(date.substr(0, 4));
  const unsigned month = static_cast<unsigned>(std::stoi(date.substr(5, 2)));
  const unsigned day = static_cast<unsigned>(std::stoi(date.substr(8, 2)));
  if (year < 1970 || month < 1 || month > 12 || day < 1 || day > datetime::days_in_month(year, month)) return bad();
  return Ok{};
}

int slot_minute(const Delivery& d, int j) {
  const double window_min = (d.last_hour - d.first_hour + 1) * 60.0;
  const double m = d.first_hour * 60.0 + (j + 0.5) * window_min / d.doses_per_day;
  return static_cast<int>(std::floor(m));
}

}  // namespace tw::plan::detail
