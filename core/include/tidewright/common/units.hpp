// Unit conversions at the edges of the core. The core itself computes per kg of seawater
// (umol/kg, mmol/kg) and in degrees C and litres; test kits report per litre, so per-litre
// units convert with the seawater density (kg/L) at the sample's salinity and temperature
// (see seawater.hpp: density_kg_per_l).
#pragma once

#include <string>

#include "tidewright/common/result.hpp"

namespace tw::units {

// ------------------------------------------------------------ alkalinity
enum class AlkalinityUnit { UmolPerKg, MeqPerL, DKH, MgPerLCaCO3 };

// One German degree of carbonate hardness is 10 mg CaO per litre (ChemLin, "Deutscher
// Haertegrad"); with IUPAC atomic weights CaO = 56.077 g/mol, so 1 dKH = 20/56.077 meq/L
// = 0.35665 meq/L (facts.md 5: 1 dKH = 0.35665 meq/L = 17.848 mg/L as CaCO3).
inline constexpr double kMolarMassCaO = 56.077;     // g/mol, IUPAC abridged atomic weights
inline constexpr double kMolarMassCaCO3 = 100.086;  // g/mol, IUPAC abridged atomic weights
inline constexpr double kMeqPerLPerDKH = 20.0 / kMolarMassCaO;         // 0.356652...
inline constexpr double kMgCaCO3PerMeq = kMolarMassCaCO3 / 2.0;        // 50.043 mg per meq

const char* to_string(AlkalinityUnit unit);  // "umol/kg", "meq/L", "dKH", "mg/L CaCO3"
Result<AlkalinityUnit> alkalinity_unit_from_string(const std::string& text);

// density_kg_per_l: seawater density at the sample's salinity and temperature (about 1.023).
double alkalinity_to_umol_kg(double value, AlkalinityUnit unit, double density_kg_per_l);
double alkalinity_from_umol_kg(double umol_kg, AlkalinityUnit unit, double density_kg_per_l);

// ------------------------------------------------------------ calcium, magnesium, boron
inline constexpr double kMolarMassCa = 40.078;  // g/mol, IUPAC
inline constexpr double kMolarMassMg = 24.305;  // g/mol, IUPAC
inline constexpr double kMolarMassB = 10.81;    // g/mol, IUPAC abridged atomic weight of boron
enum class ConcentrationUnit { MgPerL, MmolPerKg, UmolPerKg };
// Boron counts as the element: mg/L of boron (B), not of borate or boric acid.
enum class Ion { Calcium, Magnesium, Boron };
const char* to_string(ConcentrationUnit unit);  // "mg/L", "mmol/kg", "umol/kg"
Result<ConcentrationUnit> concentration_unit_from_string(const std::string& text);
double ion_to_umol_kg(double value, ConcentrationUnit unit, Ion ion, double density_kg_per_l);
double ion_from_umol_kg(double umol_kg, ConcentrationUnit unit, Ion ion, double density_kg_per_l);

// ------------------------------------------------------------ temperature
// The only place that converts degrees Fahrenheit (NIST SP 811: t/C = (t/F - 32)/1.8).
inline double fahrenheit_to_celsius(double f) { return (f - 32.0) * 5.0 / 9.0; }
inline double celsius_to_fahrenheit(double c) { return c * 9.0 / 5.0 + 32.0; }
enum class TemperatureUnit { Celsius, Fahrenheit };
const char* to_string(TemperatureUnit unit);  // "C", "F"
// "C", "degC", "celsius", "\u00b0C"; the same for F; any case, spaces trimmed. Error field "temperature unit".
Result<TemperatureUnit> temperature_unit_from_string(const std::string& text);
// A temperature in `unit` to degrees C, and back.
double temperature_to_celsius(double value, TemperatureUnit unit);
double temperature_from_celsius(double celsius, TemperatureUnit unit);
// A temperature DIFFERENCE (a precision, a width) in `unit` to kelvin/degrees C: no offset.
double temperature_difference_to_celsius(double value, TemperatureUnit unit);

// ------------------------------------------------------------ volume
inline constexpr double kLitresPerUsGallon = 3.785411784;  // exact by definition (231 in^3)
inline double us_gallons_to_litres(double gal) { return gal * kLitresPerUsGallon; }
inline double litres_to_us_gallons(double l) { return l / kLitresPerUsGallon; }
enum class VolumeUnit { Litre, UsGallon };
const char* to_string(VolumeUnit unit);  // "L", "gal"
Result<VolumeUnit> volume_unit_from_string(const std::string& text);
double volume_to_litres(double value, VolumeUnit unit);
double volume_from_litres(double litres, VolumeUnit unit);

}  // namespace tw::units
