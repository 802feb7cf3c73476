// Numbers and units as the user sees them. The journal and the core keep canonical units
// (dKH, C, L); these helpers convert at the edge with the core's units.hpp and print with a
// fixed number of decimals per unit.
#pragma once

#include <cstdint>
#include <string>

#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/common/units.hpp"

namespace twapp::fmtx {

std::string fixed(double value, int decimals);  // "8.10"; "−" for negatives
// As fixed, with more decimals (up to 6) where `decimals` would show another number: a range's
// lower end of 0.001 mL on a field of whole mL reads "0.001", not "0".
std::string fixed_exact(double value, int decimals);

// A measured number with its standard uncertainty, digits set by u (the core's
// decimals_for_uncertainty): "8.01 ± 0.06" plus " unit" if one is given.
std::string with_u(double value, double u, const char* unit = "");
// Its 95 % range in plain words: "between 3.16 and 4.93" (+/- 1.96 u, the low end kept at or
// above floor).
std::string between_95(double value, double u, double floor = 0.0, const char* unit = "");

struct UnitShown {
  const char* unit;  // as printed
  int decimals;      // shown
  double step;       // one tap of a stepper
};

UnitShown alkalinity_shown(tw::units::AlkalinityUnit unit);
double alkalinity_from_dkh(double dkh, tw::units::AlkalinityUnit unit,
                           double density_kg_per_l = tw::journal::kNominalDensityKgPerL);
double alkalinity_to_dkh(double value, tw::units::AlkalinityUnit unit,
                         double density_kg_per_l = tw::journal::kNominalDensityKgPerL);
std::string alkalinity_text(double dkh, tw::units::AlkalinityUnit unit,
                            double density_kg_per_l = tw::journal::kNominalDensityKgPerL);

const char* temperature_unit_text(tw::units::TemperatureUnit unit);  // "°C", "°F"
double temperature_shown(double celsius, tw::units::TemperatureUnit unit);
double temperature_from_shown(double value, tw::units::TemperatureUnit unit);
std::string temperature_text(double celsius, tw::units::TemperatureUnit unit);

const char* volume_unit_text(tw::units::VolumeUnit unit);  // "L", "gal"
std::string volume_text(double litres, tw::units::VolumeUnit unit);

const char* ph_scale_label(tw::carbonate::PhScale scale);  // "NBS", "total", "seawater", "free"
double ph_on_scale(const tw::carbonate::CarbonateState& s, tw::carbonate::PhScale scale);

const char* system_kind_label(tw::journal::SystemKind k);  // "Reef display", ...

// "2026-11-30 08:05" in local time (offset from UTC in minutes).
std::string local_time_text(std::int64_t unix_s, int utc_offset_minutes);

// A compound's formula as the core's catalog writes it ("CaCl2.2H2O") the way it is printed:
// counts after an element or a bracket as subscripts, the water of hydration after a middle
// dot ("CaCl₂·2H₂O").
std::string formula_text(const std::string& ascii);

}  // namespace twapp::fmtx
