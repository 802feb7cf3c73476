// The parameter table (parameter.hpp): names, labels, units, kit precision and target bands.
#include "tidewright/common/parameter.hpp"

#include <algorithm>
#include <array>
#include <cctype>
#include <string_view>

namespace tw {
namespace {

// Sources of the figures: parameter.hpp (kit precision and target bands are common practice).
constexpr std::array<ParameterInfo, 10> kTable{{
    {Parameter::Alkalinity, "alkalinity", "Alkalinity", "dKH", 2, 0.2, 8.0, 0.5},
    {Parameter::Calcium, "calcium", "Calcium", "mg/L", 0, 10.0, 430.0, 20.0},
    {Parameter::Magnesium, "magnesium", "Magnesium", "mg/L", 0, 25.0, 1350.0, 50.0},
    {Parameter::PH, "ph", "pH", "pH", 2, 0.05, {}, {}},
    {Parameter::Salinity, "salinity", "Salinity", "psu", 1, 0.5, {}, {}},
    {Parameter::SpecificGravity, "specific_gravity", "Specific gravity", "sg", 4, 0.0005, {}, {}},
    {Parameter::Temperature, "temperature", "Temperature", "C", 1, 0.2, {}, {}},
    {Parameter::Nitrate, "nitrate", "Nitrate", "mg/L", 1, 1.0, {}, {}},
    {Parameter::Phosphate, "phosphate", "Phosphate", "mg/L", 3, 0.02, {}, {}},
    {Parameter::Other, "other", "Other", "", 2, {}, {}, {}},
}};

struct Alias {
  std::string_view text;
  Parameter parameter;
};
constexpr Alias kAliases[] = {
    {"alk", Parameter::Alkalinity}, {"kh", Parameter::Alkalinity}, {"ca", Parameter::Calcium},
    {"mg", Parameter::Magnesium},   {"sal", Parameter::Salinity},  {"sg", Parameter::SpecificGravity},
    {"temp", Parameter::Temperature}, {"no3", Parameter::Nitrate}, {"po4", Parameter::Phosphate},
};

std::string lower_trim(const std::string& s) {
  const auto b = s.find_first_not_of(" \t");
  if (b == std::string::npos) return "";
  const auto e = s.find_last_not_of(" \t");
  std::string t = s.substr(b, e - b + 1);
  std::transform(t.begin(), t.end(), t.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return t;
}

std::optional<Parameter> lookup(const std::string& text) {
  const std::string t = lower_trim(text);
  for (const auto& row : kTable)
    if (t == row.name) return row.parameter;
  for (const auto& a : kAliases)
    if (t == a.text) return a.parameter;
  return std::nullopt;
}

}  // namespace

std::span<const ParameterInfo> parameter_table() { return kTable; }

const ParameterInfo& info_of(Parameter p) {
  const auto i = static_cast<std::size_t>(p);
  return i < kTable.size() ? kTable[i] : kTable.back();
}

Result<Parameter> parameter_from_name(const std::string& text) {
  if (auto p = lookup(text)) return *p;
  std::string accepted;
  for (const auto& row : kTable) accepted += std::string(accepted.empty() ? "" : ", ") + row.name;
  return Error{"parameter", "parameter '" + text + "' is not known; accepted: " + accepted};
}

Result<Parameter> dosed_parameter_from_name(const std::string& text) {
  if (auto p = lookup(text); p && is_dosed(*p)) return *p;
  return Error{"parameter", "parameter '" + text + "' is not known; accepted: alkalinity, calcium, magnesium"};
}

TargetBand target_band(Parameter p, double target) {
  const double half = info_of(p).band_half_width.value_or(0.0);
  return TargetBand{target, target - half, target + half};
}

TargetBand default_target_band(Parameter p) {
  return target_band(p, info_of(p).default_target.value_or(0.0));
}

BandSide band_side(const TargetBand& band, double level) {
  if (level < band.low) return BandSide::Below;
  if (level > band.high) return BandSide::Above;
  return BandSide::Inside;
}

}  // namespace tw
