// Hatchery buffering: raising the alkalinity and aragonite saturation of intake seawater
// (flow-through) and of static culture tanks (batch) with sodium carbonate, sodium
// bicarbonate, sodium hydroxide, or a carbonate + bicarbonate blend chosen by the tool.
//
// Map of this header
//   1. Units of flow
//   2. Water, targets, limits, stock and gas-exchange settings
//   3. Dose chemistry shared by every mode (hatchery_dose.cpp)
//   4. Flow-through plan (hatchery_flow.cpp)
//   5. Batch (static tank) plan (hatchery_batch.cpp)
//   6. Pump-side table for staff (hatchery_table.cpp)
//   7. Cautions
//
// Method (the same for every mode; comments in hatchery_dose.cpp carry the detail)
// - The intake is solved from its two carbonate measurements with tw::carbonate::solve.
// - A dose adds alkalinity and DIC by each compound's formula (per mole: Na2CO3 +2 TA +1 DIC,
//   NaHCO3 +1 TA +1 DIC, NaOH +1 TA; facts.md 5), fully mixed, closed system
//   ("after mixing": no gas exchange yet).
// - Gas exchange on the way to the tanks keeps alkalinity and moves DIC a fraction phi of the
//   way toward its value in equilibrium with the air at that alkalinity:
//   DIC_tank = DIC_mix + phi (DIC_air(TA_mix) - DIC_mix), with phi given directly (0..1) or as
//   phi = 1 - exp(-t/tau) from a residence time t and a gas-exchange time constant tau
//   (first-order relaxation; a simple model, not a published hatchery formula).
// - The dose that meets a target (Omega aragonite or pH) is found by bisection on the added
//   alkalinity (both metrics rise monotonically with a carbonate or hydroxide dose).
// - Blend: the carbonate share f (fraction of the added alkalinity equivalents supplied as
//   Na2CO3; the rest as NaHCO3) is the largest f in [0,1] whose dose meets the target with the
//   pH (after mixing and at the tanks) at or below the ceiling. Carbonate raises Omega most per
//   equivalent, and each equivalent of bicarbonate brings one DIC, which lowers the pH at a
//   given Omega; so the largest feasible carbonate share is the smallest total dose that keeps
//   under the ceiling. f is scanned on a grid of 1/20 from 1 down and the edge refined by
//   bisection (without gas exchange the pH at the target rises with f; with gas exchange the
//   curve can turn, hence the scan).
// All concentrations are umol/kg of seawater; pH values name their scale.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/carbonate/uncertainty.hpp"
#include "tidewright/common/result.hpp"

