// Additives as chemistry: compounds, stock solutions, users' own products and continuous
// sources (calcium reactor), each turned into what it changes in the water.
//
// Map of this header
//   1. Elements and molar masses (IUPAC/CIAAW abridged atomic weights)
//   2. ChemicalChange: what an amount of additive adds (alkalinity eq, DIC, ions in mol)
//   3. Compound catalog (data, one row per compound: formula, change per mole, solubility,
//      hazards) and lookups; solubility at a temperature; limewater; baked baking soda
//   4. Tank arithmetic: change per litre of a system, grams of a compound for a rise
//   5. Stock solutions: recipe -> strength (checked against solubility), target -> recipe
//   6. A user's own product from its label claim
//   7. Additive: the one thing the planner and the journal dose (per mL or per g)
//   8. Continuous sources (calcium reactor): measured output -> daily addition, coverage of
//      the consumption
//
// Units: amounts of chemistry in mol (alkalinity in equivalents), masses in g, volumes of
// solution in mL, volumes of systems in L, temperatures in degrees C. Tank concentrations are
// PER LITRE here (test kits read per litre); convert to per kg with seawater density.
// Alkalinity of a rise is in dKH (1 dKH = 0.35665 meq/L, units.hpp) unless the name says meq.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "tidewright/common/parameter.hpp"
#include "tidewright/common/result.hpp"

namespace tw::additives {

// ---------------------------------------------------------------- 1. Elements
enum class Element { H, C, O, Na, Mg, S, Cl, Ca, K };
// IUPAC/CIAAW abridged standard atomic weights [g/mol] (facts.md 5: H 1.008, C 12.011,
// O 15.999, Na 22.990, Mg 24.305, S 32.06, Cl 35.45, Ca 40.078; K 39.098 from memory).
double atomic_weight_iupac(Element element);
const char* to_string(Element element);  // "H", "C", ...

struct ElementCount {
  Element element;
  int count;
};
// Sum of atomic weights over a formula unit [g/mol].
double molar_mass_g_mol(const std::vector<ElementCount>& formula);

// ---------------------------------------------------------------- 2. ChemicalChange
// What an amount of additive adds to the water. Alkalinity in equivalents (Dickson 1981 total
// alkalinity), everything else in mol. Negative values remove.
struct ChemicalChange {
  double alkalinity_eq = 0;
  double dic_mol = 0;
  double calcium_mol = 0;
  double magnesium_mol = 0;
  double sodium_mol = 0;
  double potassium_mol = 0;
  double chloride_mol = 0;
  double sulfate_mol = 0;

  ChemicalChange scaled(double factor) const;
  ChemicalChange& operator+=(const ChemicalChange& other);
};
ChemicalChange operator+(ChemicalChange a, const ChemicalChange& b);

// ---------------------------------------------------------------- 3. Compounds
enum class CompoundId {
  SodiumBicarbonate,             // NaHCO3
  SodiumCarbonate,               // Na2CO3 (soda ash)
  SodiumCarbonateFromBakedSoda,  // Na2CO3 made by heating NaHCO3 to constant mass
  SodiumHydroxide,               // NaOH
  CalciumHydroxide,              // Ca(OH)2 (limewater when dissolved)
  CalciumChlorideAnhydrous,      // CaCl2
  CalciumChlorideDihydrate,      // CaCl2.2H2O
  CalciumChlorideHexahydrate,    // CaCl2.6H2O
  MagnesiumChlorideHexahydrate,  // MgCl2.6H2O
  MagnesiumSulfateHeptahydrate,  // MgSO4.7H2O
  CarbonDioxide,                 // CO2 (gas)
};

enum class Phase { Solid, Gas };

// Solubility in water: grams of ANHYDROUS salt per 100 g of water (facts.md 6 convention).
struct SolubilityPoint {
  double temperature_c;
  double g_anhydrous_per_100g_water;
};

struct Compound {
  CompoundId id;
  std::string key;      // stable identifier for files and the command line, e.g. "sodium_bicarbonate"
  std::string name;     // e.g. "Sodium bicarbonate (baking soda)"
  std::string formula;  // e.g. "NaHCO3", "CaCl2.2H2O"
  std::string label;    // short name for a choice when two compounds share a formula; empty: the formula
  std::vector<ElementCount> formula_unit;  // including water of hydration
  int waters_of_hydration = 0;
  Phase phase = Phase::Solid;
  ChemicalChange per_mole;  // change per mole of formula unit
  bool caustic = false;     // strong base: burns skin and eyes (NaOH, Ca(OH)2)
  double crystal_density_g_ml = 0;  // of the solid (from memory: unverified), 0 for gases
  std::vector<SolubilityPoint> solubility;  // ascending temperature; empty = not tabulated
  std::string solubility_source;            // citation of the table
  std::string solubility_note;              // where the data is thin or the solid phase changes
  std::string signal_word;                  // GHS: "Danger", "Warning" or "" (not classified)
  std::vector<std::string> hazard_statements;  // e.g. "H314 causes severe skin burns and eye damage"
  std::string hazard_source;
  std::vector<std::string> cautions;        // handling advice (common practice unless cited)
  std::string note;                         // preparation or other remarks

