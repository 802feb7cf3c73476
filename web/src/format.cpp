#include "format.hpp"

#include <cctype>
#include <algorithm>
#include <cmath>
#include <fmt/format.h>

#include "tidewright/carbonate/uncertainty.hpp"
#include "tidewright/common/datetime.hpp"

namespace twapp::fmtx {

namespace au = tw::units;
namespace jn = tw::journal;

std::string fixed(double value, int decimals) {
  if (!std::isfinite(value)) return "—";
  std::string s = fmt::format("{:.{}f}", value, decimals);
  if (s.size() > 1 && s[0] == '-') {
    // "-0.0" is shown as "0.0"; real negatives get a proper minus sign.
    if (s.find_first_not_of("-0.") == std::string::npos) return s.substr(1);
    return "\u2212" + s.substr(1);
  }
  return s;
}

std::string fixed_exact(double value, int decimals) {
  constexpr int kMostDecimals = 6;
  for (int d = std::max(decimals, 0); d < kMostDecimals; ++d) {
    const double scale = std::pow(10.0, d);
    if (std::fabs(std::round(value * scale) / scale - value) <= 1e-9 * std::max(1.0, std::fabs(value))) return fixed(value, d);
  }
  return fixed(value, kMostDecimals);
}

std::string with_u(double value, double u, const char* unit) {
  if (tw::carbonate::taken_as_exact(value, u))
    return fmt::format("{:.4g}", value) + (*unit ? std::string(" ") + unit : "") + " (as given)";
  const int d = tw::carbonate::decimals_for_uncertainty(u);
  return fixed(value, d) + " \u00b1 " + fixed(u, d) + (*unit ? std::string(" ") + unit : "");
}

std::string between_95(double value, double u, double floor, const char* unit) {
  const int d = tw::carbonate::decimals_for_uncertainty(u);
  const tw::carbonate::Range r = tw::carbonate::range95(value, u, floor);
  return "between " + fixed(r.low, d) + " and " + fixed(r.high, d) + (*unit ? std::string(" ") + unit : "");
}

UnitShown alkalinity_shown(au::AlkalinityUnit unit) {
  switch (unit) {
    case au::AlkalinityUnit::DKH: return {"dKH", 1, 0.1};
    case au::AlkalinityUnit::MeqPerL: return {"meq/L", 2, 0.05};
    case au::AlkalinityUnit::MgPerLCaCO3: return {"mg/L CaCO\u2083", 0, 2};
    case au::AlkalinityUnit::UmolPerKg: return {"\u03bcmol/kg", 0, 20};
  }
  return {"dKH", 1, 0.1};
}

double alkalinity_from_dkh(double dkh, au::AlkalinityUnit unit, double density) {
  return au::alkalinity_from_umol_kg(au::alkalinity_to_umol_kg(dkh, au::AlkalinityUnit::DKH, density), unit, density);
}
double alkalinity_to_dkh(double value, au::AlkalinityUnit unit, double density) {
  return au::alkalinity_from_umol_kg(au::alkalinity_to_umol_kg(value, unit, density), au::AlkalinityUnit::DKH, density);
}
std::string alkalinity_text(double dkh, au::AlkalinityUnit unit, double density) {
  const UnitShown u = alkalinity_shown(unit);
  return fixed(alkalinity_from_dkh(dkh, unit, density), u.decimals) + " " + u.unit;
}

const char* temperature_unit_text(jn::TemperatureUnit unit) {
  return unit == jn::TemperatureUnit::Fahrenheit ? "\u00b0F" : "\u00b0C";
}
double temperature_shown(double c, jn::TemperatureUnit unit) {
  return au::temperature_from_celsius(c, unit);
}
double temperature_from_shown(double v, jn::TemperatureUnit unit) {
  return au::temperature_to_celsius(v, unit);
}
std::string temperature_text(double c, jn::TemperatureUnit unit) {
  return fixed(temperature_shown(c, unit), 1) + " " + temperature_unit_text(unit);
}

const char* volume_unit_text(au::VolumeUnit unit) { return unit == au::VolumeUnit::UsGallon ? "gal" : "L"; }
std::string volume_text(double litres, au::VolumeUnit unit) {
  const double v = au::volume_from_litres(litres, unit);
  return fixed(v, v < 100 ? 1 : 0) + " " + volume_unit_text(unit);
}

const char* ph_scale_label(tw::carbonate::PhScale scale) {
  switch (scale) {
    case tw::carbonate::PhScale::NBS: return "NBS";
    case tw::carbonate::PhScale::Total: return "total";
    case tw::carbonate::PhScale::Seawater: return "seawater";
    case tw::carbonate::PhScale::Free: return "free";
  }
  return "NBS";
}

double ph_on_scale(const tw::carbonate::CarbonateState& s, tw::carbonate::PhScale scale) {
  switch (scale) {
    case tw::carbonate::PhScale::NBS: return s.ph_nbs;
    case tw::carbonate::PhScale::Total: return s.ph_total;
    case tw::carbonate::PhScale::Seawater: return s.ph_sws;
    case tw::carbonate::PhScale::Free: return s.ph_free;
  }
  return s.ph_total;
}

const char* system_kind_label(jn::SystemKind k) {
  switch (k) {
    case jn::SystemKind::ReefDisplay: return "Reef display";
    case jn::SystemKind::CoralGrowOut: return "Coral grow-out";
    case jn::SystemKind::ShellfishLarvalCulture: return "Larval culture";
    case jn::SystemKind::FishOnly: return "Fish only";
    case jn::SystemKind::Other: return "Other";
  }
  return "?";
}

std::string local_time_text(std::int64_t unix_s, int utc_offset_minutes) {
  const std::int64_t local = unix_s + std::int64_t{utc_offset_minutes} * 60;
  std::int64_t days = local / 86400;
  std::int64_t secs = local % 86400;
  if (secs < 0) {
    secs += 86400;
    days -= 1;
  }
  const auto d = tw::datetime::civil_from_days(days);
  return fmt::format("{:04}-{:02}-{:02} {:02}:{:02}", d.year, d.month, d.day, secs / 3600, (secs / 60) % 60);
}

std::string formula_text(const std::string& ascii) {
  static const char* const kSubscript[] = {"\u2080", "\u2081", "\u2082", "\u2083", "\u2084",
                                           "\u2085", "\u2086", "\u2087", "\u2088", "\u2089"};
  std::string out;
  bool counting = false;  // the digits so far follow an element or a bracket ("Cl12"), not a dot ("2H2O")
  char before = '.';
  for (const char ch : ascii) {
    const bool digit = ch >= '0' && ch <= '9';
    counting = digit && (counting || std::isalpha(static_cast<unsigned char>(before)) || before == ')');
    if (counting) {
      out += kSubscript[ch - '0'];
    } else {
      out += ch == '.' ? std::string("\u00b7") : std::string(1, ch);
    }
    before = ch;
  }
  return out;
}

}  // namespace twapp::fmtx
