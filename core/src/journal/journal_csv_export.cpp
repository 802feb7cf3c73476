// Journal CSV export: long form, RFC 4180, spreadsheet formulas defused.
#include <fmt/format.h>

#include "tidewright/common/csv.hpp"
#include "tidewright/journal/journal_csv.hpp"

namespace tw::journal {

const std::vector<std::string>& csv_long_columns() {
  static const std::vector<std::string> kColumns = {
      "time",          "system",           "type",
      "parameter",     "other_name",       "value",
      "unit",          "precision",        "ph_scale",
      "kit",           "additive",         "amount",
      "amount_unit",   "stock_g_per_l",    "volume",
      "volume_unit",   "top_off_kind",     "limewater_g_per_l",
      "new_alkalinity_dkh", "new_calcium_mg_l", "new_magnesium_mg_l",
      "new_salinity",  "note"};
  return kColumns;
}

namespace {

enum Col {
  kTime, kSystem, kType, kParameter, kOtherName, kValue, kUnit, kPrecision, kPhScale, kKit,
  kAdditive, kAmount, kAmountUnit, kStock, kVolume, kVolumeUnit, kTopOffKind, kLimewater,
  kNewAlk, kNewCa, kNewMg, kNewSal, kNote, kCount
};

// Shortest text that reads back to the same double ({} in fmt is round-trip exact).
std::string num(double v) { return fmt::format("{}", v); }
std::string num(const std::optional<double>& v) { return v ? num(*v) : ""; }

}  // namespace

bool csv_exportable(const Event& e) {
  if (std::holds_alternative<DoseSchedule>(e.data)) return false;
  const auto* d = std::get_if<Dose>(&e.data);
  return d == nullptr || d->mark == ScheduleMark::None;
}

std::string export_csv(const Journal& journal, const EventFilter& filter) {
  std::string out = csv::format_row(csv_long_columns(), true);
  for (const Event* e : select_events(journal, filter)) {
    if (!csv_exportable(*e)) continue;
    std::vector<std::string> c(kCount);
    const System* sys = find_system(journal, e->system_id);
    c[kTime] = datetime::format_iso8601_utc(e->time_s);
    c[kSystem] = sys ? sys->name : std::to_string(e->system_id);
    c[kType] = event_type_name(e->data);
    if (const auto* t = std::get_if<TestResult>(&e->data)) {
      c[kParameter] = tw::parameter_name(t->parameter);
      c[kOtherName] = t->other_name;
      c[kValue] = num(t->value);
      c[kUnit] = t->unit;
      c[kPrecision] = num(t->precision);
      if (t->ph_scale) c[kPhScale] = ph_scale_name(*t->ph_scale);
      c[kKit] = t->kit;
    } else if (const auto* d = std::get_if<Dose>(&e->data)) {
      c[kAdditive] = d->additive_id;
      c[kAmount] = num(d->amount);
      c[kAmountUnit] = to_string(d->unit);
      c[kStock] = num(d->stock_g_per_l);
    } else if (const auto* w = std::get_if<WaterChange>(&e->data)) {
      c[kVolume] = num(w->volume_l);
      c[kVolumeUnit] = "L";
      c[kNewAlk] = num(w->alkalinity_dkh);
      c[kNewCa] = num(w->calcium_mg_l);
      c[kNewMg] = num(w->magnesium_mg_l);
      c[kNewSal] = num(w->salinity);
    } else if (const auto* o = std::get_if<TopOff>(&e->data)) {
      c[kVolume] = num(o->volume_l);
      c[kVolumeUnit] = "L";
      c[kTopOffKind] = to_string(o->kind);
      c[kLimewater] = num(o->limewater_g_per_l);
    } else {
      c[kNote] = std::get<Note>(e->data).text;
    }
    out += csv::format_row(c, true);
  }
  return out;
}

}  // namespace tw::journal
