// The saved Plan and Hatchery settings per system (dosing_saved.hpp): written as JSON, read
// back with every value checked by the core's ranges. Map: 1. names of choices  2. writing
// 3. reading (the checks)  4. saved_part.
#include "dosing_saved.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <iterator>
#include <utility>

#include "actions_dosing.hpp"
#include "tidewright/additives/additives.hpp"
#include "tidewright/carbonate/measurement_precision.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/common/units.hpp"
#include "tidewright/journal/device_name.hpp"
#include "tidewright/seawater/seawater.hpp"

namespace twapp {

namespace {

using nlohmann::json;
namespace jn = tw::journal;
namespace rg = tw::ranges;
namespace hat = tw::hatchery;
namespace cb = tw::carbonate;

// ---------------------------------------------------------------- 1. Names of choices
template <class E>
struct Named {
  E value;
  const char* name;
};

constexpr Named<PlanAlkalinity> kPlanAlkalinity[] = {{PlanAlkalinity::SodiumCarbonate, "sodium_carbonate"},
                                                     {PlanAlkalinity::SodiumBicarbonate, "sodium_bicarbonate"},
                                                     {PlanAlkalinity::Limewater, "limewater"},
                                                     {PlanAlkalinity::None, "none"}};
constexpr Named<PlanCalcium> kPlanCalcium[] = {{PlanCalcium::CalciumChloride, "calcium_chloride"}, {PlanCalcium::None, "none"}};
constexpr Named<PlanMagnesium> kPlanMagnesium[] = {{PlanMagnesium::MagnesiumChloride, "magnesium_chloride_hexahydrate"},
                                                   {PlanMagnesium::MagnesiumSulfate, "magnesium_sulfate_heptahydrate"},
                                                   {PlanMagnesium::None, "none"}};
// The saved keys of each stock pump, by slot, and how a refusal names it.
struct PumpKeys {
  const char *name, *calibration, *doses_per_day, *max_dose_ml;
  const char *name_label, *calibration_label, *doses_label, *max_dose_label;
};
constexpr PumpKeys kPumpKeys[kPlanPumps] = {
    {"alkalinity_pump_name", "alkalinity_pump_calibration", "alkalinity_doses_per_day", "alkalinity_max_dose_ml",
     "Alkalinity pump name", "Alkalinity pump calibration", "Alkalinity pump doses per day", "Alkalinity pump largest dose"},
    {"calcium_pump_name", "calcium_pump_calibration", "calcium_doses_per_day", "calcium_max_dose_ml", "Calcium pump name",
     "Calcium pump calibration", "Calcium pump doses per day", "Calcium pump largest dose"},
    {"magnesium_pump_name", "magnesium_pump_calibration", "magnesium_doses_per_day", "magnesium_max_dose_ml",
     "Magnesium pump name", "Magnesium pump calibration", "Magnesium pump doses per day", "Magnesium pump largest dose"}};
constexpr Named<HatcheryMode> kModes[] = {{HatcheryMode::FlowThrough, "flow_through"}, {HatcheryMode::Batch, "batch"}};
constexpr Named<hat::TargetPoint> kPoints[] = {{hat::TargetPoint::AfterMixing, "after_mixing"},
                                               {hat::TargetPoint::AtTanks, "at_tanks"}};

// The core's own spellings where it has them (hatchery.hpp, carbonate.hpp: to_string).
template <class E>
Named<E> named(E value) {
  return {value, to_string(value)};
}
const Named<hat::TargetKind> kKinds[] = {named(hat::TargetKind::OmegaAragonite), named(hat::TargetKind::PH),
                                         named(hat::TargetKind::AlkalinityRise)};
const Named<hat::Buffer> kBuffers[] = {named(hat::Buffer::SodiumCarbonate), named(hat::Buffer::SodiumBicarbonate),
                                       named(hat::Buffer::SodiumHydroxide), named(hat::Buffer::Blend)};
const Named<cb::PhScale> kScales[] = {named(cb::PhScale::NBS), named(cb::PhScale::Total), named(cb::PhScale::Seawater),
                                      named(cb::PhScale::Free)};
const Named<cb::K1K2Option> kK1K2[] = {named(cb::K1K2Option::Lueker2000), named(cb::K1K2Option::Millero2010)};

template <class E, std::size_t N>
const char* name_of(const Named<E> (&table)[N], E value) {
  for (const auto& n : table) if (n.value == value) return n.name;
  return table[0].name;
}

json opt(const std::optional<double>& v) { return v ? json(*v) : json(nullptr); }
json opt(const std::optional<std::string>& v) { return v ? json(*v) : json(nullptr); }
json opt(const std::optional<int>& v) { return v ? json(*v) : json(nullptr); }

// ---------------------------------------------------------------- 2. Writing
json plan_to_json(const PlanForm& f) {
  json j = {{"alkalinity_from", name_of(kPlanAlkalinity, f.alkalinity)},
            {"alkalinity_stock_g_per_l", opt(f.alkalinity_g_per_l)},
            {"calcium_from", name_of(kPlanCalcium, f.calcium)},
            {"calcium_stock_g_per_l", opt(f.calcium_g_per_l)},
            // null: from the log (what it shows dosed), else none / the stock's starting strength
            {"magnesium_from", f.magnesium ? json(name_of(kPlanMagnesium, *f.magnesium)) : json(nullptr)},
            {"magnesium_stock_g_per_l", opt(f.magnesium_g_per_l)},
            {"evaporation_l_per_day", f.evaporation_l_per_day},
            {"horizon_days", f.horizon_days},
            {"consumption_from_log", f.use_estimate},
            {"alkalinity_consumption_dkh_per_day", f.alkalinity_demand_dkh_per_day},
            {"calcium_consumption_mg_l_per_day", f.calcium_demand_mg_l_per_day},
            {"magnesium_consumption_mg_l_per_day", f.magnesium_demand_mg_l_per_day}};
  // Each pump's own settings; null: not set by the keeper (the log's schedule, or the fallback).
  for (int k = 0; k < kPlanPumps; ++k) {
    const PumpKeys& key = kPumpKeys[k];
    const PlanPumpSetting& p = f.pumps[static_cast<std::size_t>(k)];
    j[key.name] = opt(p.name);
    j[key.calibration] = opt(p.calibration);
    j[key.doses_per_day] = opt(p.doses_per_day);
    j[key.max_dose_ml] = opt(p.max_dose_ml);
  }
  return j;
}

json hatchery_to_json(const HatcheryForm& f) {
  return {{"mode", name_of(kModes, f.mode)},
          {"salinity", f.salinity},
          {"temperature_c", f.temperature_c},
          {"alkalinity_dkh", f.alkalinity_dkh},
          {"ph", f.ph},
          {"ph_scale", name_of(kScales, f.ph_scale)},
          {"calcium_mg_l", opt(f.calcium_mg_l)},
          {"k1k2", name_of(kK1K2, f.k1k2)},
          {"total_boron_mg_l", opt(f.total_boron_mg_l)},
          {"magnesium_mg_l", opt(f.magnesium_mg_l)},
          {"mg_ca_correction", f.mg_ca_correction},
          {"line_shown", f.line_shown},
          {"line_tank_temperature_c", opt(f.line_tank_temperature_c)},
          {"mix_fraction", opt(f.mix_fraction)},
          {"mix_salinity", f.mix_salinity},
          {"mix_temperature_c", f.mix_temperature_c},
          {"mix_alkalinity_dkh", f.mix_alkalinity_dkh},
          {"mix_dic_umol_kg", f.mix_dic_umol_kg},
          {"mix_calcium_mg_l", f.mix_calcium_mg_l},
          {"target", name_of(kKinds, f.target_kind)},
          {"target_omega_aragonite", f.target_omega},
          {"target_ph", f.target_ph},
          {"target_rise_dkh", f.target_rise_dkh},
          {"target_point", name_of(kPoints, f.target_point)},
          {"buffer", name_of(kBuffers, f.buffer)},
          {"ph_ceiling", f.ph_ceiling},
          {"flow_l_per_min", f.flow_l_per_min},
          {"volume_l", f.volume_l},
          {"residence_time_min", opt(f.residence_time_min)},
          {"stock_temperature_c", f.stock_temperature_c},
          {"stock_g_per_l", opt(f.stock_g_per_l)},
          {"confidence_percent", 100 * kConfidenceChoices[f.confidence_index]},
          {"alkalinity_precision_dkh", f.alkalinity_precision_dkh},
          {"ph_precision", f.ph_precision},
          {"table_from_ph", f.table_from_ph},
          {"table_to_ph", f.table_to_ph},
          {"table_step_ph", f.table_step_ph}};
}

// ---------------------------------------------------------------- 3. Reading
// Reads one object's members into a form; each value the core's checks refuse keeps the
// form's default and adds a line to `refused`.
class Reader {
 public:
  Reader(const json& j, std::string where, std::vector<std::string>* refused)
      : j_(j), where_(std::move(where)), refused_(refused) {}

