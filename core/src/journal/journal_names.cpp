// Journal enums <-> names, unit spellings per parameter and canonical values.
#include <cctype>
#include <cmath>

#include "tidewright/journal/journal.hpp"
#include "tidewright/common/ranges.hpp"

namespace tw::journal {

namespace {
std::string lower_trim(const std::string& text) {
  size_t b = 0, e = text.size();
  while (b < e && std::isspace(static_cast<unsigned char>(text[b]))) ++b;
  while (e > b && std::isspace(static_cast<unsigned char>(text[e - 1]))) --e;
  std::string out = text.substr(b, e - b);
  for (auto& c : out) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return out;
}
}  // namespace

const char* to_string(SystemKind kind) {
  switch (kind) {
    case SystemKind::ReefDisplay: return "reef_display";
    case SystemKind::CoralGrowOut: return "coral_grow_out";
    case SystemKind::ShellfishLarvalCulture: return "larval_culture";
    case SystemKind::FishOnly: return "fish_only";
    case SystemKind::Other: return "other";
  }
  return "other";
}

Result<SystemKind> system_kind_from_string(const std::string& text) {
  const std::string t = lower_trim(text);
  if (t == "reef_display" || t == "reef") return SystemKind::ReefDisplay;
  if (t == "coral_grow_out" || t == "grow_out") return SystemKind::CoralGrowOut;
  if (t == "larval_culture" || t == "shellfish") return SystemKind::ShellfishLarvalCulture;
  if (t == "fish_only") return SystemKind::FishOnly;
  if (t == "other") return SystemKind::Other;
  return Error{"kind", "kind '" + text +
                           "' is not known; accepted: reef_display, coral_grow_out, "
                           "larval_culture, fish_only, other"};
}


const char* ph_scale_name(carbonate::PhScale scale) {
  switch (scale) {
    case carbonate::PhScale::Total: return "total";
    case carbonate::PhScale::Seawater: return "sws";
    case carbonate::PhScale::Free: return "free";
    case carbonate::PhScale::NBS: return "nbs";
  }
  return "nbs";
}

Result<carbonate::PhScale> ph_scale_from_name(const std::string& text) {
  const std::string t = lower_trim(text);
  if (t == "total") return carbonate::PhScale::Total;
  if (t == "sws" || t == "seawater") return carbonate::PhScale::Seawater;
  if (t == "free") return carbonate::PhScale::Free;
  if (t == "nbs" || t == "iupac") return carbonate::PhScale::NBS;
  return Error{"ph_scale", "ph_scale '" + text + "' is not known; accepted: total, sws, free, nbs"};
}

const char* to_string(DoseUnit unit) { return unit == DoseUnit::Grams ? "g" : "mL"; }

Result<DoseUnit> dose_unit_from_string(const std::string& text) {
  const std::string t = lower_trim(text);
  if (t == "g" || t == "gram" || t == "grams") return DoseUnit::Grams;
  if (t == "ml" || t == "millilitre" || t == "milliliter" || t == "millilitres" ||
      t == "milliliters")
    return DoseUnit::Millilitres;
  return Error{"amount_unit", "amount_unit '" + text + "' is not known; accepted: g, mL"};
}

const char* to_string(TopOffKind kind) { return kind == TopOffKind::Plain ? "plain" : "limewater"; }

Result<TopOffKind> top_off_kind_from_string(const std::string& text) {
  const std::string t = lower_trim(text);
  if (t == "plain" || t == "ro" || t == "fresh") return TopOffKind::Plain;
  if (t == "limewater" || t == "kalkwasser") return TopOffKind::Limewater;
  return Error{"top_off kind", "top-off kind '" + text + "' is not known; accepted: plain, limewater"};
}

const char* event_type_name(const EventData& data) {
  switch (data.index()) {
    case 0: return "test";
    case 1: return "dose";
    case 2: return "water_change";
    case 3: return "top_off";
    case 5: return "schedule";
    default: return "note";
  }
}

const char* to_string(ScheduleMark mark) {
  switch (mark) {
    case ScheduleMark::Missed: return "missed";
    case ScheduleMark::Extra: return "extra";
    case ScheduleMark::None: break;
  }
  return "none";
}

Result<ScheduleMark> schedule_mark_from_string(const std::string& text) {
  const std::string t = lower_trim(text);
  if (t == "none" || t.empty()) return ScheduleMark::None;
  if (t == "missed") return ScheduleMark::Missed;
  if (t == "extra") return ScheduleMark::Extra;
  return Error{"mark", "mark '" + text + "' is not known; accepted: none, missed, extra"};
}

double net_volume_l(const VolumeParts& parts) {
  return parts.display_l + parts.sump_l - parts.rock_displacement_l;
}

std::optional<double> target_of(const System& s, Parameter p) {
  switch (p) {
    case Parameter::Alkalinity: return s.targets.alkalinity_dkh;
    case Parameter::Calcium: return s.targets.calcium_mg_l;
    case Parameter::Magnesium: return s.targets.magnesium_mg_l;
    default: return std::nullopt;
  }
}

Result<std::string> normalize_unit(Parameter p, const std::string& unit) {
  const std::string t = lower_trim(unit);
  auto bad = [&](const char* accepted) {
    return Error{"unit", std::string("unit '") + unit + "' is not accepted for " + parameter_name(p) +
                             "; accepted: " + accepted};
  };
  switch (p) {
    case Parameter::Alkalinity: {
      auto u = units::alkalinity_unit_from_string(unit);
      if (!u) return bad("dKH, meq/L, mg/L CaCO3, umol/kg");
      return std::string(units::to_string(*u));
    }
    case Parameter::Calcium:
    case Parameter::Magnesium: {
      auto u = units::concentration_unit_from_string(unit);
      if (!u) return bad("mg/L, mmol/kg, umol/kg");
      return std::string(units::to_string(*u));
    }
    case Parameter::PH:
      if (t.empty() || t == "ph") return std::string("pH");
      return bad("pH");
    case Parameter::Salinity:
      if (t == "psu" || t == "ppt" || t == "sp" || t == "practical") return std::string("psu");
      return bad("psu (ppt is taken as practical salinity)");
    case Parameter::SpecificGravity:
      if (t.empty() || t == "sg") return std::string("sg");
      return bad("sg");
    case Parameter::Temperature: {
      auto u = temperature_unit_from_string(unit);
      if (!u) return bad("C, F");
      return std::string(to_string(*u));
    }
    case Parameter::Nitrate:
    case Parameter::Phosphate:
      if (t == "mg/l" || t == "ppm" || t == "mg_l") return std::string("mg/L");
      return bad("mg/L");
    case Parameter::Other: {
      if (t.empty() || t.size() > 20) return bad("any unit of 1 to 20 characters");
      size_t b = unit.find_first_not_of(" \t");
      size_t e = unit.find_last_not_of(" \t");
      return unit.substr(b, e - b + 1);
    }
  }
  return bad("?");
}

Result<double> canonical_value(Parameter p, double value, const std::string& unit,
                               double density_kg_per_l) {
  auto u = normalize_unit(p, unit);
  if (!u) return u.error();
  const std::string& n = *u;
  switch (p) {
    case Parameter::Alkalinity: {
      auto a = units::alkalinity_unit_from_string(n);
      const double umol = units::alkalinity_to_umol_kg(value, *a, density_kg_per_l);
      return units::alkalinity_from_umol_kg(umol, units::AlkalinityUnit::DKH, density_kg_per_l);
    }
    case Parameter::Calcium:
    case Parameter::Magnesium: {
      auto c = units::concentration_unit_from_string(n);
      const auto ion = p == Parameter::Calcium ? units::Ion::Calcium : units::Ion::Magnesium;
      const double umol = units::ion_to_umol_kg(value, *c, ion, density_kg_per_l);
      return units::ion_from_umol_kg(umol, units::ConcentrationUnit::MgPerL, ion, density_kg_per_l);
    }
    case Parameter::Temperature:
      return units::temperature_to_celsius(value, *temperature_unit_from_string(n));
    default:
      return value;
  }
}

Result<double> canonical_value(const TestResult& test, double density_kg_per_l) {
  return canonical_value(test.parameter, test.value, test.unit, density_kg_per_l);
}

std::optional<double> canonical_precision(const TestResult& test, double density_kg_per_l) {
  if (!test.precision) return std::nullopt;
  if (test.parameter == Parameter::Temperature) {
    auto unit = temperature_unit_from_string(test.unit);
    if (!unit) return std::nullopt;
    return units::temperature_difference_to_celsius(*test.precision, *unit);
  }
  // Every other conversion is a pure scale factor: convert 1 unit and scale.
  auto one = canonical_value(test.parameter, 1.0, test.unit, density_kg_per_l);
  if (!one) return std::nullopt;
  return *test.precision * std::fabs(*one);
}

Result<UnitBounds> accepted_in_unit(Parameter p, const std::string& unit, double density_kg_per_l) {
  // Every conversion to the canonical unit is v -> a v + b with a > 0 (a scale, or C from F):
  // read a and b off two points and invert at the canonical range's ends.
  auto at0 = canonical_value(p, 0.0, unit, density_kg_per_l);
  if (!at0) return at0.error();
  auto at1 = canonical_value(p, 1.0, unit, density_kg_per_l);
  if (!at1) return at1.error();
  const double a = *at1 - *at0, b = *at0;
  const ranges::Range& r = ranges::of_measurement(p);
  return UnitBounds{(r.lo - b) / a, (r.hi - b) / a};
}

}  // namespace tw::journal