  double molar_mass_g_mol() const;            // of the formula unit as sold (with water)
  double anhydrous_molar_mass_g_mol() const;  // without water of hydration
};

// Every compound, one row each, in CompoundId order.
const std::vector<Compound>& catalog();
const Compound& compound(CompoundId id);
// By key ("sodium_bicarbonate") or formula ("NaHCO3"), case-insensitive. The error lists the
// accepted keys.
Result<const Compound*> find_compound(const std::string& key_or_formula);

// Solubility at a temperature by linear interpolation in the compound's table. Refuses
// temperatures outside the tabulated range and compounds without a table (field
// "temperature_c" or "compound"). `note` says when the interpolation spans thin data.
// Solubility at a temperature, interpolated linearly between the table's points; outside the
// table refused (field "temperature_c", the table's range in the message).
struct Solubility {
  double g_anhydrous_per_100g_water = 0;
  // The same saturation as grams of the compound as sold (a hydrate with its water of
  // crystallization) per 100 g of added water, converted by molar mass; unset when the
  // hydrate dissolves in any amount (its own water cannot saturate the solution).
  std::optional<double> g_as_sold_per_100g_water;
  std::string source;
  std::string note;
};
Result<Solubility> solubility_at(const Compound& compound, double temperature_c);
// The molar-mass conversion used by solubility_at (additives_catalog.cpp has the formula).
std::optional<double> as_sold_per_100g_water(double g_anhydrous_per_100g_water, double anhydrous_molar_mass_g_mol,
                                             double molar_mass_g_mol);

// Saturated limewater (Ca(OH)2 in fresh water) at a temperature 0..40 C: the one strength used
// everywhere (plan safety checks, consumption estimate, stocks). Strength per litre of solution
// at the UPPER bound of published solubility (handbook table; Bates, Bower & Smith 1956 at
// 25 C is lower), so every safety check assumes the strongest limewater a keeper can have.
// Retrograde: weaker when warmer. 20 C -> 1.73 g/L.
struct LimewaterStrength {
  double temperature_c = 25;
  double calcium_hydroxide_mol_per_l = 0;
  double alkalinity_meq_per_ml = 0;  // 2 eq per mol Ca(OH)2
  double calcium_mg_per_ml = 0;
  double g_per_l = 0;                // Ca(OH)2 per litre
  std::string source;
};
Result<LimewaterStrength> saturated_limewater(double temperature_c);

// 2 NaHCO3 -> Na2CO3 + H2O + CO2: mass of sodium carbonate left after heating baking soda to
// constant mass, ratio 105.988/(2*84.006) = 0.6308 (facts.md 6, stoichiometry).
double baked_soda_mass_ratio();
double sodium_carbonate_from_baked_soda_g(double sodium_bicarbonate_g);

// ---------------------------------------------------------------- 4. Tank arithmetic
// The dosed parameters of tw::Parameter (common/parameter.hpp: names, units "dKH", "mg/L").
using tw::Parameter;

// Change of concentration per litre when `change` is mixed into `volume_l` litres.
struct LitreChange {
  double alkalinity_dkh = 0;
  double alkalinity_meq_l = 0;
  double dic_mmol_l = 0;
  double calcium_mg_l = 0;
  double magnesium_mg_l = 0;
  double sodium_mg_l = 0;
  double potassium_mg_l = 0;
  double chloride_mg_l = 0;
  double sulfate_mg_l = 0;
};
LitreChange change_per_litre(const ChemicalChange& change, double volume_l);
// The rise of one parameter (dKH or mg/L) from a change in a volume.
double rise_of(Parameter parameter, const ChemicalChange& change, double volume_l);
// The change of `parameter` that a rise means in a volume, in mol (eq for alkalinity).
double amount_for_rise(Parameter parameter, double rise, double volume_l);

// Grams of a dry compound that raise `parameter` by `rise` (dKH or mg/L) in `volume_l` L.
// Fails when the compound does not change that parameter (field "compound").
Result<double> grams_for_rise(CompoundId id, Parameter parameter, double rise, double volume_l);

// ---------------------------------------------------------------- 5. Stock solutions
struct Ingredient {
  CompoundId compound;
  double grams_per_l = 0;  // of the compound as sold (with its water), per L of FINISHED solution
};
struct StockRecipe {
  std::string name;
  std::vector<Ingredient> ingredients;
  double temperature_c = 25;  // temperature at which the stock is kept
};
struct StockStrength {
  ChemicalChange per_ml;  // what 1 mL adds
  double alkalinity_meq_per_ml = 0;
  double dic_mmol_per_ml = 0;
  double calcium_mg_per_ml = 0;
  double magnesium_mg_per_ml = 0;
  // Highest fraction of solubility reached by any ingredient (1 = saturated).
  double saturation_fraction = 0;
  bool caustic = false;
  std::vector<std::string> notes;  // e.g. "calcium hydroxide above saturation: excess settles"
};
// Strength of a recipe. Errors (field "ingredients[i].grams_per_l") when an ingredient is over
// its solubility at the temperature (the message gives the limit in g/L), or when the mix would
// precipitate (calcium together with carbonate, bicarbonate or hydroxide). Calcium hydroxide is
// the exception: it is capped at saturation (limewater), excess is noted, not an error.
// Water in the finished litre is estimated conservatively by letting the solid take its
// crystal volume (real solutions take less), so the check errs on the safe side.
Result<StockStrength> stock_strength(const StockRecipe& recipe);

// "dose_ml of the stock raises tank_volume_l litres by rise (dKH or mg/L)".
struct TargetEffect {
  Parameter parameter = Parameter::Alkalinity;
  double rise = 0.1;
  double dose_ml = 1.0;
  double tank_volume_l = 100.0;
};
struct RecipeForEffect {
  CompoundId compound;
  double grams_per_l = 0;  // of the compound as sold, per L of finished solution
  StockStrength strength;
};
// Inverse of stock_strength for one compound; fails (field "rise" or "dose_ml") when the
// recipe would exceed the compound's solubility at temperature_c, naming the largest possible
// rise for that dose.
Result<RecipeForEffect> recipe_for_effect(CompoundId compound, const TargetEffect& target,
                                          double temperature_c);

// The strongest stock of one compound that stock_strength accepts at temperature_c: grams of
// the compound as sold per litre of finished solution, just under its solubility as
// stock_strength judges it (crystal-volume water estimate included), found by bisection to
// 0.01 g/L and capped at ranges::kStockGPerL. For a field's accepted range, so a strength too
// strong is refused as it is typed. Errors: temperature outside the compound's solubility
// table (field "temperature_c"); calcium hydroxide and gases (field "compound": limewater has
// its own strength, saturated_limewater).
Result<double> max_stock_g_per_l(CompoundId compound, double temperature_c);

// ---------------------------------------------------------------- 6. A user's own product
// Described by its label only: "dose_ml raises tank_volume_l litres by rise units".
struct LabelClaim {
  std::string name;
  Parameter parameter = Parameter::Alkalinity;
  double dose_ml = 1;
  double tank_volume_l = 100;
  double rise = 0.1;  // dKH for alkalinity, mg/L for calcium and magnesium
  // Alkalinity products: DIC added per equivalent. 1 = bicarbonate, 0.5 = carbonate (default,
  // an assumption: labels rarely say), 0 = hydroxide. Used for pH and Omega after a dose.
  double dic_per_alkalinity_eq = 0.5;
  bool caustic = false;  // the user says the product is a strong base
};
Result<StockStrength> strength_from_label(const LabelClaim& claim);

// ---------------------------------------------------------------- 7. Additive
// What the planner schedules and the journal logs: effect per unit dosed.
enum class DoseUnit { Millilitre, Gram };
const char* to_string(DoseUnit unit);  // "mL", "g"

// How an additive was described, so a plan input file can be written back the way it was read
// (plan_input_to_json): exactly one is set by the constructors below.
struct LimewaterSpec {
  double temperature_c = 25;
  double fraction_of_saturation = 1;
};
struct AdditiveOrigin {
  std::optional<CompoundId> compound;
  std::optional<StockRecipe> stock;
  std::optional<LimewaterSpec> limewater;
  std::optional<LabelClaim> label;
};

struct Additive {
  std::string key;   // identifier, e.g. "sodium_carbonate" or a stock's name
  std::string name;  // shown to the user
  DoseUnit unit = DoseUnit::Millilitre;
  ChemicalChange per_unit;  // what 1 mL or 1 g adds
  bool caustic = false;
  bool limewater = false;   // planner: volume bounded by evaporation
  std::vector<CompoundId> compounds;  // for cautions (empty for label-only products)
  AdditiveOrigin origin;
};
// A dry compound dosed by the gram.
Additive additive_from_compound(CompoundId id);
// A stock solution dosed by the mL (errors as stock_strength).
Result<Additive> additive_from_stock(const StockRecipe& recipe);
// A labelled product dosed by the mL.
Result<Additive> additive_from_label(const LabelClaim& claim);
// Saturated limewater at the temperature, dosed by the mL; fraction_of_saturation 0..1 for a
// stock known to be weaker (settled, partly carbonated).
Result<Additive> limewater_additive(double temperature_c, double fraction_of_saturation = 1.0);
// What `amount` (mL or g) of the additive adds.
ChemicalChange dose_effect(const Additive& additive, double amount);
// Cautions to print with any use of the additive (compound cautions, caustic notice with
// deference to local codes and licensed practice). Empty for mild additives.
std::vector<std::string> cautions_for(const Additive& additive);

// ---------------------------------------------------------------- 8. Continuous sources
// A calcium reactor (or any flow-through source) described by measured output. The effluent
// replaces tank water, so the net addition is flow x (effluent - tank).
struct ContinuousSource {
  std::string name = "calcium reactor";
  double flow_ml_per_min = 0;          // accepted 0..1000
  double effluent_alkalinity_dkh = 0;  // accepted 0..100
  double effluent_calcium_mg_l = 0;    // accepted 0..2000
  double effluent_magnesium_mg_l = -1; // optional, < 0 = not measured (no Mg change counted)
};
struct DailyAddition {
  ChemicalChange per_day;              // net mol (eq) per day
  double alkalinity_meq_per_day = 0;
  double calcium_mg_per_day = 0;
  double magnesium_mg_per_day = 0;
  double alkalinity_dkh_per_day = 0;   // in the system volume
  double calcium_mg_l_per_day = 0;
  double magnesium_mg_l_per_day = 0;
  double calcium_mg_per_meq = 0;       // of the net addition; 20.04 = calcification ratio
  std::vector<std::string> notes;
};
struct TankLevels {
  double alkalinity_dkh = 8;
  double calcium_mg_l = 420;
  double magnesium_mg_l = 1300;
};
Result<DailyAddition> daily_addition(const ContinuousSource& source, const TankLevels& tank,
                                     double system_volume_l);

// How a source's net addition of one parameter compares with the consumption (both per day,
// same unit). The addition is proportional to the flow at fixed effluent and tank levels, so
// the flow that would match is flow / share. A share within 15 % of 1 counts as a match
// [our choice: about the spread of two hobby test kits]. No matching flow when the source
// adds nothing or removes the parameter.
struct Coverage {
  double share = 0;                         // added / consumed
  std::optional<double> matching_flow_ml_per_min;
  bool matches = false;
};
Result<Coverage> coverage(double added_per_day, double consumed_per_day, double flow_ml_per_min);

}  // namespace tw::additives