  // A number in `range` (label names it in the message); above zero or whole when asked.
  void number(const char* key, const char* label, const rg::Range& range, double* out, bool above_zero = false) {
    const auto v = value(key, label);
    if (!v) return;
    if (auto st = rg::check(label, *v, range); !st) return refuse(st.error().message);
    if (above_zero && !(*v > 0)) return refuse(std::string(label) + " must be above 0");
    *out = *v;
  }
  void whole(const char* key, const char* label, const rg::Range& range, int* out) {
    double v = *out;
    const auto before = refused_->size();
    number(key, label, range, &v);
    if (refused_->size() != before) return;
    if (v != std::floor(v)) return refuse(std::string(label) + " must be a whole number");
    *out = static_cast<int>(v);
  }
  // null = not set.
  void optional(const char* key, const char* label, const rg::Range& range, std::optional<double>* out,
                bool above_zero = false) {
    if (!j_.contains(key)) return;
    if (j_[key].is_null()) {
      out->reset();
      return;
    }
    double v = 0;
    const auto before = refused_->size();
    number(key, label, range, &v, above_zero);
    if (refused_->size() == before) *out = v;
  }
  void optional_whole(const char* key, const char* label, const rg::Range& range, std::optional<int>* out) {
    if (!j_.contains(key)) return;
    if (j_[key].is_null()) {
      out->reset();
      return;
    }
    int v = 0;
    const auto before = refused_->size();
    whole(key, label, range, &v);
    if (refused_->size() == before) *out = v;
  }
  // A choice that may be null (not set).
  template <class E, std::size_t N>
  void optional_choice(const char* key, const char* label, const Named<E> (&table)[N], std::optional<E>* out) {
    if (!j_.contains(key)) return;
    if (j_[key].is_null()) {
      out->reset();
      return;
    }
    E v = table[0].value;
    const auto before = refused_->size();
    choice(key, label, table, &v);
    if (refused_->size() == before) *out = v;
  }
  // A pump's name by the core's rule (trimmed, 1 to 60 characters); null = not set.
  void device_name(const char* key, const char* label, std::optional<std::string>* out) {
    if (!j_.contains(key)) return;
    if (j_[key].is_null()) {
      out->reset();
      return;
    }
    if (!j_[key].is_string()) return refuse(std::string(label) + " is not text");
    auto name = jn::device_name_from_text(j_[key].get<std::string>(), label);
    if (!name) return refuse(name.error().message);
    *out = *name;
  }
  // A kit or meter precision: the core's precision table decides.
  void precision(const char* key, const char* label, tw::Parameter p, double* out) {
    const auto v = value(key, label);
    if (!v) return;
    if (auto st = cb::check_precision(p, *v, label); !st) return refuse(st.error().message);
    *out = *v;
  }
  void flag(const char* key, const char* label, bool* out) {
    if (!j_.contains(key)) return;
    if (!j_[key].is_boolean()) return refuse(std::string(label) + " is not yes or no");
    *out = j_[key].get<bool>();
  }
  template <class E, std::size_t N>
  void choice(const char* key, const char* label, const Named<E> (&table)[N], E* out) {
    if (!j_.contains(key)) return;
    const std::string text = j_[key].is_string() ? j_[key].get<std::string>() : j_[key].dump();
    for (const auto& n : table) {
      if (text == n.name) {
        *out = n.value;
        return;
      }
    }
    std::string names;
    for (const auto& n : table) names += std::string(names.empty() ? "" : ", ") + n.name;
    refuse(std::string(label) + " '" + text + "' is not one of " + names);
  }
  void refuse(const std::string& why) { refused_->push_back(where_ + ": " + why + "; its default is used"); }

