// The accepted range of every quantity a keeper types or logs, in one table.
//
// Every front end (the command line, the app's fields and their keyboard hints) and every check
// in the core (the journal, the chemistry's inputs, the plan, the dosing calculators) reads its
// range from here, so a value the app accepts is one the command line accepts, and an error
// names the same range everywhere.
//
// Water measurements are bounded by the narrowest model every answer passes through: the
// EOS-80 density (UNESCO 1983; salinity 0-42, -2..40 C), which converts between per-litre and
// per-kilogram units in every calculation (seawater_density.cpp asserts these bounds fit inside
// its validity). The other bounds are wide on purpose (hatchery intakes, low-salinity culture,
// heavy dosing, a crashed tank that needs a plan back) and refuse only values that are
// impossible or certainly misread, e.g. pH 3 or alkalinity 40 dKH [common practice: no single
// source].
#pragma once

#include <cstdint>
#include <string>

#include "tidewright/common/parameter.hpp"
#include "tidewright/common/result.hpp"

namespace tw::ranges {

struct Range {
  double lo, hi;
  const char* unit;
};

// lo <= value <= hi, else an Error naming `field` and the accepted range in `r.unit`.
Status check(const std::string& field, double value, const Range& r);

// ------------------------------------------------------------ the water
inline constexpr Range kTemperatureC{-2.0, 40.0, "C"};   // EOS-80 validity
inline constexpr Range kSalinity{0.0, 42.0, ""};         // practical salinity; EOS-80 validity
inline constexpr Range kSpecificGravity{0.990, 1.040, ""};
inline constexpr Range kPh{6.0, 10.0, ""};
inline constexpr Range kAlkalinityDkh{0.0, 25.0, "dKH"};
inline constexpr Range kCalciumMgL{0.0, 1000.0, "mg/L"};
inline constexpr Range kMagnesiumMgL{0.0, 2500.0, "mg/L"};
inline constexpr Range kNitrateMgL{0.0, 500.0, "mg/L"};
inline constexpr Range kPhosphateMgL{0.0, 50.0, "mg/L"};
inline constexpr Range kOtherValue{-1e9, 1e9, ""};
// The carbonate constants need some salt: below salinity 1 the seawater ratios for boron,
// sulfate, fluoride and calcium, and every constant fitted in seawater, have no meaning left.
inline constexpr Range kSalinityForCarbonateChemistry{1.0, kSalinity.hi, ""};
// Measured total boron of the water (issue 18: artificial salt mixes), per kg of seawater.
// Natural seawater at S 35 holds about 416 umol/kg (4.5 mg/kg, Uppstrom 1974); the bound takes
// a mix or a borate-buffered product at several times that and refuses a typo such as the
// value in ug/L [our choice].
inline constexpr Range kTotalBoronUmolKg{0.0, 2000.0, "umol/kg"};
// Measured magnesium for the carbonate chemistry (the Mg/Ca correction of the constants), per
// kg of seawater: the same span as kMagnesiumMgL (2500 mg/L is about 100 mmol/kg).
inline constexpr Range kMagnesiumUmolKg{0.0, 100000.0, "umol/kg"};

// The range of a logged test of parameter p (kOtherValue for Other).
const Range& of_measurement(Parameter p);
// The rise one dose or one mix is asked for, in parameter_unit(p): more than zero and at most
// the parameter's whole measurable range (a dose that raises alkalinity by more than 25 dKH is
// a typo, not a dose).
Range of_rise(Parameter p);

// ------------------------------------------------------------ the room
// CO2 in the air the water settles with: outdoor air is ~425 ppm, closed rooms reach several
// thousand [common practice].
// Offsets of local time from UTC in use on Earth (UTC-12:00 Baker Island to UTC+14:00 Line
// Islands; IANA time zone database).
inline constexpr Range kUtcOffsetMinutes{-720.0, 840.0, "minutes"};
inline constexpr Range kRoomCo2Ppm{150.0, 10000.0, "ppm"};

// ------------------------------------------------------------ systems, doses, stocks
inline constexpr Range kSystemVolumeL{0.1, 1e7, "L"};
inline constexpr Range kEventVolumeL{0.0, 1e7, "L"};          // also at most the system volume
inline constexpr Range kDoseAmount{0.0, 1e6, "g or mL"};      // > 0
// A plan's largest single dose (mL or g): 100 L of limewater top-off at most.
inline constexpr Range kPlannedDoseMax{1e-3, 1e5, "g or mL"};
inline constexpr Range kStockGPerL{0.0, 1500.0, "g/L"};       // > 0; each compound's solubility narrows it
inline constexpr Range kLimewaterGPerL{0.0, 1.9, "g/L"};      // > 0
// A pump's calibration, delivered per set amount [our choice: a pump further off than 50 %
// is broken or mis-set, not calibrated].
inline constexpr Range kPumpCalibration{0.5, 1.5, "delivered per set amount"};

// A stock solution as kept, from a cold store room to a warm fish room [our choice]; each
// compound's solubility table may narrow it.
inline constexpr Range kStockTemperatureC{0.0, 40.0, "C"};
// One dose of a mix (the Mixes screen, `mix`): the effect it has on a volume of water.
inline constexpr Range kMixDoseMl{0.01, 10000.0, "mL"};

// A flow-through source (a calcium reactor) described by its measured effluent: far above any
// reactor's (effluent of 20-40 dKH at tens of mL a minute) [common practice].
inline constexpr Range kReactorFlowMlPerMin{0.0, 1000.0, "mL/min"};
inline constexpr Range kReactorAlkalinityDkh{0.0, 100.0, "dKH"};
inline constexpr Range kReactorCalciumMgL{0.0, 2000.0, "mg/L"};
inline constexpr Range kReactorMagnesiumMgL{0.0, 3000.0, "mg/L"};

// ------------------------------------------------------------ targets a plan doses toward
// Narrower than what can be measured: a target outside these is a typo or a mistake, not a
// reef [common practice].
inline constexpr Range kAlkalinityTargetDkh{2.0, 20.0, "dKH"};
inline constexpr Range kCalciumTargetMgL{200.0, 700.0, "mg/L"};
inline constexpr Range kMagnesiumTargetMgL{800.0, 2000.0, "mg/L"};

// ------------------------------------------------------------ a plan
inline constexpr Range kPlanHorizonDays{1.0, 365.0, "days"};
inline constexpr Range kDosesPerDay{1.0, 288.0, ""};  // every 5 minutes at most
inline constexpr Range kPlanAdditives{1.0, 16.0, "additives"};  // what one plan doses [our choice]
// Consumption a plan doses against, per litre of the system per day: wide on purpose, far above
// a heavily stocked stony-coral tank's (about 0.3-1 meq/L, 10-20 mg/L of calcium a day)
// [common practice].
inline constexpr Range kAlkalinityDemandMeqPerLDay{0.0, 5.0, "meq/L/day"};
inline constexpr Range kCalciumDemandMgPerLDay{0.0, 100.0, "mg/L/day"};
inline constexpr Range kMagnesiumDemandMgPerLDay{0.0, 100.0, "mg/L/day"};
// Water evaporated (and topped off) per day, as a fraction of the system's volume [our choice:
// a fifth of the tank a day is a leak, not evaporation].
inline constexpr Range kEvaporationFractionPerDay{0.0, 0.2, "of the volume per day"};
// How fast the water settles with the room air (e-folding time of the gas exchange model).
inline constexpr Range kGasExchangeHours{0.0, 72.0, "h"};
// How far the salinity may sit from its target before the plan flags it.
inline constexpr Range kSalinityTolerance{0.01, 5.0, ""};
// A pump's daily volume and the stock on hand (mL or g): any real pump and reservoir [our choice].
inline constexpr Range kPlannedDailyAmount{1e-3, 1e9, "g or mL"};
inline constexpr Range kReservoirAmount{0.0, 1e9, "g or mL"};

// ------------------------------------------------------------ estimates and forecasts
// Days a consumption forecast looks ahead (`demand --days`; the app's chart shows up to 60).
inline constexpr Range kForecastDays{1.0, 365.0, "days"};
// The window of logged doses that stands for the current dosing (`demand --dose-window`).
inline constexpr Range kDosingWindowDays{1.0, 90.0, "days"};

// ------------------------------------------------------------ hatchery treatment of intake water
// [our choice: the span of shellfish hatchery practice, and of the carbonate constants' fits]
inline constexpr Range kHatcheryTargetOmega{0.5, 8.0, ""};
inline constexpr Range kHatcheryTargetPh{6.5, 9.3, ""};
inline constexpr Range kHatcheryPhCeiling{7.0, 9.3, ""};
inline constexpr Range kIntakeFlowLPerMin{0.01, 100000.0, "L/min"};
// Time the treated water spends open to the air before the animals (degassing): up to a day.
inline constexpr Range kResidenceTimeMin{0.0, 1440.0, "min"};
// Water mixed into the line (fresh or another seawater): its alkalinity and DIC, far above any
// natural water's (seawater ~2300, hard river water ~5000 umol/kg) [our choice].
inline constexpr Range kMixWaterCarbonUmolKg{0.0, 10000.0, "umol/kg"};
// Share by volume of that water in the mixed water: none to all.
inline constexpr Range kMixVolumeFraction{0.0, 1.0, ""};
// The probability a hatchery dose reaches its target with (and keeps its ceiling with): from
// a coin toss to 1 in 1000 [our choice: beyond 99.9 % the normal tails are not to be trusted].
inline constexpr Range kDoseConfidencePercent{50.0, 99.9, "%"};
// The step between the rows of the pump-side table, in pH units: a hundredth (about what a
// meter shows) to a whole unit [our choice].
inline constexpr Range kPumpTableStepPh{0.01, 1.0, "pH"};

// ------------------------------------------------------------ time
// 1970-01-01 to 2200-01-01 UTC.
inline constexpr std::int64_t kEarliestTimeS = 0;
inline constexpr std::int64_t kLatestTimeS = 7258118400;

}  // namespace tw::ranges
