#include "tidewright/common/units.hpp"

#include <algorithm>
#include <cctype>

namespace tw::units {
namespace {

std::string lower(std::string s) {
  std::transform(s.begin(), s.end(), s.begin(),
                 [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return s;
}

// umol/kg per one unit of `unit`, given density in kg/L.
double alkalinity_umol_kg_per_unit(AlkalinityUnit unit, double density_kg_per_l) {
  switch (unit) {
    case AlkalinityUnit::UmolPerKg: return 1.0;
    case AlkalinityUnit::MeqPerL: return 1000.0 / density_kg_per_l;
    case AlkalinityUnit::DKH: return kMeqPerLPerDKH * 1000.0 / density_kg_per_l;
    case AlkalinityUnit::MgPerLCaCO3: return 1000.0 / kMgCaCO3PerMeq / density_kg_per_l;
  }
  return 1.0;
}

double molar_mass(Ion ion) {
  switch (ion) {
    case Ion::Calcium: return kMolarMassCa;
    case Ion::Magnesium: return kMolarMassMg;
    case Ion::Boron: return kMolarMassB;
  }
  return kMolarMassCa;
}

double ion_umol_kg_per_unit(ConcentrationUnit unit, Ion ion, double density_kg_per_l) {
  switch (unit) {
    case ConcentrationUnit::MgPerL: return 1000.0 / molar_mass(ion) / density_kg_per_l;
    case ConcentrationUnit::MmolPerKg: return 1000.0;
    case ConcentrationUnit::UmolPerKg: return 1.0;
  }
  return 1.0;
}

}  // namespace

const char* to_string(AlkalinityUnit unit) {
  switch (unit) {
    case AlkalinityUnit::UmolPerKg: return "umol/kg";
    case AlkalinityUnit::MeqPerL: return "meq/L";
    case AlkalinityUnit::DKH: return "dKH";
    case AlkalinityUnit::MgPerLCaCO3: return "mg/L CaCO3";
  }
  return "?";
}

Result<AlkalinityUnit> alkalinity_unit_from_string(const std::string& text) {
  const std::string t = lower(text);
  if (t == "umol/kg" || t == "umol_kg" || t == "µmol/kg") return AlkalinityUnit::UmolPerKg;
  if (t == "meq/l" || t == "meq_l" || t == "mmol/l") return AlkalinityUnit::MeqPerL;
  if (t == "dkh") return AlkalinityUnit::DKH;
  if (t == "mg/l caco3" || t == "mg/l" || t == "ppm" || t == "mg_l_caco3") return AlkalinityUnit::MgPerLCaCO3;
  return Error{"alkalinity unit", "alkalinity unit '" + text +
                                      "' is not known; accepted: umol/kg, meq/L, dKH, mg/L CaCO3"};
}

double alkalinity_to_umol_kg(double value, AlkalinityUnit unit, double density_kg_per_l) {
  return value * alkalinity_umol_kg_per_unit(unit, density_kg_per_l);
}
double alkalinity_from_umol_kg(double umol_kg, AlkalinityUnit unit, double density_kg_per_l) {
  return umol_kg / alkalinity_umol_kg_per_unit(unit, density_kg_per_l);
}

const char* to_string(ConcentrationUnit unit) {
  switch (unit) {
    case ConcentrationUnit::MgPerL: return "mg/L";
    case ConcentrationUnit::MmolPerKg: return "mmol/kg";
    case ConcentrationUnit::UmolPerKg: return "umol/kg";
  }
  return "?";
}

Result<ConcentrationUnit> concentration_unit_from_string(const std::string& text) {
  const std::string t = lower(text);
  if (t == "mg/l" || t == "ppm" || t == "mg_l") return ConcentrationUnit::MgPerL;
  if (t == "mmol/kg" || t == "mmol_kg") return ConcentrationUnit::MmolPerKg;
  if (t == "umol/kg" || t == "umol_kg" || t == "µmol/kg") return ConcentrationUnit::UmolPerKg;
  return Error{"concentration unit",
               "concentration unit '" + text + "' is not known; accepted: mg/L, mmol/kg, umol/kg"};
}

double ion_to_umol_kg(double value, ConcentrationUnit unit, Ion ion, double density_kg_per_l) {
  return value * ion_umol_kg_per_unit(unit, ion, density_kg_per_l);
}
double ion_from_umol_kg(double umol_kg, ConcentrationUnit unit, Ion ion, double density_kg_per_l) {
  return umol_kg / ion_umol_kg_per_unit(unit, ion, density_kg_per_l);
}

const char* to_string(VolumeUnit unit) { return unit == VolumeUnit::Litre ? "L" : "gal"; }

Result<VolumeUnit> volume_unit_from_string(const std::string& text) {
  const std::string t = lower(text);
  if (t == "l" || t == "litre" || t == "liter" || t == "litres" || t == "liters") return VolumeUnit::Litre;
  if (t == "gal" || t == "usgal" || t == "gallon" || t == "gallons") return VolumeUnit::UsGallon;
  return Error{"volume unit", "volume unit '" + text + "' is not known; accepted: L, gal (US)"};
}

double volume_to_litres(double value, VolumeUnit unit) {
  return unit == VolumeUnit::Litre ? value : us_gallons_to_litres(value);
}
double volume_from_litres(double litres, VolumeUnit unit) {
  return unit == VolumeUnit::Litre ? litres : litres_to_us_gallons(litres);
}

const char* to_string(TemperatureUnit unit) { return unit == TemperatureUnit::Celsius ? "C" : "F"; }

Result<TemperatureUnit> temperature_unit_from_string(const std::string& text) {
  const auto b = text.find_first_not_of(" \t");
  const auto e = text.find_last_not_of(" \t");
  const std::string t = b == std::string::npos ? "" : lower(text.substr(b, e - b + 1));
  if (t == "c" || t == "degc" || t == "\xc2\xb0" "c" || t == "celsius") return TemperatureUnit::Celsius;
  if (t == "f" || t == "degf" || t == "\xc2\xb0" "f" || t == "fahrenheit") return TemperatureUnit::Fahrenheit;
  return Error{"temperature unit", "temperature unit '" + text + "' is not known; accepted: C, F"};
}

double temperature_to_celsius(double value, TemperatureUnit unit) {
  return unit == TemperatureUnit::Celsius ? value : fahrenheit_to_celsius(value);
}
double temperature_from_celsius(double celsius, TemperatureUnit unit) {
  return unit == TemperatureUnit::Celsius ? celsius : celsius_to_fahrenheit(celsius);
}
double temperature_difference_to_celsius(double value, TemperatureUnit unit) {
  return unit == TemperatureUnit::Celsius ? value : value * 5.0 / 9.0;
}

}  // namespace tw::units
