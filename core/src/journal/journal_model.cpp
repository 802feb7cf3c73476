// Journal model: validation of systems and events, and editing by id.
// Every editing call validates first and changes nothing when it refuses.
#include <algorithm>
#include <cctype>
#include <cmath>

#include <fmt/format.h>

#include "tidewright/common/datetime.hpp"
#include "tidewright/journal/device_name.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/journal/system_name.hpp"
#include "tidewright/journal/test_precision.hpp"
#include "journal_tidy_internal.hpp"

namespace tw::journal {

namespace {

std::string lower(std::string s) {
  for (auto& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

// Text fields must be valid UTF-8 (the file format is JSON text) without NUL bytes.
bool valid_utf8(const std::string& s) {
  size_t i = 0;
  while (i < s.size()) {
    const auto c = static_cast<unsigned char>(s[i]);
    size_t n = 0;
    std::uint32_t cp = 0;
    if (c == 0) return false;
    if (c < 0x80) { ++i; continue; }
    if ((c & 0xE0) == 0xC0) { n = 1; cp = c & 0x1Fu; }
    else if ((c & 0xF0) == 0xE0) { n = 2; cp = c & 0x0Fu; }
    else if ((c & 0xF8) == 0xF0) { n = 3; cp = c & 0x07u; }
    else return false;
    if (i + n >= s.size()) return false;  // sequence cut off at the end
    for (size_t k = 1; k <= n; ++k) {
      const auto d = static_cast<unsigned char>(s[i + k]);
      if ((d & 0xC0) != 0x80) return false;
      cp = (cp << 6) | (d & 0x3Fu);
    }
    if ((n == 1 && cp < 0x80) || (n == 2 && cp < 0x800) || (n == 3 && cp < 0x10000) ||
        cp > 0x10FFFF || (cp >= 0xD800 && cp <= 0xDFFF))
      return false;
    i += n + 1;
  }
  return true;
}

Status check_text(const char* field, const std::string& s) {
  if (!valid_utf8(s)) {
    return Error{field, std::string(field) + " must be UTF-8 text without NUL characters"};
  }
  return Ok{};
}

Status in_range(const std::string& field, double v, const Range& r) { return ranges::check(field, v, r); }

// lo < v <= hi (a volume or an amount of zero means nothing happened).
Status positive_in_range(const std::string& field, double v, const Range& r) {
  if (!std::isfinite(v) || v <= r.lo || v > r.hi) {
    const std::string u = r.unit[0] ? std::string(" ") + r.unit : "";
    if (!std::isfinite(v)) {
      return Error{field, fmt::format("{} is not a number; accepted: more than {:g} up to {:g}{}",
                                      field, r.lo, r.hi, u)};
    }
    return Error{field, fmt::format("{} {:g}{} is outside the accepted range: more than {:g} up "
                                    "to {:g}{}",
                                    field, v, u, r.lo, r.hi, u)};
  }
  return Ok{};
}

Status optional_in_range(const std::string& field, const std::optional<double>& v, const Range& r) {
  if (!v) return Ok{};
  return in_range(field, *v, r);
}

const Range& range_of(Parameter p) { return ranges::of_measurement(p); }

Status validate_test(const TestResult& t) {
  if (t.parameter == Parameter::Other &&
      (t.other_name.empty() || t.other_name.size() > 40)) {
    return Error{"other_name", "other_name must name the parameter in 1 to 40 characters"};
  }
  if (t.parameter != Parameter::Other && !t.other_name.empty()) {
    return Error{"other_name", "other_name is only for parameter 'other'"};
  }
  auto unit = normalize_unit(t.parameter, t.unit);
  if (!unit) return unit.error();
  if (*unit != t.unit) {
    return Error{"unit", "unit '" + t.unit + "' must be written '" + *unit + "'"};
  }
  const Range& r = range_of(t.parameter);
  // Not a number: said so, with the parameter's own range (not a range of 0 to 0).
  if (!std::isfinite(t.value)) return out_of_range_error("value", t.value, r.lo, r.hi, r.unit);
  const double canon = *canonical_value(t);
  if (!std::isfinite(canon) || canon < r.lo || canon > r.hi) {
    const std::string shown =
        t.unit == r.unit || t.parameter == Parameter::Other || t.parameter == Parameter::PH ||
                t.parameter == Parameter::SpecificGravity
            ? fmt::format("{:g} {}", t.value, t.unit)
            : fmt::format("{:g} {} ({:g} {})", t.value, t.unit, canon, r.unit);
    return Error{"value", fmt::format("{} {} is outside the accepted range {:g} to {:g} {} "
                                      "(plausible range, common practice)",
                                      tw::parameter_name(t.parameter), shown, r.lo, r.hi,
                                      t.parameter == Parameter::Other ? "" : parameter_unit(t.parameter))};
  }
  if (t.precision) {
    const auto b = accepted_precision_in_unit(t.parameter, t.unit);  // the unit was accepted above
    const double hi = b ? b->hi : (r.hi - r.lo) / 2.0;
    Status s = positive_in_range("precision", *t.precision, Range{0.0, hi, t.unit.c_str()});
    if (!s) return s;
  }
  if (t.parameter == Parameter::PH && !t.ph_scale) {
    return Error{"ph_scale", "a pH result needs its ph_scale: total, sws, free or nbs"};
  }
  if (t.parameter != Parameter::PH && t.ph_scale) {
    return Error{"ph_scale", "ph_scale is only for pH results"};
  }
  if (t.kit.size() > 100) return Error{"kit", "kit name is longer than 100 characters"};
  if (Status k = check_text("kit", t.kit); !k) return k;
  if (Status k = check_text("unit", t.unit); !k) return k;
  if (Status k = check_text("other_name", t.other_name); !k) return k;
  return Ok{};
}

Status validate_dose(const Dose& d) {
  if (d.additive_id.empty() || d.additive_id.size() > 60) {
    return Error{"additive_id", "additive_id must name a catalog additive in 1 to 60 characters"};
  }
  if (Status t = check_text("additive_id", d.additive_id); !t) return t;
  Status s = positive_in_range("amount", d.amount, ranges::kDoseAmount);
  if (!s) return s;
  if (d.stock_g_per_l) {
    if (d.unit != DoseUnit::Millilitres) {
      return Error{"stock_g_per_l", "stock_g_per_l is only for doses in mL of a stock solution"};
    }
    return positive_in_range("stock_g_per_l", *d.stock_g_per_l, ranges::kStockGPerL);
  }
  return Ok{};
}

// A water change or top-off: more than 0 and at most the system's net volume.
Status volume_within_system(double volume_l, const System& sys) {
  Status s = positive_in_range("volume_l", volume_l, Range{0.0, sys.volume_l, "L"});
  if (!s) return Error{s.error().field, s.error().message + " (the system's net volume)"};
  return s;
}

// A dose marked missed or extra: its schedule is a DoseSchedule of the same system, giving the
// same additive in the same unit, running at the dose's time.
Status validate_mark(const Journal& journal, const Event& e, const Dose& d) {
  if (d.mark == ScheduleMark::None) {
    if (d.schedule_id) return Error{"schedule_id", "schedule_id is only for a dose marked missed or extra"};
    return Ok{};
  }
  if (!d.schedule_id) {
    return Error{"schedule_id", fmt::format("a dose marked {} needs the schedule it belongs to (schedule_id)",
                                            to_string(d.mark))};
  }
  const Event* se = find_event(journal, *d.schedule_id);
  const auto* sched = se ? std::get_if<DoseSchedule>(&se->data) : nullptr;
  if (!sched || se->system_id != e.system_id) {
    return Error{"schedule_id", fmt::format("schedule_id {} is not a dose schedule of this system", *d.schedule_id)};
  }
  if (sched->additive_id != d.additive_id || sched->unit != d.unit) {
    return Error{"additive_id", fmt::format("a dose marked {} must be of the schedule's additive ({} in {})",
                                            to_string(d.mark), sched->additive_id, to_string(sched->unit))};
  }
  if (e.time_s < se->time_s || (sched->stop_time_s && e.time_s > *sched->stop_time_s)) {
    return Error{"time", fmt::format("a dose marked {} must fall while its schedule runs ({} to {})",
                                     to_string(d.mark), datetime::format_iso8601_utc(se->time_s),
                                     sched->stop_time_s ? datetime::format_iso8601_utc(*sched->stop_time_s)
                                                        : std::string("now"))};
  }
  return Ok{};
}

Status validate_schedule(const Event& e, const DoseSchedule& d) {
  if (d.device.empty() || d.device.size() > kMaxDeviceNameChars) {
    return Error{"device", fmt::format("device must name the pump or routine in 1 to {} characters", kMaxDeviceNameChars)};
  }
  if (Status t = check_text("device", d.device); !t) return t;
  if (d.stock_name.size() > 60) return Error{"stock_name", "stock_name must have at most 60 characters"};
  if (Status t = check_text("stock_name", d.stock_name); !t) return t;
  Dose as_dose{d.additive_id, d.amount, d.unit, d.stock_g_per_l, ScheduleMark::None, std::nullopt};
  if (Status s = validate_dose(as_dose); !s) return s;
  if (d.doses_per_day < 1 || d.doses_per_day > kMaxDosesPerDay) {
    return Error{"doses_per_day", fmt::format("doses_per_day {} is outside the accepted range 1 to {}",
                                              d.doses_per_day, kMaxDosesPerDay)};
  }
  if (Status s = in_range("calibration", d.calibration, ranges::kPumpCalibration); !s) return s;
  if (d.stop_time_s && (*d.stop_time_s <= e.time_s || *d.stop_time_s > ranges::kLatestTimeS)) {
    return Error{"stop", fmt::format("stop {} must come after the schedule's start {}",
                                     datetime::format_iso8601_utc(*d.stop_time_s),
                                     datetime::format_iso8601_utc(e.time_s))};
  }
  return Ok{};
}

Status validate_water_change(const WaterChange& w, const System& sys) {
  Status s = volume_within_system(w.volume_l, sys);
  if (!s) return s;
  if (!(s = optional_in_range("alkalinity_dkh", w.alkalinity_dkh, ranges::kAlkalinityDkh))) return s;
  if (!(s = optional_in_range("calcium_mg_l", w.calcium_mg_l, ranges::kCalciumMgL))) return s;
  if (!(s = optional_in_range("magnesium_mg_l", w.magnesium_mg_l, ranges::kMagnesiumMgL))) return s;
  return optional_in_range("salinity", w.salinity, ranges::kSalinity);
}

Status validate_top_off(const TopOff& t, const System& sys) {
  Status s = volume_within_system(t.volume_l, sys);
  if (!s) return s;
  if (t.limewater_g_per_l) {
    if (t.kind != TopOffKind::Limewater) {
      return Error{"limewater_g_per_l", "limewater_g_per_l is only for limewater top-off"};
    }
    return positive_in_range("limewater_g_per_l", *t.limewater_g_per_l, ranges::kLimewaterGPerL);
  }
  return Ok{};
}

template <class Vec, class Id>
auto find_by_id(Vec& v, Id id) {
  return std::find_if(v.begin(), v.end(), [id](const auto& x) { return x.id == id; });
}

bool id_in_use(const Journal& j, std::int64_t id) {
  return find_system(j, id) != nullptr || find_event(j, id) != nullptr;
}

Status check_no_marks_refer(const Journal& j, EventId schedule) {
  for (const auto& e : j.events) {
    const auto* d = std::get_if<Dose>(&e.data);
    if (d && d->schedule_id == schedule) {
      return Error{"id", fmt::format("schedule {} has doses marked against it (event {}); remove those first",
                                     schedule, e.id)};
    }
  }
  return Ok{};
}

void insert_sorted(std::vector<Event>& events, Event e) {
  auto pos = std::upper_bound(events.begin(), events.end(), e, [](const Event& a, const Event& b) {
    return a.time_s != b.time_s ? a.time_s < b.time_s : a.id < b.id;
  });
  events.insert(pos, std::move(e));
}

}  // namespace

Status validate_system(const Journal& journal, const System& s) {
  if (s.name.empty() || s.name.size() > 100) {
    return Error{"name", "name must have 1 to 100 characters"};
  }
  if (Status t = check_text("name", s.name); !t) return t;
  for (const auto& other : journal.systems) {
    if (other.id != s.id && lower(other.name) == lower(s.name)) {
      return Error{"name", "name '" + s.name + "' is already used by another system"};
    }
  }
  Status st = in_range("volume_l", s.volume_l, ranges::kSystemVolumeL);
  if (!st) return st;
  if (s.volume_parts) {
    const auto& p = *s.volume_parts;
    if (!(st = in_range("display_l", p.display_l, ranges::kEventVolumeL))) return st;
    if (!(st = in_range("sump_l", p.sump_l, ranges::kEventVolumeL))) return st;
    if (!(st = in_range("rock_displacement_l", p.rock_displacement_l,
                        Range{0.0, p.display_l + p.sump_l, "L (display + sump)"})))
      return st;
    const double net = net_volume_l(p);
    if (std::fabs(net - s.volume_l) > 1e-9 * std::max(1.0, net)) {
      return Error{"volume_l", fmt::format("volume_l {:g} L does not match display + sump - rock "
                                           "displacement = {:g} L",
                                           s.volume_l, net)};
    }
  }
  if (!(st = in_range("default_salinity", s.default_salinity, ranges::kSalinity))) return st;
  if (!(st = in_range("default_temperature_c", s.default_temperature_c, ranges::kTemperatureC)))
    return st;
  if (!(st = optional_in_range("target alkalinity_dkh", s.targets.alkalinity_dkh,
                               ranges::kAlkalinityTargetDkh)))
    return st;
  if (!(st = optional_in_range("target calcium_mg_l", s.targets.calcium_mg_l, ranges::kCalciumTargetMgL)))
    return st;
  return optional_in_range("target magnesium_mg_l", s.targets.magnesium_mg_l, ranges::kMagnesiumTargetMgL);
}

Status check_not_in_future(std::int64_t time_s, std::int64_t now_s) {
  if (time_s <= now_s + kFutureSlackS) return Ok{};
  return Error{"time", fmt::format("time {} is in the future (now {}); accepted: up to {} minutes after now",
                                   datetime::format_iso8601_utc(time_s), datetime::format_iso8601_utc(now_s),
                                   kFutureSlackS / 60)};
}

Status validate_event(const Journal& journal, const Event& e) {
  const System* sys = find_system(journal, e.system_id);
  if (!sys) {
    return Error{"system_id", fmt::format("system_id {} is not a system of this journal", e.system_id)};
  }
  if (e.time_s < ranges::kEarliestTimeS || e.time_s > ranges::kLatestTimeS) {
    return Error{"time", fmt::format("time {} s is outside the accepted range 1970-01-01 to "
                                     "2200-01-01 UTC",
                                     e.time_s)};
  }
  if (e.time_text.size() > 100) return Error{"time_text", "time_text is longer than 100 characters"};
  if (Status t = check_text("time_text", e.time_text); !t) return t;
  if (const auto* t = std::get_if<TestResult>(&e.data)) return validate_test(*t);
  if (const auto* d = std::get_if<Dose>(&e.data)) {
    if (Status s = validate_dose(*d); !s) return s;
    return validate_mark(journal, e, *d);
  }
  if (const auto* d = std::get_if<DoseSchedule>(&e.data)) return validate_schedule(e, *d);
  if (const auto* w = std::get_if<WaterChange>(&e.data)) return validate_water_change(*w, *sys);
  if (const auto* o = std::get_if<TopOff>(&e.data)) return validate_top_off(*o, *sys);
  const auto& n = std::get<Note>(e.data);
  if (n.text.empty() || n.text.size() > 10000) {
    return Error{"text", "a note needs 1 to 10000 characters of text"};
  }
  if (Status t = check_text("text", n.text); !t) return t;
  return Ok{};
}

Result<SystemId> add_system(Journal& journal, System system) {
  if (system.id < 0 || (system.id != 0 && id_in_use(journal, system.id))) {
    return Error{"id", fmt::format("id {} is already in use or negative", system.id)};
  }
  system.name = trim_system_name(system.name);
  tidy_numbers(system);
  if (Status n = check_system_name(system.name); !n) return n.error();
  Status s = validate_system(journal, system);
  if (!s) return s.error();
  if (system.id == 0) system.id = journal.next_id;
  journal.next_id = std::max(journal.next_id, system.id + 1);
  journal.systems.push_back(std::move(system));
  return journal.systems.back().id;
}

Result<EventId> add_event(Journal& journal, Event event) {
  if (event.id < 0 || (event.id != 0 && id_in_use(journal, event.id))) {
    return Error{"id", fmt::format("id {} is already in use or negative", event.id)};
  }
  tidy_numbers(event);
  Status s = validate_event(journal, event);
  if (!s) return s.error();
  if (event.id == 0) event.id = journal.next_id;
  journal.next_id = std::max(journal.next_id, event.id + 1);
  const EventId id = event.id;
  insert_sorted(journal.events, std::move(event));
  return id;
}

Status update_system(Journal& journal, const System& changed) {
  auto it = find_by_id(journal.systems, changed.id);
  if (it == journal.systems.end()) {
    return Error{"id", fmt::format("no system with id {}", changed.id)};
  }
  // A new name meets today's rule; a name kept as it was (perhaps from before the rule) stays.
  System system = changed;
  tidy_numbers(system);
  if (system.name != it->name) {
    system.name = trim_system_name(system.name);
    if (system.name != it->name) {
      if (Status n = check_system_name(system.name); !n) return n;
    }
  }
  Status s = validate_system(journal, system);
  if (!s) return s;
  // A smaller volume must still hold every logged water change and top-off.
  Journal trial;
  trial.systems = {system};
  for (const auto& e : journal.events) {
    if (e.system_id != system.id) continue;
    Status es = validate_event(trial, e);
    if (!es) {
      return Error{es.error().field, fmt::format("event {} would no longer be valid: {}", e.id,
                                                 es.error().message)};
    }
  }
  *it = system;
  return Ok{};
}

Status update_event(Journal& journal, const Event& changed) {
  Event event = changed;
  tidy_numbers(event);
  auto it = find_by_id(journal.events, event.id);
  if (it == journal.events.end()) return Error{"id", fmt::format("no event with id {}", event.id)};
  Status s = validate_event(journal, event);
  if (!s) return s;
  // A changed schedule must still hold the doses marked against it.
  Journal trial = journal;
  *find_by_id(trial.events, event.id) = event;
  for (const auto& e : trial.events) {
    const auto* d = std::get_if<Dose>(&e.data);
    if (!d || d->schedule_id != event.id) continue;
    Status es = validate_event(trial, e);
    if (!es) {
      return Error{es.error().field, fmt::format("marked dose {} would no longer be valid: {}", e.id,
                                                 es.error().message)};
    }
  }
  journal.events.erase(it);
  insert_sorted(journal.events, event);
  return Ok{};
}

Status remove_system(Journal& journal, SystemId id, bool with_events) {
  auto it = find_by_id(journal.systems, id);
  if (it == journal.systems.end()) return Error{"id", fmt::format("no system with id {}", id)};
  const auto n = std::count_if(journal.events.begin(), journal.events.end(),
                               [id](const Event& e) { return e.system_id == id; });
  if (n > 0 && !with_events) {
    return Error{"id", fmt::format("system {} still has {} events; remove them too to delete it",
                                   id, n)};
  }
  journal.systems.erase(it);
  journal.events.erase(std::remove_if(journal.events.begin(), journal.events.end(),
                                      [id](const Event& e) { return e.system_id == id; }),
                       journal.events.end());
  return Ok{};
}

Status remove_event(Journal& journal, EventId id) {
  auto it = find_by_id(journal.events, id);
  if (it == journal.events.end()) return Error{"id", fmt::format("no event with id {}", id)};
  if (Status s = check_no_marks_refer(journal, id); !s) return s;
  journal.events.erase(it);
  return Ok{};
}

const System* find_system(const Journal& journal, SystemId id) {
  auto it = find_by_id(journal.systems, id);
  return it == journal.systems.end() ? nullptr : &*it;
}

const System* find_system_by_name(const Journal& journal, const std::string& name) {
  const std::string want = lower(name);
  for (const auto& s : journal.systems) {
    if (lower(s.name) == want) return &s;
  }
  return nullptr;
}

const Event* find_event(const Journal& journal, EventId id) {
  auto it = find_by_id(journal.events, id);
  return it == journal.events.end() ? nullptr : &*it;
}

const Event* find_equal_event(const Journal& journal, const Event& event) {
  // Events are sorted by time: look only at those with the same time.
  auto it = std::lower_bound(journal.events.begin(), journal.events.end(), event.time_s,
                             [](const Event& x, std::int64_t t) { return x.time_s < t; });
  for (; it != journal.events.end() && it->time_s == event.time_s; ++it) {
    if (it->system_id == event.system_id && it->data == event.data) return &*it;
  }
  return nullptr;
}

std::vector<const Event*> select_events(const Journal& journal, const EventFilter& f) {
  std::vector<const Event*> out;
  for (const auto& e : journal.events) {
    if (f.system_id && e.system_id != *f.system_id) continue;
    if (f.from_s && e.time_s < *f.from_s) continue;
    if (f.to_s && e.time_s > *f.to_s) continue;
    if (f.parameter) {
      const auto* t = std::get_if<TestResult>(&e.data);
      if (!t || t->parameter != *f.parameter) continue;
    }
    out.push_back(&e);
  }
  return out;
}

}  // namespace tw::journal