 private:
  std::optional<double> value(const char* key, const char* label) {
    if (!j_.contains(key)) return std::nullopt;
    if (!j_[key].is_number()) {
      refuse(std::string(label) + " is not a number");
      return std::nullopt;
    }
    return j_[key].get<double>();
  }

  const json& j_;
  std::string where_;
  std::vector<std::string>* refused_;
};

PlanForm plan_from_json(const json& j, const jn::System& sys, std::vector<std::string>* refused) {
  PlanForm f;
  Reader r(j, "Plan settings of " + sys.name, refused);
  r.choice("alkalinity_from", "Alkalinity from", kPlanAlkalinity, &f.alkalinity);
  r.optional("alkalinity_stock_g_per_l", "Alkalinity stock strength", rg::kStockGPerL, &f.alkalinity_g_per_l, true);
  r.choice("calcium_from", "Calcium from", kPlanCalcium, &f.calcium);
  r.optional("calcium_stock_g_per_l", "Calcium stock strength", rg::kStockGPerL, &f.calcium_g_per_l, true);
  r.optional_choice("magnesium_from", "Magnesium from", kPlanMagnesium, &f.magnesium);
  r.optional("magnesium_stock_g_per_l", "Magnesium stock strength", rg::kStockGPerL, &f.magnesium_g_per_l, true);
  // Before each pump had its own: one doses a day and largest dose for both pumps.
  std::optional<int> shared_doses;
  std::optional<double> shared_max;
  r.optional_whole("doses_per_day", "Doses per day per pump", rg::kDosesPerDay, &shared_doses);
  r.optional("max_dose_ml", "Largest single dose", rg::kPlannedDoseMax, &shared_max);
  for (int k = 0; k < 2; ++k) {
    f.pumps[static_cast<std::size_t>(k)].doses_per_day = shared_doses;
    f.pumps[static_cast<std::size_t>(k)].max_dose_ml = shared_max;
  }
  for (int k = 0; k < kPlanPumps; ++k) {
    const PumpKeys& key = kPumpKeys[k];
    PlanPumpSetting& p = f.pumps[static_cast<std::size_t>(k)];
    r.device_name(key.name, key.name_label, &p.name);
    r.optional(key.calibration, key.calibration_label, rg::kPumpCalibration, &p.calibration);
    // null: not set by the keeper, so an older store's shared values (above) stay.
    if (j.contains(key.doses_per_day) && !j[key.doses_per_day].is_null()) {
      r.optional_whole(key.doses_per_day, key.doses_label, rg::kDosesPerDay, &p.doses_per_day);
    }
    if (j.contains(key.max_dose_ml) && !j[key.max_dose_ml].is_null()) {
      r.optional(key.max_dose_ml, key.max_dose_label, rg::kPlannedDoseMax, &p.max_dose_ml);
    }
  }
  const rg::Range evaporation{rg::kEvaporationFractionPerDay.lo * sys.volume_l,
                              rg::kEvaporationFractionPerDay.hi * sys.volume_l, "L/day"};
  r.number("evaporation_l_per_day", "Evaporation", evaporation, &f.evaporation_l_per_day);
  r.whole("horizon_days", "Days to plan", rg::kPlanHorizonDays, &f.horizon_days);
  r.flag("consumption_from_log", "Consumption from the log", &f.use_estimate);
  const rg::Range alk_demand{rg::kAlkalinityDemandMeqPerLDay.lo / tw::units::kMeqPerLPerDKH,
                             rg::kAlkalinityDemandMeqPerLDay.hi / tw::units::kMeqPerLPerDKH, "dKH/day"};
  r.number("alkalinity_consumption_dkh_per_day", "Alkalinity consumption", alk_demand, &f.alkalinity_demand_dkh_per_day);
  r.number("calcium_consumption_mg_l_per_day", "Calcium consumption", rg::kCalciumDemandMgPerLDay,
           &f.calcium_demand_mg_l_per_day);
  // Each stock within its compound's solubility, as the screen's fields take it.
  const auto soluble = [&](const char* label, tw::additives::CompoundId id, std::optional<double>& g) {
    if (!g) return;
    const double max = plan_stock_max_g_per_l(id);
    if (auto st = rg::check(label, *g, rg::Range{1, max, "g/L"}); !st) {
      r.refuse(st.error().message + " (its solubility at " + std::to_string(static_cast<int>(kPlanStockTemperatureC)) + " C)");
      g.reset();
    }
  };
  if (f.alkalinity == PlanAlkalinity::SodiumCarbonate || f.alkalinity == PlanAlkalinity::SodiumBicarbonate) {
    soluble("Alkalinity stock strength", alkalinity_compound(f.alkalinity), f.alkalinity_g_per_l);
  }
  soluble("Calcium stock strength", tw::additives::CompoundId::CalciumChlorideDihydrate, f.calcium_g_per_l);
  if (f.magnesium && *f.magnesium != PlanMagnesium::None) {
    soluble("Magnesium stock strength", magnesium_compound(*f.magnesium), f.magnesium_g_per_l);
  }
  r.number("magnesium_consumption_mg_l_per_day", "Magnesium consumption", rg::kMagnesiumDemandMgPerLDay,
           &f.magnesium_demand_mg_l_per_day);
  return f;
}

// A salt mix's boron and magnesium in mg/L: the core's ranges per kg, at the density of the
// water as read just before (as the Hatchery screen bounds its fields).
void read_salt_mix(Reader& r, HatcheryForm& f) {
  using tw::units::ConcentrationUnit, tw::units::Ion;
  const double rho = tw::seawater::density_kg_per_l(f.salinity, f.temperature_c);
  const auto mg_l = [rho](double umol_kg, Ion ion) {
    return tw::units::ion_from_umol_kg(umol_kg, ConcentrationUnit::MgPerL, ion, rho);
  };
  const rg::Range boron{mg_l(rg::kTotalBoronUmolKg.lo, Ion::Boron), mg_l(rg::kTotalBoronUmolKg.hi, Ion::Boron), "mg/L"};
  const rg::Range magnesium{rg::kMagnesiumMgL.lo,
                            std::min(mg_l(rg::kMagnesiumUmolKg.hi, Ion::Magnesium), rg::kMagnesiumMgL.hi), "mg/L"};
  r.optional("total_boron_mg_l", "Total boron (measured)", boron, &f.total_boron_mg_l);
  r.optional("magnesium_mg_l", "Magnesium (measured)", magnesium, &f.magnesium_mg_l);
  r.flag("mg_ca_correction", "Correct for Mg and Ca", &f.mg_ca_correction);
}

// The line's conditioning (hatchery::Conditioning's ranges).
void read_line(Reader& r, HatcheryForm& f) {
  r.flag("line_shown", "Show the line", &f.line_shown);
  r.optional("line_tank_temperature_c", "Tank temperature after heating or cooling", rg::kTemperatureC,
             &f.line_tank_temperature_c);
  r.optional("mix_fraction", "Other water mixed in, share by volume", rg::kMixVolumeFraction, &f.mix_fraction);
  r.number("mix_salinity", "Other water's salinity", rg::kSalinity, &f.mix_salinity);
  r.number("mix_temperature_c", "Other water's temperature", rg::kTemperatureC, &f.mix_temperature_c);
  r.number("mix_alkalinity_dkh", "Other water's alkalinity", rg::kAlkalinityDkh, &f.mix_alkalinity_dkh);
  r.number("mix_dic_umol_kg", "Other water's DIC", rg::kMixWaterCarbonUmolKg, &f.mix_dic_umol_kg);
  r.number("mix_calcium_mg_l", "Other water's calcium", rg::kCalciumMgL, &f.mix_calcium_mg_l);
}

HatcheryForm hatchery_from_json(const json& j, const jn::System& sys, std::vector<std::string>* refused) {
  HatcheryForm f;
  Reader r(j, "Hatchery settings of " + sys.name, refused);
  r.choice("mode", "Mode", kModes, &f.mode);
  r.number("salinity", "Salinity", rg::kSalinityForCarbonateChemistry, &f.salinity);
  r.number("temperature_c", "Temperature", rg::kTemperatureC, &f.temperature_c);
  r.number("alkalinity_dkh", "Alkalinity", rg::kAlkalinityDkh, &f.alkalinity_dkh);
  r.number("ph", "pH", rg::kPh, &f.ph);
  r.choice("ph_scale", "pH scale", kScales, &f.ph_scale);
  r.optional("calcium_mg_l", "Calcium (measured)", rg::kCalciumMgL, &f.calcium_mg_l);
  r.choice("k1k2", "Carbonic acid constants", kK1K2, &f.k1k2);
  read_salt_mix(r, f);
  read_line(r, f);
  r.choice("target", "Raise the water to", kKinds, &f.target_kind);
  r.number("target_omega_aragonite", "Target \u03a9 aragonite", rg::kHatcheryTargetOmega, &f.target_omega);
  r.number("target_ph", "Target pH", rg::kHatcheryTargetPh, &f.target_ph);
  r.number("target_rise_dkh", "Alkalinity to add", rg::kAlkalinityDkh, &f.target_rise_dkh);
  r.choice("target_point", "Where the target must be met", kPoints, &f.target_point);
  r.choice("buffer", "Buffer", kBuffers, &f.buffer);
  r.number("ph_ceiling", "pH ceiling", rg::kHatcheryPhCeiling, &f.ph_ceiling);
  r.number("flow_l_per_min", "Intake flow", rg::kIntakeFlowLPerMin, &f.flow_l_per_min);
  r.number("volume_l", "Tank volume", rg::kSystemVolumeL, &f.volume_l);
  r.optional("residence_time_min", "Time to the tanks", rg::kResidenceTimeMin, &f.residence_time_min);
  r.number("stock_temperature_c", "Stock tank temperature", rg::kStockTemperatureC, &f.stock_temperature_c);
  r.optional("stock_g_per_l", "Stock strength", rg::kStockGPerL, &f.stock_g_per_l, true);
  if (j.contains("confidence_percent")) {
    const json& c = j["confidence_percent"];
    bool known = false;
    for (int i = 0; i < static_cast<int>(std::size(kConfidenceChoices)); ++i) {
      if (c.is_number() && std::fabs(c.get<double>() - 100 * kConfidenceChoices[i]) < 1e-6) {
        f.confidence_index = i;
        known = true;
      }
    }
    if (!known) r.refuse("Dose so the target is met " + c.dump() + " % is not one of 0 (as read), 90, 95, 99 %");
  }
  r.precision("alkalinity_precision_dkh", "Intake alkalinity test precision", tw::Parameter::Alkalinity,
              &f.alkalinity_precision_dkh);
  r.precision("ph_precision", "Intake pH reading precision", tw::Parameter::PH, &f.ph_precision);
  r.number("table_from_ph", "Table from intake pH", rg::kPh, &f.table_from_ph);
  r.number("table_to_ph", "Table to intake pH", rg::kPh, &f.table_to_ph);
  r.number("table_step_ph", "Table step", rg::kPumpTableStepPh, &f.table_step_ph);
  return f;
}

}  // namespace

json system_dosing_to_json(const SystemDosing& d) {
  return {{"plan", plan_to_json(d.plan)}, {"hatchery", hatchery_to_json(d.hatchery)}};
}

json dosing_to_json(const std::map<jn::SystemId, SystemDosing>& by_system, const jn::Journal& journal) {
  json out = json::object();
  for (const auto& [id, d] : by_system) {
    if (jn::find_system(journal, id)) out[std::to_string(id)] = system_dosing_to_json(d);
  }
  return out;
}

std::map<jn::SystemId, SystemDosing> dosing_from_json(const json& j, const jn::Journal& journal,
                                                      std::vector<std::string>* refused) {
  std::map<jn::SystemId, SystemDosing> out;
  if (!j.is_object()) {
    refused->push_back("The saved Plan and Hatchery settings are not a JSON object; the defaults are used");
    return out;
  }
  for (const auto& [key, value] : j.items()) {
    jn::SystemId id = 0;
    const auto [end, ec] = std::from_chars(key.data(), key.data() + key.size(), id);
    if (ec != std::errc{} || end != key.data() + key.size()) continue;
    const jn::System* sys = jn::find_system(journal, id);
    if (!sys || !value.is_object()) continue;  // settings of a system no longer kept
    SystemDosing d;
    if (value.contains("plan") && value["plan"].is_object()) d.plan = plan_from_json(value["plan"], *sys, refused);
    if (value.contains("hatchery") && value["hatchery"].is_object()) {
      d.hatchery = hatchery_from_json(value["hatchery"], *sys, refused);
    }
    out[id] = d;
  }
  return out;
}

// ---------------------------------------------------------------- 4. saved_part
SystemDosing saved_part(const PlanForm& plan, const HatcheryForm& hatchery) {
  SystemDosing d{plan, hatchery};
  const PlanForm p0;
  d.plan.accept_stale = p0.accept_stale;
  d.plan.show_all_days = p0.show_all_days;
  d.plan.export_index = p0.export_index;
  d.hatchery.show_table = HatcheryForm{}.show_table;
  return d;
}

}  // namespace twapp
