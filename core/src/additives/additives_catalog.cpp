// Additive compounds as data: one row per compound (formula, change per mole, solubility,
// hazards), the atomic weights they are built from, solubility interpolation, saturated
// limewater and baking soda baked to sodium carbonate.
//
// Sections: 1. atomic weights  2. ChemicalChange  2b. the CaCl2 solubility table  3. the catalog
//           rows  4. lookups  5. solubility (and as the hydrate sold)  6. limewater  7. baked baking soda
#include <algorithm>
#include <cctype>
#include <cmath>

#include <fmt/format.h>

#include "tidewright/additives/additives.hpp"

namespace tw::additives {

// ================================================================ 1. Atomic weights
// IUPAC/CIAAW abridged standard atomic weights [g/mol], as listed in facts.md 5 (quoted from
// memory there, not re-fetched). K 39.098 is from memory: unverified. Check: NaHCO3 84.006.
double atomic_weight_iupac(Element element) {
  switch (element) {
    case Element::H: return 1.008;
    case Element::C: return 12.011;
    case Element::O: return 15.999;
    case Element::Na: return 22.990;
    case Element::Mg: return 24.305;
    case Element::S: return 32.06;
    case Element::Cl: return 35.45;
    case Element::Ca: return 40.078;
    case Element::K: return 39.098;
  }
  return 0.0;
}

const char* to_string(Element element) {
  switch (element) {
    case Element::H: return "H";
    case Element::C: return "C";
    case Element::O: return "O";
    case Element::Na: return "Na";
    case Element::Mg: return "Mg";
    case Element::S: return "S";
    case Element::Cl: return "Cl";
    case Element::Ca: return "Ca";
    case Element::K: return "K";
  }
  return "?";
}

double molar_mass_g_mol(const std::vector<ElementCount>& formula) {
  double sum = 0.0;
  for (const auto& part : formula) sum += atomic_weight_iupac(part.element) * part.count;
  return sum;
}

// ================================================================ 2. ChemicalChange
ChemicalChange ChemicalChange::scaled(double f) const {
  return {alkalinity_eq * f, dic_mol * f,      calcium_mol * f,  magnesium_mol * f,
          sodium_mol * f,    potassium_mol * f, chloride_mol * f, sulfate_mol * f};
}

ChemicalChange& ChemicalChange::operator+=(const ChemicalChange& o) {
  alkalinity_eq += o.alkalinity_eq;
  dic_mol += o.dic_mol;
  calcium_mol += o.calcium_mol;
  magnesium_mol += o.magnesium_mol;
  sodium_mol += o.sodium_mol;
  potassium_mol += o.potassium_mol;
  chloride_mol += o.chloride_mol;
  sulfate_mol += o.sulfate_mol;
  return *this;
}

ChemicalChange operator+(ChemicalChange a, const ChemicalChange& b) { return a += b; }

// ================================================================ 2b. CaCl2 solubility table
// Calcium chloride in water, 0-40 C: CRC Handbook of Chemistry and Physics, 98th ed. (2017),
// "Aqueous solubility of inorganic compounds at various temperatures": mass per cent of the
// anhydrous salt in the saturated solution (values as supplied by the lead engineer from that
// table; not re-read here). Stored as the handbook prints them and converted once to
// g anhydrous per 100 g water, w / (100 - w) x 100: 58.0, 64.4, 72.8, 81.3, 96.5, 112.1.
// Cross-check at 25 C: IUPAC-NIST Solubility Database (NIST SRD 106), CaCl2-H2O at 25 C with
// CaCl2.6H2O as solid, 45.30 mass % (Stoilova 1992, Bulg. Chem. Commun. 25:249), 1 % above
// the handbook's 44.83.
namespace {
constexpr const char* kCalciumChlorideSolubilitySource =
    "CRC Handbook of Chemistry and Physics, 98th ed. (2017), aqueous solubility of inorganic compounds, CaCl2 "
    "0-40 C, anhydrous basis";
struct MassPercentPoint {
  double temperature_c;
  double mass_percent_anhydrous;  // of the saturated solution
};
constexpr MassPercentPoint kCalciumChlorideCrc2017[] = {{0, 36.70},  {10, 39.19}, {20, 42.13},
                                                        {25, 44.83}, {30, 49.12}, {40, 52.85}};

// g solute per 100 g water from mass per cent of solute in the solution.
double g_per_100g_water_from_mass_percent(double mass_percent) {
  return mass_percent / (100.0 - mass_percent) * 100.0;
}

std::vector<SolubilityPoint> calcium_chloride_solubility_crc2017() {
  std::vector<SolubilityPoint> out;
  for (const auto& p : kCalciumChlorideCrc2017)
    out.push_back({p.temperature_c, g_per_100g_water_from_mass_percent(p.mass_percent_anhydrous)});
  return out;
}
}  // namespace

// ================================================================ 3. Catalog rows
namespace {

using E = Element;

// Hazard statements (GHS wording paraphrased), facts.md 11.
const char* const kH314 = "H314 causes severe skin burns and eye damage";
const char* const kH290 = "H290 may be corrosive to metals";
const char* const kH318 = "H318 causes serious eye damage";
const char* const kH315 = "H315 causes skin irritation";
const char* const kH335 = "H335 may cause respiratory irritation";
const char* const kH319 = "H319 causes serious eye irritation";

const char* const kEyesGloves = "wear eye protection and gloves (common practice)";
const char* const kLabel = "label the stock with its name and concentration; keep away from children (common practice)";

// Solubility tables cited in facts.md 6.
const char* const kChemdatabase =
    "Chemdatabase (chemister.ru), citing Comey & Hahn 1921 and Seidell";

std::vector<Compound> build_catalog() {
  std::vector<Compound> rows;

  {  // ---- sodium bicarbonate: +1 eq TA, +1 DIC (facts.md 5)
    Compound c{};
    c.id = CompoundId::SodiumBicarbonate;
    c.key = "sodium_bicarbonate";
    c.name = "Sodium bicarbonate (baking soda)";
    c.formula = "NaHCO3";
    c.formula_unit = {{E::Na, 1}, {E::H, 1}, {E::C, 1}, {E::O, 3}};
    c.per_mole.alkalinity_eq = 1;
    c.per_mole.dic_mol = 1;
    c.per_mole.sodium_mol = 1;
    c.crystal_density_g_ml = 2.20;
    c.solubility = {{0, 6.9}, {10, 8.2}, {20, 9.6}, {25, 10.4}, {30, 11.1}, {40, 12.7}, {60, 16.4}};
    c.solubility_source = kChemdatabase;
    c.hazard_source = "usually not classified under GHS (from memory: unverified)";
    c.cautions = {kLabel};
    c.note = "lowers pH slightly at the moment of dosing; the mildest alkalinity source per equivalent";
    rows.push_back(c);
  }
  {  // ---- sodium carbonate: +2 eq TA, +1 DIC
    Compound c{};
    c.id = CompoundId::SodiumCarbonate;
    c.key = "sodium_carbonate";
    c.name = "Sodium carbonate (soda ash)";
    c.formula = "Na2CO3";
    c.formula_unit = {{E::Na, 2}, {E::C, 1}, {E::O, 3}};
    c.per_mole.alkalinity_eq = 2;
    c.per_mole.dic_mol = 1;
    c.per_mole.sodium_mol = 2;
    c.crystal_density_g_ml = 2.54;
    c.solubility = {{0, 7.0},  {10, 12.2}, {20, 21.8}, {25, 29.4},
                    {30, 39.7}, {40, 48.8}, {50, 47.3}, {60, 46.4}};
    c.solubility_source = std::string(kChemdatabase) + "; maximum near 35.4 C";
    c.solubility_note =
        "the solid phase changes (decahydrate below about 32 C), so the curve is not monotonic; "
        "linear interpolation between 30 and 40 C misses the maximum near 35.4 C";
    c.signal_word = "Warning";
    c.hazard_statements = {kH319};
    c.hazard_source = "ILO ICSC 1135 (2024)";
    c.cautions = {kEyesGloves,
                  "its solution is a medium-strong base; it reacts violently with acids, giving heat and CO2 "
                  "(ILO ICSC 1135)",
                  "never mix acid and carbonate stocks in a closed container: CO2 pressure (common practice)",
                  kLabel};
    rows.push_back(c);
  }
  {  // ---- sodium carbonate made from baking soda by heating
    Compound c = rows.back();
    c.id = CompoundId::SodiumCarbonateFromBakedSoda;
    c.key = "baked_baking_soda";
    c.name = "Baking soda heated to constant mass (sodium carbonate)";
    c.label = "Na2CO3 (baked)";
    c.note =
        "made by heating NaHCO3 until its mass stops falling: 2 NaHCO3 -> Na2CO3 + H2O + CO2, "
        "mass x 0.6308 (loss 36.9 %); decomposition runs over about 87-177 C (Wu & Shih 1993); "
        "weigh before and after, and heat again if the loss is short of 36.9 % (common practice)";
    rows.push_back(c);
  }
  {  // ---- sodium hydroxide: +1 eq TA, 0 DIC
    Compound c{};
    c.id = CompoundId::SodiumHydroxide;
    c.key = "sodium_hydroxide";
    c.name = "Sodium hydroxide (lye)";
    c.formula = "NaOH";
    c.formula_unit = {{E::Na, 1}, {E::O, 1}, {E::H, 1}};
    c.per_mole.alkalinity_eq = 1;
    c.per_mole.sodium_mol = 1;
    c.caustic = true;
    c.crystal_density_g_ml = 2.13;
    c.solubility = {{0, 42.0}, {25, 100.0}};
    c.solubility_source = "from memory: unverified (about 42 g/100 g at 0 C and 100 g/100 g at 25 C)";
    c.solubility_note =
        "two remembered points only; the solution is dangerously corrosive long before it is saturated";
    c.signal_word = "Danger";
    c.hazard_statements = {kH314, kH290, kH318};
    c.hazard_source = "EU CLP Annex VI (Skin Corr. 1A, H314); supplier SDS add H290 and H318";
    c.cautions = {kEyesGloves,
                  "add solid sodium hydroxide slowly to cold water, never water onto the solid: dissolving "
                  "releases much heat",
                  "store airtight: it absorbs CO2 from air and turns into carbonate, which lowers its strength",
                  "solutions of 2 % or more are corrosive to skin and eyes (CLP bands, from memory: unverified)",
                  kLabel};
    rows.push_back(c);
  }
  {  // ---- calcium hydroxide: +2 eq TA, +1 Ca, 0 DIC
    Compound c{};
    c.id = CompoundId::CalciumHydroxide;
    c.key = "calcium_hydroxide";
    c.name = "Calcium hydroxide (slaked lime; limewater when dissolved)";
    c.formula = "Ca(OH)2";
    c.formula_unit = {{E::Ca, 1}, {E::O, 2}, {E::H, 2}};
    c.per_mole.alkalinity_eq = 2;
    c.per_mole.calcium_mol = 1;
    c.caustic = true;
    c.crystal_density_g_ml = 2.21;
    // The UPPER bound of published solubilities at each temperature, so that every check of a
    // limewater dose (pH, Omega, rise, single-dose step) assumes the strongest limewater a
    // keeper can have: real saturated limewater is 1.65-1.73 g/L at 20 C. Values, g per 100 g
    // water, and where each was found (searched 2026-12-04):
    //  - 0.189 (0 C) and 0.173 (20 C): the handbook pair quoted as "g/100 mL" in reprints of an
    //    encyclopedia data box (secondary; its primary handbook was not reachable). Read as g per
    //    100 g water they over-state strength slightly (a litre of solution holds <1 kg water),
    //    the safe side here.
    //  - 0.182 (10), 0.160 (30), 0.141 (40): from memory (CRC-style table), unverified; they lie
    //    on the smooth retrograde curve between the points above and at or above every value
    //    below.
    //  - the secondary set 0.185, 0.176, 0.165, 0.153, 0.141 (0-40 C; facts.md 6, and a reprinted
    //    textbook table found by the same search): lower or equal at every temperature.
    //  - Bates, Bower & Smith 1956 (J. Res. NBS 56:305, doi:10.6028/jres.056.040): 0.0203 mol/kg
    //    = 0.1504 g/100 g at 25 C (published, primary, the lowest).
    //  The CRC Handbook's "aqueous solubility of inorganic compounds at various temperatures"
    //  (98th ed., 2017, as copied into a public data set) has no Ca(OH)2 row. So the set
    //  below is the highest of the values found at every temperature; only Bates is primary.
    c.solubility = {{0, 0.189}, {10, 0.182}, {20, 0.173}, {30, 0.160}, {40, 0.141}};
    c.solubility_source =
        "upper bound of values found: 0.189 (0 C) and 0.173 (20 C) from a handbook pair reprinted in secondary "
        "sources, 10-40 C from memory (unverified); above the secondary set of facts.md 6 and Bates, Bower & Smith "
        "1956 (0.1504 g/100 g at 25 C, primary)";
    c.solubility_note = "retrograde (weaker when warmer); the temperature curve is approximate";
    c.signal_word = "Danger";
    c.hazard_statements = {kH315, kH318, kH335};
    c.hazard_source = "EU supplier eSDS (REACH/CLP) and ECHA dossier";
    c.cautions = {kEyesGloves,
                  "saturated limewater has pH about 12.4 (Bates et al. 1956): drip it slowly where it mixes "
                  "fast, never in one pour",
                  "avoid breathing the powder (H335)",
                  "keep limewater covered: it absorbs CO2 from air and loses strength as carbonate settles",
                  kLabel};
    rows.push_back(c);
  }
  // ---- calcium chloride, three hydration states: +1 Ca, +2 Cl
  const struct {
    CompoundId id;
    const char* key;
    const char* name;
    const char* formula;
    int waters;
    double density;
  } chlorides[] = {
      {CompoundId::CalciumChlorideAnhydrous, "calcium_chloride", "Calcium chloride, anhydrous", "CaCl2", 0, 2.15},
      {CompoundId::CalciumChlorideDihydrate, "calcium_chloride_dihydrate", "Calcium chloride dihydrate",
       "CaCl2.2H2O", 2, 1.85},
      {CompoundId::CalciumChlorideHexahydrate, "calcium_chloride_hexahydrate", "Calcium chloride hexahydrate",
       "CaCl2.6H2O", 6, 1.71},
  };
  for (const auto& row : chlorides) {
    Compound c{};
    c.id = row.id;
    c.key = row.key;
    c.name = row.name;
    c.formula = row.formula;
    c.formula_unit = {{E::Ca, 1}, {E::Cl, 2}};
    if (row.waters > 0) {
      c.formula_unit.push_back({E::H, 2 * row.waters});
      c.formula_unit.push_back({E::O, row.waters});
    }
    c.waters_of_hydration = row.waters;
    c.per_mole.calcium_mol = 1;
    c.per_mole.chloride_mol = 2;
    c.crystal_density_g_ml = row.density;
    c.solubility = calcium_chloride_solubility_crc2017();
    c.solubility_source = kCalciumChlorideSolubilitySource;
    c.solubility_note =
        "one table for all three forms: it gives the saturated solution, whichever salt was dissolved; up to 29.8 C "
        "the solid that crystallises is the hexahydrate (facts.md 6, Great Soviet Encyclopedia)";
    c.signal_word = "Warning";
    c.hazard_statements = {kH319};
    c.hazard_source = "supplier SDS via a secondary infobox";
    c.cautions = {kEyesGloves,
                  row.waters == 0 ? "the anhydrous salt heats up strongly when dissolved; add it slowly"
                                  : "dissolving the hydrate cools the solution slightly",
                  kLabel};
    rows.push_back(c);
  }
  {  // ---- magnesium chloride hexahydrate: +1 Mg, +2 Cl
    Compound c{};
    c.id = CompoundId::MagnesiumChlorideHexahydrate;
    c.key = "magnesium_chloride_hexahydrate";
    c.name = "Magnesium chloride hexahydrate";
    c.formula = "MgCl2.6H2O";
    c.formula_unit = {{E::Mg, 1}, {E::Cl, 2}, {E::H, 12}, {E::O, 6}};
    c.waters_of_hydration = 6;
    c.per_mole.magnesium_mol = 1;
    c.per_mole.chloride_mol = 2;
    c.crystal_density_g_ml = 1.57;
    c.solubility = {{0, 52.9}, {10, 53.8}, {20, 54.8}, {25, 55.5}, {30, 56.0}, {40, 58.0}};
    c.solubility_source = std::string(kChemdatabase) + ", anhydrous MgCl2 with MgCl2.6H2O as solid";
    c.hazard_source = "usually not classified under GHS (from memory: unverified)";
    c.cautions = {kLabel};
    rows.push_back(c);
  }
  {  // ---- magnesium sulfate heptahydrate: +1 Mg, +1 SO4
    Compound c{};
    c.id = CompoundId::MagnesiumSulfateHeptahydrate;
    c.key = "magnesium_sulfate_heptahydrate";
    c.name = "Magnesium sulfate heptahydrate (Epsom salt)";
    c.formula = "MgSO4.7H2O";
    c.formula_unit = {{E::Mg, 1}, {E::S, 1}, {E::O, 11}, {E::H, 14}};
    c.waters_of_hydration = 7;
    c.per_mole.magnesium_mol = 1;
    c.per_mole.sulfate_mol = 1;
    c.crystal_density_g_ml = 1.68;
    c.solubility = {{0, 22.0}, {10, 28.2}, {20, 33.7}, {30, 38.9}, {40, 44.5}};
    c.solubility_source = "from memory: unverified (handbook-style table, anhydrous MgSO4 basis)";
    c.solubility_note = "not in the project's checked facts; treat as approximate";
    c.hazard_source = "usually not classified under GHS (from memory: unverified)";
    c.cautions = {kLabel,
                  "sulfate alone raises sulfate above natural seawater over time; many keepers mix it with "
                  "magnesium chloride (common practice)"};
    rows.push_back(c);
  }
  {  // ---- carbon dioxide: +1 DIC, 0 TA
    Compound c{};
    c.id = CompoundId::CarbonDioxide;
    c.key = "carbon_dioxide";
    c.name = "Carbon dioxide";
    c.formula = "CO2";
    c.formula_unit = {{E::C, 1}, {E::O, 2}};
    c.phase = Phase::Gas;
    c.per_mole.dic_mol = 1;
    c.hazard_source = "gas under pressure in cylinders (from memory: unverified); OSHA limit 5000 ppm "
                      "8-h TWA";
    c.signal_word = "Warning";
    c.hazard_statements = {"H280 contains gas under pressure; may explode if heated (from memory: unverified)"};
    c.cautions = {"CO2 lowers pH and adds no alkalinity; in closed rooms it displaces air (common practice)"};
    rows.push_back(c);
  }
  return rows;
}

}  // namespace

double Compound::molar_mass_g_mol() const { return additives::molar_mass_g_mol(formula_unit); }

double Compound::anhydrous_molar_mass_g_mol() const {
  const double water = 2 * atomic_weight_iupac(Element::H) + atomic_weight_iupac(Element::O);
  return molar_mass_g_mol() - waters_of_hydration * water;
}

// ================================================================ 4. Lookups
const std::vector<Compound>& catalog() {
  static const std::vector<Compound> rows = build_catalog();
  return rows;
}

const Compound& compound(CompoundId id) {
  const auto& rows = catalog();
  const auto index = static_cast<std::size_t>(id);
  assert(index < rows.size() && rows[index].id == id && "catalog rows must follow CompoundId order");
  return rows[index];
}

Result<const Compound*> find_compound(const std::string& key_or_formula) {
  // Called for every logged dose an estimate reads (tens of thousands on a farm's journal):
  // compared without copies, and the list of keys is built only for the error.
  const auto same = [&](const std::string& name) {
    return name.size() == key_or_formula.size() &&
           std::equal(name.begin(), name.end(), key_or_formula.begin(), [](char a, char b) {
             return std::tolower(static_cast<unsigned char>(a)) == std::tolower(static_cast<unsigned char>(b));
           });
  };
  for (const auto& c : catalog()) {
    if (same(c.key) || same(c.formula)) return &c;
  }
  std::string keys;
  for (const auto& c : catalog()) keys += (keys.empty() ? "" : ", ") + c.key;
  return Error{"compound", fmt::format("compound \"{}\" is unknown; accepted: {}", key_or_formula, keys)};
}

// ================================================================ 5. Solubility
Result<Solubility> solubility_at(const Compound& c, double temperature_c) {
  if (c.solubility.empty()) {
    return Error{"compound", fmt::format("{} has no solubility table (it cannot be made into a stock solution)",
                                         c.key)};
  }
  const double lo = c.solubility.front().temperature_c;
  const double hi = c.solubility.back().temperature_c;
  if (auto s = check_range("temperature_c", temperature_c, lo, hi, "C"); !s) {
    return Error{"temperature_c", s.error().message + " (solubility data for " + c.key + ")"};
  }
  Solubility out;
  out.source = c.solubility_source;
  out.note = c.solubility_note;
  out.g_anhydrous_per_100g_water = c.solubility.back().g_anhydrous_per_100g_water;
  for (std::size_t i = 0; i + 1 < c.solubility.size(); ++i) {
    const auto& a = c.solubility[i];
    const auto& b = c.solubility[i + 1];
    if (temperature_c <= b.temperature_c) {
      const double f = (temperature_c - a.temperature_c) / (b.temperature_c - a.temperature_c);
      out.g_anhydrous_per_100g_water =
          a.g_anhydrous_per_100g_water + f * (b.g_anhydrous_per_100g_water - a.g_anhydrous_per_100g_water);
      if (b.temperature_c - a.temperature_c > 10.0 && temperature_c > a.temperature_c &&
          temperature_c < b.temperature_c) {
        out.note += (out.note.empty() ? "" : "; ") +
                    fmt::format("interpolated between data points {:g} C apart", b.temperature_c - a.temperature_c);
      }
      break;
    }
  }
  out.g_as_sold_per_100g_water = as_sold_per_100g_water(out.g_anhydrous_per_100g_water,
                                                        c.anhydrous_molar_mass_g_mol(), c.molar_mass_g_mol());
  if (!out.g_as_sold_per_100g_water) {
    out.note += (out.note.empty() ? "" : "; ") +
                fmt::format("{} holds too little water of crystallization to saturate its own solution at {:g} C: "
                            "it dissolves in any amount of water",
                            c.formula, temperature_c);
  }
  return out;
}

// Grams of a hydrate that saturate 100 g of added water, from the anhydrous-basis solubility
// A [g anhydrous per 100 g water] and the molar masses: A g anhydrous come with A (r - 1) g of
// water of crystallization (r = M_hydrate / M_anhydrous), which joins the solvent, so
//     g hydrate per 100 g added water = 100 A r / (100 - A (r - 1)).
// Unset when A (r - 1) >= 100: the hydrate's own water is not enough to reach saturation.
// Check value (hand-worked): CaCl2.2H2O at 20 C, A = 72.80, r = 147.008 / 110.978 = 1.32466:
// 100 x 96.44 / (100 - 23.64) = 126.3 g per 100 g water.
std::optional<double> as_sold_per_100g_water(double g_anhydrous_per_100g_water, double anhydrous_molar_mass_g_mol,
                                             double molar_mass_g_mol) {
  const double a = g_anhydrous_per_100g_water;
  const double r = molar_mass_g_mol / anhydrous_molar_mass_g_mol;
  const double crystal_water_g = a * (r - 1.0);
  if (crystal_water_g >= 100.0) return std::nullopt;
  return 100.0 * a * r / (100.0 - crystal_water_g);
}

// ================================================================ 6. Limewater
// THE limewater strength of the project (plan safety checks, the consumption estimate, stocks):
// saturated Ca(OH)2 per litre of solution at the upper bound of published solubility (the
// calcium hydroxide row above), converted per litre assuming a litre of this dilute solution
// holds 1 kg of water: that over-states strength by at most 0.8 % (water density 0.992 at 40 C),
// erring toward more alkalinity per mL, the safe side for pH and Omega checks.
// Check value: 20 C -> 0.173 g/100 g -> 1.73 g/L, 0.02335 mol/L (M(Ca(OH)2) 74.092 g/mol).
Result<LimewaterStrength> saturated_limewater(double temperature_c) {
  const Compound& lime = compound(CompoundId::CalciumHydroxide);
  auto sol = solubility_at(lime, temperature_c);
  if (!sol) return sol.error();
  LimewaterStrength out;
  out.temperature_c = temperature_c;
  out.calcium_hydroxide_mol_per_l = sol->g_anhydrous_per_100g_water * 10.0 / lime.molar_mass_g_mol();
  out.alkalinity_meq_per_ml = 2.0 * out.calcium_hydroxide_mol_per_l;  // mol/L x 2 eq = meq/mL
  out.calcium_mg_per_ml = out.calcium_hydroxide_mol_per_l * atomic_weight_iupac(Element::Ca);
  out.g_per_l = sol->g_anhydrous_per_100g_water * 10.0;
  out.source = lime.solubility_source;
  return out;
}

// ================================================================ 7. Baked baking soda
// 2 NaHCO3 -> Na2CO3 + H2O + CO2 (facts.md 6): M(Na2CO3) / (2 M(NaHCO3)) = 0.6308.
double baked_soda_mass_ratio() {
  return compound(CompoundId::SodiumCarbonate).molar_mass_g_mol() /
         (2.0 * compound(CompoundId::SodiumBicarbonate).molar_mass_g_mol());
}

double sodium_carbonate_from_baked_soda_g(double sodium_bicarbonate_g) {
  return sodium_bicarbonate_g * baked_soda_mass_ratio();
}

}  // namespace tw::additives
