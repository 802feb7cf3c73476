#include "log_format.hpp"

#include <fmt/format.h>

#include "tidewright/common/datetime.hpp"
#include "tidewright/common/one_line.hpp"
#include "tidewright/common/stored_number.hpp"
#include "tidewright/journal/schedule.hpp"

namespace tw::shell {

using namespace tw::journal;

std::string describe_system_line(const System& s) {
  const std::string vol = volume_text(s.volume_l, s.units.volume);
  const double t = units::temperature_from_celsius(s.default_temperature_c, s.units.temperature);
  std::string out = fmt::format("{} ({}, {} net, S {:g}, {:g} {}", text::one_line(s.name), to_string(s.kind), vol,
                                s.default_salinity, t, to_string(s.units.temperature));
  std::string targets;
  auto add = [&](const char* what, const std::optional<double>& v, const char* unit) {
    if (!v) return;
    targets += fmt::format("{}{} {:g} {}", targets.empty() ? "" : ", ", what, *v, unit);
  };
  add("alk", s.targets.alkalinity_dkh, "dKH");
  add("Ca", s.targets.calcium_mg_l, "mg/L");
  add("Mg", s.targets.magnesium_mg_l, "mg/L");
  if (!targets.empty()) out += ", targets " + targets;
  return out + ")";
}

namespace {
std::string what(const EventData& data, units::VolumeUnit shown) {
  if (const auto* t = std::get_if<TestResult>(&data)) {
    std::string name = t->parameter == Parameter::Other ? t->other_name : tw::parameter_name(t->parameter);
    std::string s = fmt::format("test {} {:g} {}", name, t->value, t->unit);
    if (t->ph_scale) s += fmt::format(" ({} scale)", ph_scale_name(*t->ph_scale));
    if (t->precision) s += fmt::format(" (sd {:g})", *t->precision);
    if (!t->kit.empty()) s += " [" + t->kit + "]";
    return s;
  }
  if (const auto* d = std::get_if<Dose>(&data)) {
    std::string s = fmt::format("dose {} {:g} {}", d->additive_id, d->amount, to_string(d->unit));
    if (d->stock_g_per_l) s += fmt::format(" (stock {:g} g/L)", *d->stock_g_per_l);
    if (d->mark != ScheduleMark::None && d->schedule_id) {
      s += fmt::format(" [{} dose of schedule {}]", to_string(d->mark), *d->schedule_id);
    }
    return s;
  }
  if (const auto* p = std::get_if<DoseSchedule>(&data)) {
    std::string s = "schedule " + schedule_summary(*p);
    if (p->stop_time_s) s += ", stopped " + datetime::format_iso8601_utc(*p->stop_time_s);
    return s;
  }
  if (const auto* w = std::get_if<WaterChange>(&data)) {
    std::string s = "water change " + volume_text(w->volume_l, shown);
    std::string nw;
    auto add = [&](const char* k, const std::optional<double>& v, const char* unit) {
      if (v) nw += fmt::format("{}{} {:g}{}", nw.empty() ? "" : ", ", k, *v, unit);
    };
    add("alk", w->alkalinity_dkh, " dKH");
    add("Ca", w->calcium_mg_l, " mg/L");
    add("Mg", w->magnesium_mg_l, " mg/L");
    add("S", w->salinity, "");
    if (!nw.empty()) s += " (new water " + nw + ")";
    return s;
  }
  if (const auto* o = std::get_if<TopOff>(&data)) {
    std::string s = "top-off " + volume_text(o->volume_l, shown) + " " + to_string(o->kind);
    if (o->limewater_g_per_l) s += fmt::format(" ({:g} g/L)", *o->limewater_g_per_l);
    return s;
  }
  return "note: " + std::get<Note>(data).text;
}
}  // namespace

std::string describe_event_line(const Journal& j, const Event& e) {
  const System* s = find_system(j, e.system_id);
  std::string t = datetime::format_iso8601_utc(e.time_s);  // 2026-11-01T08:00:00Z
  t = t.substr(0, 10) + " " + t.substr(11, 5) + "Z";
  // Free text (a note, a kit, an older system name) may hold line breaks: escaped, one line.
  return fmt::format("{:>5}  {}  {:<20}  {}", e.id, t, s ? text::one_line(s->name) : "?", text::one_line(what(e.data, s ? s->units.volume : units::VolumeUnit::Litre)));
}

}  // namespace tw::shell
