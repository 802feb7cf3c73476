// What a test kit or meter measures: one enum for the whole program (journal, estimate,
// additives, plan, shell and app) and ONE table of its names, units, typical kit precision
// and default target band. Every front end reads names, units and bands from here.
#pragma once

#include <optional>
#include <span>
#include <string>

#include "tidewright/common/result.hpp"

namespace tw {

// The first three are the dosed parameters (kDosedParameters, in this order: code indexes
// arrays of three by static_cast<int>(p)).
enum class Parameter {
  Alkalinity, Calcium, Magnesium, PH, Salinity, SpecificGravity, Temperature,
  Nitrate, Phosphate, Other
};

// One row of the parameter table.
struct ParameterInfo {
  Parameter parameter;
  const char* name;        // in files, CSV cells and on the command line: "alkalinity", "specific_gravity"
  const char* label;       // for people: "Alkalinity", "pH", "Specific gravity"
  const char* unit;        // canonical unit of the journal, estimate and plan: "dKH", "mg/L", "C"; "" for Other
  int decimals;            // decimals to print a level in the canonical unit
  // Typical hobby-kit precision, one standard deviation, canonical unit [common practice: no
  // single source; design.md "+/-0.2-0.5 dKH"]; unset for Other.
  std::optional<double> typical_precision;
  // Dosed parameters only: default target and half-width of the target band (canonical unit)
  // [common practice: the band a reef keeper holds a level in; our choice, no single source].
  std::optional<double> default_target;
  std::optional<double> band_half_width;
};

inline constexpr Parameter kDosedParameters[] = {Parameter::Alkalinity, Parameter::Calcium,
                                                 Parameter::Magnesium};

// The table, in enum order.
std::span<const ParameterInfo> parameter_table();
const ParameterInfo& info_of(Parameter p);
inline const char* parameter_name(Parameter p) { return info_of(p).name; }
inline const char* parameter_label(Parameter p) { return info_of(p).label; }
inline const char* parameter_unit(Parameter p) { return info_of(p).unit; }
inline bool is_dosed(Parameter p) { return info_of(p).default_target.has_value(); }

// Names as in parameter_name, case-insensitive, also the short forms "alk", "kh", "ca",
// "mg", "sal", "sg", "temp", "no3", "po4". Error field "parameter".
Result<Parameter> parameter_from_name(const std::string& text);
// The same, accepting only the dosed parameters (alkalinity, calcium, magnesium).
Result<Parameter> dosed_parameter_from_name(const std::string& text);

// A target band around a target: target +/- the parameter's band half-width.
struct TargetBand {
  double target = 0, low = 0, high = 0;
};
TargetBand target_band(Parameter p, double target);
// The band around the parameter's default target (dosed parameters; zeros otherwise).
TargetBand default_target_band(Parameter p);
// Where a level stands against a band: below its low end, inside it (ends included), above
// its high end. The one rule for "out of band" that the app's overview and forecast read.
enum class BandSide { Below, Inside, Above };
BandSide band_side(const TargetBand& band, double level);

}  // namespace tw