namespace tw::hatchery {

// ---------------------------------------------------------------- 1. Units of flow
enum class FlowUnit { LitrePerMinute, CubicMetrePerHour };
const char* to_string(FlowUnit unit);  // "L/min", "m3/h"
Result<FlowUnit> flow_unit_from_string(const std::string& text);  // "l/min", "lpm", "m3/h"
double flow_to_l_per_min(double value, FlowUnit unit);
double flow_from_l_per_min(double l_per_min, FlowUnit unit);

// ---------------------------------------------------------------- 2. Settings
enum class Buffer { SodiumCarbonate, SodiumBicarbonate, SodiumHydroxide, Blend };
const char* to_string(Buffer buffer);  // "carbonate", "bicarbonate", "hydroxide", "blend"
Result<Buffer> buffer_from_string(const std::string& text);
// The single compounds (the blend is made of the first two).
enum class Compound { SodiumCarbonate, SodiumBicarbonate, SodiumHydroxide };
const char* to_string(Compound compound);     // "sodium carbonate", ...
const char* formula_of(Compound compound);    // "Na2CO3", "NaHCO3", "NaOH"

// Intake or tank water: where it is and two carbonate measurements.
struct Water {
  double salinity = 35.0;       // practical salinity
  double temperature_c = 20.0;  // degrees C
  // Carbonic acid constants for this water: Lueker et al. (2000) by default; Millero (2010)
  // for brackish and estuarine intakes (carbonate::suggest_k1k2 says when, and why).
  carbonate::K1K2Option k1k2 = carbonate::K1K2Option::Lueker2000;
  // Measured calcium (0..50000 umol/kg); absent = scaled from salinity by the seawater ratio,
  // which under-reads estuarine and river-influenced intakes (Treatment::calcium_source says
  // which was used and, at low salinity, by how much it can be off).
  std::optional<double> calcium_umol_kg;
  // A made-up water's own composition (salt mixes), as carbonate::Conditions takes it: measured
  // total boron in place of the salinity-scaled value, and the Mg/Ca correction of the
  // constants (Hain et al. 2015), which reads measured magnesium and calcium. Off by default.
  std::optional<double> total_boron_umol_kg;
  std::optional<double> magnesium_umol_kg;
  bool mg_ca_correction = false;
  carbonate::InputPair measurements{{carbonate::Quantity::Alkalinity, 2300.0},
                                    {carbonate::Quantity::PH, 8.0},
                                    carbonate::PhScale::Total};
};

// The carbonate conditions of a water: the one place where a Water becomes Conditions.
carbonate::Conditions conditions_of(const Water& water);

enum class TargetKind { OmegaAragonite, PH, AlkalinityRise };
const char* to_string(TargetKind kind);  // "omega_aragonite", "ph", "alkalinity_rise"
struct Target {
  TargetKind kind = TargetKind::OmegaAragonite;
  double value = 2.0;  // Omega (0.5..8), pH (6.5..9.3) or added alkalinity (0..5000 umol/kg)
  carbonate::PhScale ph_scale = carbonate::PhScale::Total;  // for a pH target
};

// Where the target must be met.
enum class TargetPoint { AfterMixing, AtTanks };

// Gas exchange between the injection point and the tanks.
struct GasExchange {
  std::optional<double> fraction;             // phi 0..1 directly; wins over the time pair
  std::optional<double> residence_time_min;   // t, 0..1440 min
  double exchange_time_constant_min = 30.0;   // tau, 0.1..10000 min (site-specific, user's)
  double air_co2_ppm = 424.6;                 // 100..10000 ppm (NOAA 2024 annual mean, facts.md 10)
};
// phi from the settings: fraction if set, else 1 - exp(-t/tau) if t is set, else 0.
Result<double> degassing_fraction(const GasExchange& gas);

struct Limits {
  double ph_ceiling = 8.3;                              // 7.0..9.3 on ph_ceiling_scale
  carbonate::PhScale ph_ceiling_scale = carbonate::PhScale::Total;
  double mixing_omega_ceiling = 5.0;  // Omega ar after mixing / at injection; Moras et al. 2022
};

// Stock solution: strength made up to volume (grams of anhydrous salt per litre of solution).
struct StockOptions {
  double temperature_c = 20.0;            // where the stock is made and kept, 0..60 C
  std::optional<double> strength_g_per_l; // user's strength; refused above saturation
  double fraction_of_saturation = 0.8;    // default strength = this x saturation (0.05..1)
};

// Dosing to a confidence (hatchery_confidence.cpp): given how precisely the intake was
// measured, the dose reaches the target with `probability` and the pH ceiling holds with the
// same probability. The uncertainty of the target's quantity and of the highest pH at a dose
// is propagated from the intake readings by the method of Orr et al. (2018, Mar. Chem. 207:84):
// first order, inputs independent, derivatives by central differences of the same chain
// (intake solve, dose, gas exchange). One-sided normal bounds: target - z u >= target value,
// highest pH + z u <= ceiling, z = the normal quantile of `probability` (1.645 for 95 %).
struct Confidence {
  double probability = 0.95;              // accepted 0.5..0.999
  carbonate::InputUncertainties intake;   // of Water::measurements (first, second, pH scale
                                          // conversion), salinity, temperature, calcium, and
                                          // a salt mix's measured boron and magnesium
};

struct Settings {
  Target target;
  std::optional<Confidence> confidence;  // absent: the dose for the readings as they stand
  TargetPoint target_point = TargetPoint::AfterMixing;
  Buffer buffer = Buffer::SodiumCarbonate;
  Limits limits;
  GasExchange gas;
  StockOptions stock;
};

// ---------------------------------------------------------------- 3. Dose chemistry
// Added amount of each compound, umol per kg of seawater.
struct DoseMix {
  double carbonate_umol_kg = 0, bicarbonate_umol_kg = 0, hydroxide_umol_kg = 0;
  double alkalinity_umol_kg() const;  // 2 carbonate + bicarbonate + hydroxide
  double dic_umol_kg() const;         // carbonate + bicarbonate
};

// What dosing to a confidence gave (Treatment::confidence).
struct ConfidenceReport {
  double probability = 0.95, z = 0;
  double centre_added_alkalinity_umol_kg = 0;  // the dose for the readings as they stand
  double added_alkalinity_umol_kg = 0;         // the dose chosen for the confidence
  double target_value = 0, target_u = 0, target_bound = 0;  // at the chosen dose: value - z u
  double ph_max = 0, ph_u = 0, ph_bound = 0;   // highest pH (ceiling's scale): value + z u
  std::string summary;                         // plain words with the numbers
};

struct Treatment {
  std::optional<ConfidenceReport> confidence;  // when Settings::confidence was given
  carbonate::CarbonateState intake;
  carbonate::CarbonateState after_mixing;  // closed system, fully mixed, before gas exchange
  carbonate::CarbonateState at_tanks;      // after gas exchange phi
  double degassing_fraction = 0;           // phi used
  DoseMix dose;
  double carbonate_share = 1;              // blend: fraction of added TA from Na2CO3
  bool dose_needed = true;                 // false when the intake already meets the target
  std::string calcium_source;              // carbonate::calcium_source(...).note
  std::vector<std::string> warnings;
};

// Solves the intake, finds the dose for the settings, and returns the chemistry through the
// line. Refuses (Error) targets that cannot be met under the pH ceiling, naming the option.
Result<Treatment> plan_treatment(const Water& water, const Settings& settings);

// The one-sided normal quantile z with P(Z <= z) = probability (0.5..0.999).
Result<double> one_sided_z(double probability);

// Applies a given dose to the water and returns the same chemistry (for checking a dose).
Result<Treatment> apply_dose(const Water& water, const DoseMix& dose, const Settings& settings);

// ---------------------------------------------------------------- 4. Flow-through
struct StockLine {           // one compound, one stock, one metering pump
  Compound compound = Compound::SodiumCarbonate;
  double umol_per_kg = 0;            // added to the intake
  double grams_per_hour = 0;         // anhydrous salt
  double grams_per_day = 0;
  double stock_g_per_l = 0;          // strength, g anhydrous salt per litre of solution
  double saturation_g_per_l = 0;     // estimated at stock temperature (see hatchery_flow.cpp)
  double pump_ml_per_min = 0;
  double stock_litres_per_day = 0;
  double injection_dilution_needed = 0;  // water:stock volume ratio that brings the local
                                         // Omega ar down to the mixing ceiling (0 if none)
  double full_mixing_dilution = 0;       // water:stock volume ratio when fully mixed
};

struct FlowPlan {
  double flow_l_per_min = 0;
  Treatment treatment;
  std::vector<StockLine> lines;  // one per compound with a non-zero dose
  std::vector<std::string> warnings;   // pH, Omega, injection zone, solubility, constants
  std::vector<std::string> cautions;   // always present (section 7)
};

// flow_l_per_min accepted 0.01..100000.
Result<FlowPlan> plan_flow(const Water& intake, double flow_l_per_min, const Settings& settings);

// Saturation strength of a compound's stock at a temperature, g per litre of solution
// (conservative: see hatchery_flow.cpp), and the default strength the planner uses.
Result<double> stock_saturation_g_per_l(Compound compound, double temperature_c);
Result<double> stock_strength_g_per_l(Compound compound, const StockOptions& stock);

// ---------------------------------------------------------------- 5. Batch
struct BatchPlan {
  double volume_l = 0;
  double water_mass_kg = 0;
  Treatment treatment;
  struct Addition { Compound compound; double umol_per_kg; double grams; };
  std::vector<Addition> additions;
  std::vector<std::string> warnings;
  std::vector<std::string> cautions;
};

// volume_l accepted 0.1..10,000,000 L. The gas-exchange settings describe the tank after
// the addition (phi of the way to air equilibrium).
Result<BatchPlan> plan_batch(const Water& tank, double volume_l, const Settings& settings);

// ---------------------------------------------------------------- 6. Pump-side table
// Rows over a range of one intake reading with the other held fixed, e.g. intake pH from
// 7.50 to 8.00 in steps of 0.05 at a fixed alkalinity.
struct TableRange {
  carbonate::Quantity varied = carbonate::Quantity::PH;  // the first measurement of Water
  double from = 7.5, to = 8.0, step = 0.05;              // at most 400 rows
};
struct TableRow {
  double reading = 0;
  std::optional<ConfidenceReport> confidence;  // with Settings::confidence: both bounds
  bool ok = false;
  std::string note;                   // refusal reason or "no dose needed"
  double intake_omega_aragonite = 0, intake_ph_total = 0;
  std::vector<double> pump_ml_per_min;  // per column compound (0 when not dosed)
  std::vector<double> grams_per_hour;
  double ph_total_after_mixing = 0, omega_aragonite_after_mixing = 0;
  double ph_total_at_tanks = 0, omega_aragonite_at_tanks = 0;
};
struct PumpTable {
  double flow_l_per_min = 0;
  Water fixed;                         // the water with the varied reading's scale
  TableRange range;
  Settings settings;
  std::vector<Compound> columns;       // compounds that get a pump
  std::vector<double> stock_g_per_l;   // per column, fixed for the whole table
  std::vector<TableRow> rows;
  std::string calcium_source;          // carbonate::calcium_source(...).note for the fixed water
  std::vector<std::string> cautions;
  std::string line_note;               // build_line_pump_table: the conditioning and the dosed flow
};
// `intake.measurements.first` is the varied reading (its value is ignored); the second is
// held fixed.
Result<PumpTable> build_pump_table(const Water& intake, double flow_l_per_min,
                                   const TableRange& range, const Settings& settings);
std::string pump_table_csv(const PumpTable& table);   // RFC 4180, header row first
std::string pump_table_text(const PumpTable& table);  // fixed-width, for printing

// ---------------------------------------------------------------- 7. Cautions
// Handling cautions for the compounds used, and the food-production deferral; printed with
// every result.
std::vector<std::string> cautions_for(const std::vector<Compound>& compounds);

}  // namespace tw::hatchery
