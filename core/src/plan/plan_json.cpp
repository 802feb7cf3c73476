// Plan input as JSON (our own format) and the plan as JSON.
//
// Input format (strict: an unknown key is refused naming the key and the nearest known one;
// fields optional unless marked, defaults as in plan.hpp; // and /* */ comments allowed, as in
// the files `plan --starter` writes, plan_starter.hpp):
// { "system": {"name", "volume_l"*, "salinity"*, "temperature_c"*, "alkalinity_dkh"*, "calcium_mg_l"*,
//              "magnesium_mg_l"* (* required, or taken from a journal: see PlanInputSource),
//              "ph_total" (total scale; absent = air equilibrium), "air_co2_ppm"},
//   "targets": {"alkalinity_dkh": {"target","low","high"}, "calcium_mg_l": {...}, "magnesium_mg_l": {...}},
//   "demand": {"alkalinity_meq_per_day", "calcium_mg_per_day", "magnesium_mg_per_day"},
//   "additives": [  (required, 1..16: ranges::kPlanAdditives) each ONE of
//       {"compound": "<catalog key>"}                      dry, dosed in g
//       {"stock": {"name", "temperature_c", "ingredients": [{"compound", "grams_per_l"}]}}   mL
//       {"limewater": {"temperature_c", "fraction_of_saturation"}}                           mL
//       {"label": {"name", "parameter", "dose_ml", "tank_volume_l", "rise", "dic_per_alkalinity_eq", "caustic"}}
//     plus delivery fields: "device", "manual", "doses_per_day", "min_dose", "max_dose",
//     "max_per_day", "first_hour", "last_hour", "reservoir", "calibration" (what the pump delivers
//     per amount set, ranges::kPumpCalibration; min_dose, max_dose and max_per_day are amounts
//     set on the pump, the plan's doses what reaches the tank: Delivery in plan.hpp) ],
//   "limits": {"<limit key>": value, ...}, "overrides": [{"limit", "value", "reason"}],
//   "evaporation_l_per_day", "horizon_days", "gas_exchange_hours", "salinity_tolerance",
//   "start_date" (a real calendar date YYYY-MM-DD) }
#include <algorithm>
#include <cstdint>
#include <limits>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "plan_internal.hpp"
#include "tidewright/common/datetime.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/plan/plan.hpp"

