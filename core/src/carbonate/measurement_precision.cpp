// The one table of default measurement precisions (measurement_precision.hpp).
#include "tidewright/carbonate/measurement_precision.hpp"

#include <fmt/format.h>

#include "tidewright/common/units.hpp"
#include "tidewright/seawater/seawater.hpp"

namespace tw::carbonate {

std::optional<PrecisionDefault> default_precision(journal::Parameter p) {
  using P = journal::Parameter;
  const auto typical = info_of(p).typical_precision;
  if (!typical) return std::nullopt;
  // coarse and maximum: common practice (see the header); the maxima of pH, salinity and
  // temperature are the propagation's own accepted ranges (uncertainty.hpp).
  switch (p) {
    case P::Alkalinity:
      return PrecisionDefault{*typical, 0.5, 2.0, "dKH", "hobby alkalinity test kit", "common practice"};
    case P::Calcium:
      return PrecisionDefault{*typical, 20.0, 100.0, "mg/L", "hobby calcium test kit", "common practice"};
    case P::Magnesium:
      return PrecisionDefault{*typical, 50.0, 200.0, "mg/L", "hobby magnesium test kit", "common practice"};
    case P::PH:
      return PrecisionDefault{*typical, 0.1, kMaxUncertaintyPh, "pH (NBS)",
                              "hobby pH meter calibrated with NBS buffers", "common practice"};
    case P::Salinity:
      return PrecisionDefault{*typical, 1.0, kMaxUncertaintySalinity, "",
                              "hobby refractometer or hydrometer", "common practice"};
    case P::Temperature:
      return PrecisionDefault{*typical, 0.5, kMaxUncertaintyTemperatureC, "C", "hobby thermometer",
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
                                  "deviation; typical of a {}: {:g})",
                                  field, precision, max, *unit ? " " : "", unit,
                                  d ? d->instrument : "measurement", d ? d->typical : 0.0)};
}

InputUncertainties default_input_uncertainties(const Conditions& conditions, const InputPair& inputs) {
  using P = journal::Parameter;
  const double density = seawater::density_kg_per_l(conditions.salinity, conditions.temperature_c);
  const auto typical = [](P p) { return default_precision(p)->typical; };
  const auto of = [&](const Measurement& m) {
    switch (m.quantity) {
      case Quantity::Alkalinity:
        return units::alkalinity_to_umol_kg(typical(P::Alkalinity), units::AlkalinityUnit::DKH, density);
      case Quantity::PH: return typical(P::PH);
      default: return 0.0;  // laboratory quantities: no kit default
    }
  };
  InputUncertainties u;
  u.first = of(inputs.first);
  u.second = of(inputs.second);
  const bool has_ph = inputs.first.quantity == Quantity::PH || inputs.second.quantity == Quantity::PH;
  if (has_ph && inputs.ph_scale == PhScale::NBS) u.ph_scale_conversion = kPhNbsToTotalUncertainty;
  u.salinity = typical(P::Salinity);
  u.temperature_c = typical(P::Temperature);
  if (conditions.calcium_umol_kg)
    u.calcium_umol_kg = units::ion_to_umol_kg(typical(P::Calcium), units::ConcentrationUnit::MgPerL,
                                              units::Ion::Calcium, density);
  if (conditions.mg_ca_correction && conditions.magnesium_umol_kg)
    u.magnesium_umol_kg = units::ion_to_umol_kg(typical(P::Magnesium), units::ConcentrationUnit::MgPerL,
                                                units::Ion::Magnesium, density);
  if (conditions.total_boron_umol_kg)
    u.total_boron_umol_kg = kMeasuredBoronRelativeUncertainty * *conditions.total_boron_umol_kg;
  return u;
}

}  // namespace tw::carbonate
