// pH scales: names, parsing and conversion between total, seawater, free and NBS scales.
// The ratios themselves are computed once per Constants (constants.cpp).
#include <string>

#include "tidewright/carbonate/carbonate.hpp"

namespace tw::carbonate {

const char* to_string(PhScale scale) {
  switch (scale) {
    case PhScale::Total: return "total";
    case PhScale::Seawater: return "sws";
    case PhScale::Free: return "free";
    case PhScale::NBS: return "nbs";
  }
  return "total";
}

Result<PhScale> ph_scale_from_string(const std::string& text) {
  std::string t;
  for (char c : text) t += static_cast<char>((c >= 'A' && c <= 'Z') ? c - 'A' + 'a' : c);
  if (t == "total" || t == "t") return PhScale::Total;
  if (t == "sws" || t == "seawater") return PhScale::Seawater;
  if (t == "free" || t == "f") return PhScale::Free;
  if (t == "nbs" || t == "nbs/iupac") return PhScale::NBS;
  return Error{"ph_scale", "ph_scale '" + text + "' is not one of total, sws, free, nbs"};
}

double ph_offset_from_total(const Constants& constants, PhScale scale) {
  switch (scale) {
    case PhScale::Total: return 0.0;
    case PhScale::Seawater: return constants.ph_sws_minus_total;
    case PhScale::Free: return constants.ph_free_minus_total;
    case PhScale::NBS: return constants.ph_nbs_minus_total;
  }
  return 0.0;
}

double convert_ph(const Constants& constants, double ph, PhScale from, PhScale to) {
  return ph - ph_offset_from_total(constants, from) + ph_offset_from_total(constants, to);
}

}  // namespace tw::carbonate