namespace tw::plan {

namespace {
using nlohmann::json;

// Refuses a key the format does not know, naming it and the nearest known key.
Status known_keys(const json& j, const std::string& where, std::initializer_list<const char*> keys) {
  if (!j.is_object()) {
    const std::string name = where.empty() ? "plan" : where.substr(0, where.size() - 1);
    return Error{name, name + " must be a JSON object"};
  }
  std::vector<std::string> known(keys.begin(), keys.end());
  for (auto it = j.begin(); it != j.end(); ++it) {
    if (std::find(known.begin(), known.end(), it.key()) != known.end()) continue;
    return Error{where + it.key(), fmt::format("{}{} is not a known key; did you mean \"{}\"?", where, it.key(),
                                               detail::nearest(it.key(), known))};
  }
  return Ok{};
}

Status read_number(const json& j, const char* key, const std::string& where, double& out) {
  if (!j.contains(key)) return Ok{};
  if (!j[key].is_number()) return Error{where + key, where + key + " must be a number"};
  out = j[key].get<double>();
  return Ok{};
}
// A text member, when present, must be a string; a missing one keeps out as it is.
Status read_text(const json& j, const char* key, const std::string& where, std::string& out) {
  if (!j.contains(key)) return Ok{};
  if (!j[key].is_string()) return Error{where + key, where + key + " must be text"};
  out = j[key].get<std::string>();
  return Ok{};
}
Status read_bool(const json& j, const char* key, const std::string& where, bool& out) {
  if (!j.contains(key)) return Ok{};
  if (!j[key].is_boolean()) return Error{where + key, where + key + " must be true or false"};
  out = j[key].get<bool>();
  return Ok{};
}
Status read_int(const json& j, const char* key, const std::string& where, int& out) {
  if (!j.contains(key)) return Ok{};
  if (!j[key].is_number_integer()) return Error{where + key, where + key + " must be a whole number"};
  // get<int>() would wrap a larger number silently (4294967297 days read as 1).
  const bool too_large = j[key].is_number_unsigned()
                             ? j[key].get<std::uint64_t>() > static_cast<std::uint64_t>(std::numeric_limits<int>::max())
                             : j[key].get<std::int64_t>() > std::numeric_limits<int>::max();
  if (too_large || j[key].get<std::int64_t>() < std::numeric_limits<int>::min()) {
    return Error{where + key, where + key + " is far outside its range"};
  }
  out = j[key].get<int>();
  return Ok{};
}
#define TW_TRY(expr)              \
  do {                            \
    auto tw_s_ = (expr);          \
    if (!tw_s_) return tw_s_.error(); \
  } while (0)

Result<additives::Additive> read_additive(const json& a, const std::string& f) {
  namespace ad = additives;
  TW_TRY(known_keys(a, f, {"compound", "stock", "limewater", "label", "device", "manual", "doses_per_day", "min_dose",
                           "max_dose", "max_per_day", "first_hour", "last_hour", "reservoir", "calibration"}));
  if (a.contains("compound") && a["compound"].is_string()) {
    auto c = ad::find_compound(a["compound"].get<std::string>());
    if (!c) return Error{f + "compound", c.error().message};
    return ad::additive_from_compound((*c)->id);
  }
  if (a.contains("stock") && a["stock"].is_object()) {
    const json& s = a["stock"];
    TW_TRY(known_keys(s, f + "stock.", {"name", "temperature_c", "ingredients"}));
    ad::StockRecipe r;
    r.name = "stock";
    TW_TRY(read_text(s, "name", f + "stock.", r.name));
    TW_TRY(read_number(s, "temperature_c", f + "stock.", r.temperature_c));
    if (!s.contains("ingredients") || !s["ingredients"].is_array()) {
      return Error{f + "stock.ingredients", f + "stock.ingredients must be a list of {compound, grams_per_l}"};
    }
    for (const auto& g : s["ingredients"]) {
      TW_TRY(known_keys(g, f + "stock.ingredients.", {"compound", "grams_per_l"}));
      std::string compound;
      TW_TRY(read_text(g, "compound", f + "stock.ingredients.", compound));
      auto c = ad::find_compound(compound);
      if (!c) return Error{f + "stock.ingredients", c.error().message};
      ad::Ingredient ing{(*c)->id, 0};
      TW_TRY(read_number(g, "grams_per_l", f + "stock.ingredients.", ing.grams_per_l));
      r.ingredients.push_back(ing);
    }
    auto out = ad::additive_from_stock(r);
    if (!out) return Error{f + "stock." + out.error().field, out.error().message};
    return out;
  }
  if (a.contains("limewater") && a["limewater"].is_object()) {
    double t = 25, frac = 1;
    TW_TRY(known_keys(a["limewater"], f + "limewater.", {"temperature_c", "fraction_of_saturation"}));
    TW_TRY(read_number(a["limewater"], "temperature_c", f + "limewater.", t));
    TW_TRY(read_number(a["limewater"], "fraction_of_saturation", f + "limewater.", frac));
    auto out = ad::limewater_additive(t, frac);
    if (!out) return Error{f + "limewater." + out.error().field, out.error().message};
    return out;
  }
  if (a.contains("label") && a["label"].is_object()) {
    const json& l = a["label"];
    TW_TRY(known_keys(l, f + "label.", {"name", "parameter", "dose_ml", "tank_volume_l", "rise",
                                         "dic_per_alkalinity_eq", "caustic"}));
    ad::LabelClaim c;
    c.name = "product";
    TW_TRY(read_text(l, "name", f + "label.", c.name));
    std::string parameter = "alkalinity";
    TW_TRY(read_text(l, "parameter", f + "label.", parameter));
    auto p = dosed_parameter_from_name(parameter);
    if (!p) return Error{f + "label.parameter", p.error().message};
    c.parameter = *p;
    TW_TRY(read_number(l, "dose_ml", f + "label.", c.dose_ml));
    TW_TRY(read_number(l, "tank_volume_l", f + "label.", c.tank_volume_l));
    TW_TRY(read_number(l, "rise", f + "label.", c.rise));
    TW_TRY(read_number(l, "dic_per_alkalinity_eq", f + "label.", c.dic_per_alkalinity_eq));
    c.caustic = false;
    TW_TRY(read_bool(l, "caustic", f + "label.", c.caustic));
    auto out = ad::additive_from_label(c);
    if (!out) return Error{f + "label." + out.error().field, out.error().message};
    return out;
  }
  return Error{f.substr(0, f.size() - 1), f + " needs one of: compound, stock, limewater, label"};
}

Status read_band(const json& t, const char* key, Band& b) {
  if (!t.contains(key)) return Ok{};
  const std::string w = std::string("targets.") + key + ".";
  TW_TRY(known_keys(t[key], w, {"target", "low", "high"}));
  TW_TRY(read_number(t[key], "target", w, b.target));
  TW_TRY(read_number(t[key], "low", w, b.low));
  TW_TRY(read_number(t[key], "high", w, b.high));
  return Ok{};
}
}  // namespace

Result<PlanInput> plan_input_from_json(const std::string& text, std::vector<std::string>* left_to_journal) {
  // Comments (// and /* */) are allowed: the files `plan --starter` writes explain themselves.
  json j = json::parse(text, nullptr, /*allow_exceptions=*/false, /*ignore_comments=*/true);
  if (j.is_discarded() || !j.is_object()) return Error{"plan", "the plan input is not a JSON object"};
  TW_TRY(known_keys(j, "", {"system", "targets", "demand", "additives", "limits", "overrides", "evaporation_l_per_day",
                            "horizon_days", "gas_exchange_hours", "salinity_tolerance", "start_date"}));
  PlanInput in;
  const json empty = json::object();
  const json& s = j.contains("system") ? j["system"] : empty;
  TW_TRY(known_keys(s, "system.", {"name", "volume_l", "salinity", "temperature_c", "alkalinity_dkh", "calcium_mg_l",
                                   "magnesium_mg_l", "ph_total", "air_co2_ppm"}));
  // No silent defaults for the water itself: each is in the file or comes from a journal.
  for (const char* key : {"volume_l", "salinity", "temperature_c", "alkalinity_dkh", "calcium_mg_l", "magnesium_mg_l"}) {
    if (s.contains(key)) continue;
    if (left_to_journal != nullptr) {
      left_to_journal->push_back(key);
      continue;
    }
    return Error{std::string("system.") + key,
                 fmt::format("system.{} is required (the plan would otherwise be made for a tank that is not "
                             "yours); give it in the file or take it from a journal (--journal)",
                             key)};
  }
  if (s.contains("name")) {
    if (!s["name"].is_string()) return Error{"system.name", "system.name must be text"};
    in.system.name = s["name"].get<std::string>();
  }
  TW_TRY(read_number(s, "volume_l", "system.", in.system.volume_l));
  TW_TRY(read_number(s, "salinity", "system.", in.system.salinity));
  TW_TRY(read_number(s, "temperature_c", "system.", in.system.temperature_c));
  TW_TRY(read_number(s, "alkalinity_dkh", "system.", in.system.alkalinity_dkh));
  TW_TRY(read_number(s, "calcium_mg_l", "system.", in.system.calcium_mg_l));
  TW_TRY(read_number(s, "magnesium_mg_l", "system.", in.system.magnesium_mg_l));
  TW_TRY(read_number(s, "air_co2_ppm", "system.", in.system.air_co2_ppm));
  if (s.contains("ph_total")) {
    double ph = 0;
    TW_TRY(read_number(s, "ph_total", "system.", ph));
    in.system.ph_total = ph;
  }
  if (j.contains("targets")) {
    TW_TRY(known_keys(j["targets"], "targets.", {"alkalinity_dkh", "calcium_mg_l", "magnesium_mg_l"}));
    TW_TRY(read_band(j["targets"], "alkalinity_dkh", in.targets.alkalinity_dkh));
    TW_TRY(read_band(j["targets"], "calcium_mg_l", in.targets.calcium_mg_l));
    TW_TRY(read_band(j["targets"], "magnesium_mg_l", in.targets.magnesium_mg_l));
  }
  if (j.contains("demand")) {
    TW_TRY(known_keys(j["demand"], "demand.", {"alkalinity_meq_per_day", "calcium_mg_per_day", "magnesium_mg_per_day"}));
    TW_TRY(read_number(j["demand"], "alkalinity_meq_per_day", "demand.", in.demand.alkalinity_meq_per_day));
    TW_TRY(read_number(j["demand"], "calcium_mg_per_day", "demand.", in.demand.calcium_mg_per_day));
    TW_TRY(read_number(j["demand"], "magnesium_mg_per_day", "demand.", in.demand.magnesium_mg_per_day));
  }
  if (!j.contains("additives") || !j["additives"].is_array()) {
    return Error{"additives", fmt::format("additives must be a list of 1 to {:g} additives", ranges::kPlanAdditives.hi)};
  }
  for (std::size_t i = 0; i < j["additives"].size(); ++i) {
    const json& a = j["additives"][i];
    const std::string f = fmt::format("additives[{}].", i);
    auto add = read_additive(a, f);
    if (!add) return add.error();
    Delivery d;
    d.additive = *add;
    d.device = d.additive.unit == additives::DoseUnit::Gram ? "hand" : "pump";
    TW_TRY(read_text(a, "device", f, d.device));
    d.manual = d.device == "hand";
    TW_TRY(read_bool(a, "manual", f, d.manual));
    TW_TRY(read_int(a, "doses_per_day", f, d.doses_per_day));
    TW_TRY(read_number(a, "min_dose", f, d.min_dose));
    TW_TRY(read_number(a, "max_dose", f, d.max_dose));
    TW_TRY(read_number(a, "max_per_day", f, d.max_per_day));
    TW_TRY(read_int(a, "first_hour", f, d.first_hour));
    TW_TRY(read_int(a, "last_hour", f, d.last_hour));
    TW_TRY(read_number(a, "reservoir", f, d.reservoir));
    TW_TRY(read_number(a, "calibration", f, d.calibration));
    TW_TRY(ranges::check(f + "calibration", d.calibration, ranges::kPumpCalibration));
    in.deliveries.push_back(d);
  }
  std::vector<LimitSetting> settings;
  if (j.contains("limits")) {
    if (!j["limits"].is_object()) return Error{"limits", "limits must be an object of {\"<limit key>\": value}"};
    for (auto it = j["limits"].begin(); it != j["limits"].end(); ++it) {
      auto id = limit_from_key(it.key());
      if (!id) return Error{"limits." + it.key(), "limits." + it.key() + ": " + id.error().message};
      if (!it.value().is_number()) return Error{"limits." + it.key(), "limits." + it.key() + " must be a number"};
      settings.push_back({*id, it.value().get<double>(), false, ""});
    }
  }
  if (j.contains("overrides")) {
    if (!j["overrides"].is_array()) return Error{"overrides", "overrides must be a list of {limit, value, reason}"};
    for (std::size_t i = 0; i < j["overrides"].size(); ++i) {
      const json& o = j["overrides"][i];
      const std::string f = fmt::format("overrides[{}].", i);
      TW_TRY(known_keys(o, f, {"limit", "value", "reason"}));
      if (!o.contains("limit") || !o["limit"].is_string()) return Error{f + "limit", f + "limit must name a limit"};
      auto id = limit_from_key(o["limit"].get<std::string>());
      if (!id) return Error{f + "limit", f + "limit: " + id.error().message};
      double value = 0;
      if (!o.contains("value")) return Error{f + "value", f + "value is required"};
      TW_TRY(read_number(o, "value", f, value));
      if (!o.contains("reason") || !o["reason"].is_string()) {
        return Error{f + "reason", f + "reason is required: an override is recorded with its reason"};
      }
      settings.push_back({*id, value, true, o["reason"].get<std::string>()});
    }
  }
  auto limits = make_limits(settings);
  if (!limits) return limits.error();
  in.limits = *limits;
  TW_TRY(read_number(j, "evaporation_l_per_day", "", in.evaporation_l_per_day));
  TW_TRY(read_int(j, "horizon_days", "", in.horizon_days));
  TW_TRY(read_number(j, "gas_exchange_hours", "", in.gas_exchange_hours));
  TW_TRY(read_number(j, "salinity_tolerance", "", in.salinity_tolerance));
  if (j.contains("start_date")) {
    if (!j["start_date"].is_string()) return Error{"start_date", "start_date must be a date YYYY-MM-DD"};
    in.start_date = j["start_date"].get<std::string>();
  }
  TW_TRY(detail::check_start_date(in.start_date));
  return in;
}

namespace {
Result<json> additive_to_json(const additives::Additive& a, const std::string& where) {
  namespace ad = additives;
  const ad::AdditiveOrigin& o = a.origin;
  if (o.compound) return json{{"compound", ad::compound(*o.compound).key}};
  if (o.stock) {
    json ingredients = json::array();
    for (const ad::Ingredient& g : o.stock->ingredients) {
      ingredients.push_back({{"compound", ad::compound(g.compound).key}, {"grams_per_l", g.grams_per_l}});
    }
    return json{{"stock", {{"name", o.stock->name}, {"temperature_c", o.stock->temperature_c},
                           {"ingredients", ingredients}}}};
  }
  if (o.limewater) {
    return json{{"limewater", {{"temperature_c", o.limewater->temperature_c},
                               {"fraction_of_saturation", o.limewater->fraction_of_saturation}}}};
  }
  if (o.label) {
    const ad::LabelClaim& c = *o.label;
    return json{{"label", {{"name", c.name}, {"parameter", parameter_name(c.parameter)}, {"dose_ml", c.dose_ml},
                           {"tank_volume_l", c.tank_volume_l}, {"rise", c.rise},
                           {"dic_per_alkalinity_eq", c.dic_per_alkalinity_eq}, {"caustic", c.caustic}}}};
  }
  return Error{where, where + " (" + a.name + ") has no description a plan input file can hold"};
}

json band_to_json(const Band& b) { return {{"target", b.target}, {"low", b.low}, {"high", b.high}}; }

Result<json> plan_input_object(const PlanInput& in) {
  json j;
  json sys = {{"name", in.system.name},
              {"volume_l", in.system.volume_l},
              {"salinity", in.system.salinity},
              {"temperature_c", in.system.temperature_c},
              {"alkalinity_dkh", in.system.alkalinity_dkh},
              {"calcium_mg_l", in.system.calcium_mg_l},
              {"magnesium_mg_l", in.system.magnesium_mg_l},
              {"air_co2_ppm", in.system.air_co2_ppm}};
  if (in.system.ph_total) sys["ph_total"] = *in.system.ph_total;
  j["system"] = sys;
  j["targets"] = {{"alkalinity_dkh", band_to_json(in.targets.alkalinity_dkh)},
                  {"calcium_mg_l", band_to_json(in.targets.calcium_mg_l)},
                  {"magnesium_mg_l", band_to_json(in.targets.magnesium_mg_l)}};
  j["demand"] = {{"alkalinity_meq_per_day", in.demand.alkalinity_meq_per_day},
                 {"calcium_mg_per_day", in.demand.calcium_mg_per_day},
                 {"magnesium_mg_per_day", in.demand.magnesium_mg_per_day}};
  j["additives"] = json::array();
  for (std::size_t i = 0; i < in.deliveries.size(); ++i) {
    const Delivery& d = in.deliveries[i];
    auto a = additive_to_json(d.additive, fmt::format("additives[{}]", i));
    if (!a) return a.error();
    json x = *a;
    x["device"] = d.device;
    x["manual"] = d.manual;
    x["doses_per_day"] = d.doses_per_day;
    x["min_dose"] = d.min_dose;
    x["max_dose"] = d.max_dose;
    // "No pump limit" and "reservoir not tracked" are the reader's defaults: left out rather
    // than written as 1e9 and 0, which read as settings.
    const Delivery unset;
    if (d.max_per_day != unset.max_per_day) x["max_per_day"] = d.max_per_day;
    x["first_hour"] = d.first_hour;
    x["last_hour"] = d.last_hour;
    if (d.reservoir != unset.reservoir) x["reservoir"] = d.reservoir;
    if (d.calibration != unset.calibration) x["calibration"] = d.calibration;  // 1 (a true pump) is the default
    j["additives"].push_back(std::move(x));
  }
  // The limits as the keeper set them (the room kept for a journal's estimates is the planner's,
  // made again from the journal when there is one); past a hard bound only as an override.
  const Limits& set = in.limits_as_set ? *in.limits_as_set : in.limits;
  j["limits"] = json::object();
  j["overrides"] = json::array();
  for (const LimitSpec& spec : limit_specs()) {
    const double v = set.get(spec.id);
    if (v == spec.default_value) continue;
    if (spec.past_hard_bound(v)) {
      j["overrides"].push_back({{"limit", spec.key}, {"value", v}, {"reason", "as in the plan this file was written from"}});
    } else {
      j["limits"][spec.key] = v;
    }
  }
  j["evaporation_l_per_day"] = in.evaporation_l_per_day;
  j["horizon_days"] = in.horizon_days;
  j["gas_exchange_hours"] = in.gas_exchange_hours;
  j["salinity_tolerance"] = in.salinity_tolerance;
  j["start_date"] = in.start_date;
  return j;
}
}  // namespace

Result<std::string> plan_input_to_json(const PlanInput& in) {
  auto j = plan_input_object(in);
  if (!j) return j.error();
  return j->dump(2);
}

std::string plan_to_json(const PlanInput& in, const Plan& plan) {
  json j;
  j["system"] = in.system.name;
  j["ph_scale"] = plan.ph_scale;
  if (auto input = plan_input_object(in)) j["input"] = std::move(input).value();
  // The water and the demand the plan was made for (from the input, or the journal's basis).
  j["water"] = {{"volume_l", in.system.volume_l},
                {"salinity", in.system.salinity},
                {"temperature_c", in.system.temperature_c},
                {"room_co2_ppm", in.system.air_co2_ppm},
                {"ph_total", in.system.ph_total ? json(*in.system.ph_total) : json(nullptr)}};
  j["demand_per_day"] = {{"alkalinity_meq", in.demand.alkalinity_meq_per_day},
                         {"calcium_mg", in.demand.calcium_mg_per_day},
                         {"magnesium_mg", in.demand.magnesium_mg_per_day}};
  auto ws = [](const WaterState& w) {
    return json{{"alkalinity_dkh", w.alkalinity_dkh}, {"calcium_mg_l", w.calcium_mg_l},
                {"magnesium_mg_l", w.magnesium_mg_l}, {"ph_total", w.ph_total},
                {"omega_aragonite", w.omega_aragonite}, {"dic_umol_kg", w.dic_umol_kg}};
  };
  json limits = json::object();
  for (const auto& s : limit_specs()) {
    limits[s.key] = {{"value", plan.limits.get(s.id)}, {"default", s.default_value}, {"unit", s.unit},
                     {"side", s.side == LimitSide::Floor ? "floor" : "upper"}, {"hard_bound", s.hard_bound},
                     {"source", s.source}};
    // The value as the keeper set it, when the plan kept room inside it for the forecast's band.
    limits[s.key]["as_set"] = in.limits_as_set ? json(in.limits_as_set->get(s.id)) : json(plan.limits.get(s.id));
  }
  j["limits"] = limits;
  j["limit_record"] = plan.limits.record;
  j["doses"] = json::array();
  for (const auto& d : plan.doses) {
    j["doses"].push_back({{"day", d.day}, {"minute", d.minute}, {"additive", in.deliveries[d.delivery].additive.name},
                          {"amount", d.amount}, {"unit", additives::to_string(in.deliveries[d.delivery].additive.unit)},
                          // What to set on the pump for "amount" (amount / calibration).
                          {"amount_set", in.deliveries[d.delivery].set_amount(d.amount)},
                          {"capped_by", d.cap}, {"before", ws(d.before)}, {"after", ws(d.after)},
                          {"before_next", ws(d.before_next)}});
  }
  j["days"] = json::array();
  for (const auto& d : plan.days) {
    std::vector<double> set(d.amount_per_delivery.size());
    for (std::size_t k = 0; k < set.size() && k < in.deliveries.size(); ++k) set[k] = in.deliveries[k].set_amount(d.amount_per_delivery[k]);
    j["days"].push_back({{"day", d.day}, {"start", ws(d.start)}, {"end", ws(d.end)},
                         {"amount_per_additive", d.amount_per_delivery},
                         {"amount_set_per_additive", set},
                         {"largest_24h_rise", {{"alkalinity_dkh", d.rise_alkalinity_dkh},
                                               {"calcium_mg_l", d.rise_calcium_mg_l},
                                               {"magnesium_mg_l", d.rise_magnesium_mg_l}}},
                         {"largest_24h_fall", {{"alkalinity_dkh", d.fall_alkalinity_dkh},
                                               {"calcium_mg_l", d.fall_calcium_mg_l},
                                               {"magnesium_mg_l", d.fall_magnesium_mg_l}}}});
  }
  const char* names[] = {"alkalinity", "calcium", "magnesium"};
  // 95 % bands at each day's end, when the plan's start carries its uncertainty.
  auto band = [](const std::optional<Band95>& b) { return b ? json::array({b->low, b->high}) : json(nullptr); };
  for (std::size_t i = 0; i < plan.days.size(); ++i) {
    const DaySummary& d = plan.days[i];
    j["days"][i]["end_band_95"] =
        plan.uncertainty ? json{{"alkalinity_dkh", band(d.end_band[0])}, {"calcium_mg_l", band(d.end_band[1])},
                                {"magnesium_mg_l", band(d.end_band[2])}, {"ph_total", band(d.end_ph_band)},
                                {"omega_aragonite", band(d.end_omega_band)}}
                         : json(nullptr);
  }
  j["uncertainty"] = nullptr;
  if (plan.uncertainty) {
    json u = json::object();
    if (const auto& r = plan.uncertainty->retest) {
      u["test_again"] = {{"day", r->day}, {"minute", r->minute}, {"parameter", r->parameter},
                         {"limit", r->limit ? json(limit_spec(*r->limit).key) : json(nullptr)},
                         {"message", r->message}};
    }
    u["margin_cost"] = nullptr;
    if (const auto& c = plan.uncertainty->cost) {
      json days = json::object();
      for (std::size_t p = 0; p < 3; ++p) {
        days[names[p]] = c->target_day_without_room[p] ? json(*c->target_day_without_room[p]) : json(nullptr);
      }
      u["margin_cost"] = {{"room", c->room}, {"target_day_without_room", days},
                          {"amount_per_additive_with_room", c->amount_with_room},
                          {"amount_per_additive_without_room", c->amount_without_room}, {"summary", c->summary}};
    }
    if (in.limits_as_set) {
      json set = json::object();
      for (const auto& s : limit_specs()) set[s.key] = in.limits_as_set->get(s.id);
      u["limits_as_set"] = set;
    }
    j["uncertainty"] = u;
  }
  for (std::size_t p = 0; p < 3; ++p) {
    j["target_day"][names[p]] = plan.target_day[p] ? json(*plan.target_day[p]) : json(nullptr);
  }
  j["salinity_drift"] = {{"per_day", plan.salinity.per_day}, {"over_horizon", plan.salinity.over_horizon},
                         {"holding_seen", plan.salinity.holding_seen}, {"ramp_days", plan.salinity.ramp_days},
                         {"holding_per_day", plan.salinity.holding_per_day}, {"ramp_extra", plan.salinity.ramp_extra},
                         {"water_change_percent_per_week", plan.salinity.water_change_percent_per_week}};
  const Verdict& v = plan.verdict;
  json verdict = {{"holds", v.holds}, {"headline", v.headline}, {"reasons", v.reasons}, {"fixes", v.fixes}};
  verdict["first_crossing"] =
      v.first_limit ? json{{"limit", limit_spec(*v.first_limit).key}, {"day", v.first_day}, {"minute", v.first_minute},
                           {"value", v.first_value}, {"allowed", v.first_allowed}}
                    : json(nullptr);
  verdict["shortfalls"] = json::array();
  for (const auto& s : v.shortfalls) {
    verdict["shortfalls"].push_back({{"parameter", s.parameter}, {"unit", s.unit},
                                     {"deliverable_per_day", s.deliverable_per_day},
                                     {"consumed_per_day", s.consumed_per_day}});
  }
  verdict["target_conflicts"] = json::array();
  for (const auto& t : v.target_conflicts) {
    verdict["target_conflicts"].push_back(
        {{"limit", limit_spec(t.limit).key}, {"value", t.value}, {"allowed", t.allowed},
         {"ph_total_at_rest", t.ph_total}, {"omega_aragonite_at_rest", t.omega_aragonite},
         {"alkalinity_fit_dkh", t.alkalinity_fit_dkh ? json(*t.alkalinity_fit_dkh) : json(nullptr)},
         {"calcium_fit_mg_l", t.calcium_fit_mg_l ? json(*t.calcium_fit_mg_l) : json(nullptr)},
         {"message", t.message}});
  }
  if (v.start_dose) {
    const Delivery& d = in.deliveries[v.start_dose->delivery];
    verdict["start_dose"] = {{"device", d.device}, {"additive", d.additive.name}, {"amount", v.start_dose->amount},
                             {"unit", additives::to_string(d.additive.unit)},
                             {"first_dose_minute", v.start_dose->first_dose_minute},
                             {"on_top_of_plan", v.start_dose->on_top}, {"keeps_limits", v.start_dose->keeps_limits}};
  }
  j["verdict"] = verdict;
  j["findings"] = plan.findings;
  j["cautions"] = plan.cautions;
  return j.dump(2) + "\n";
}

}  // namespace tw::plan
