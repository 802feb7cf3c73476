// The one table of default measurement precisions (measurement_precision.hpp).
#include "tidewright/carbonate/measurement_precision.hpp"

#include <fmt/format.h>

#include "tidewright/carbonate/uncertainty.hpp"

namespace tw::carbonate {

std::optional<PrecisionDefault> default_precision(journal::Parameter p) {
  using P = journal::Parameter;
  const auto typical = journal::typical_precision(p);
  if (!typical) return std::nullopt;
  // coarse and maximum: common practice (see the header); the maxima of pH, salinity and
  // temperature are the propagation's own accepted ranges (uncertainty.hpp).
  switch (p) {
    case P::Alkalinity:
      return PrecisionDefault{*typical, 0.5, 2.0, "dKH", "alkalinity test kit", "common practice"};
    case P::Calcium:
      return PrecisionDefault{*typical, 20.0, 100.0, "mg/L", "calcium test kit", "common practice"};
    case P::PH:
      return PrecisionDefault{*typical, 0.1, kMaxUncertaintyPh, "pH (NBS)",
                              "pH meter calibrated with NBS buffers", "common practice"};
    case P::Salinity:
      return PrecisionDefault{*typical, 1.0, kMaxUncertaintySalinity, "",
                              "refractometer or hydrometer", "common practice"};
    case P::Temperature:
      return PrecisionDefault{*typical, 0.5, kMaxUncertaintyTemperatureC, "C", "thermometer",
                              "common practice"};
    default: return std::nullopt;
  }
}

Status check_precision(journal::Parameter parameter, double precision, const std::string& field) {
  const auto d = default_precision(parameter);
  const double max = d ? d->maximum : 0.0;
  const char* unit = d ? d->unit : "";
  if (precision >= 0.0 && precision <= max) return Ok{};  // false for NaN
  return Error{field, fmt::format("{} {:g} is outside the accepted range 0 to {:g}{}{} (one standard "
                                  "deviation; typical for a {}: {:g})",
                                  field, precision, max, *unit ? " " : "", unit,
                                  d ? d->instrument : "measurement", d ? d->typical : 0.0)};
}

}  // namespace tw::carbonate
