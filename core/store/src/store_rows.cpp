// Systems and events <-> table rows. Enum values are stored by the names the core gives them
// (the same names as in the JSON format) and read back through the core's parsers.
#include "store_rows.hpp"

#include <string>

namespace tw::store::detail {

using namespace tw::journal;

const char* const kSystemColumns =
    "id, name, kind, volume_l, display_l, sump_l, rock_displacement_l, default_salinity, "
    "default_temperature_c, alkalinity_unit, calcium_magnesium_unit, temperature_unit, ph_scale, "
    "volume_unit, target_alkalinity_dkh, target_calcium_mg_l, target_magnesium_mg_l";

const char* const kEventColumns =
    "id, system_id, time_s, time_text, type, parameter, other_name, value, unit, precision, "
    "ph_scale, kit, additive, amount, amount_unit, stock_g_per_l, volume_l, new_alkalinity_dkh, "
    "new_calcium_mg_l, new_magnesium_mg_l, new_salinity, top_off_kind, limewater_g_per_l, note, mark, schedule_id, "
    "device, stock_name, doses_per_day, calibration, stop_s";

namespace {

template <class T>
T known(Result<T> r, const char* what, std::int64_t id) {
  if (!r) {
    throw StoreFailure(std::string("record ") + std::to_string(id) + ": " + what + ": " + r.error().message);
  }
  return std::move(r).value();
}

void bind_system(Statement& st, const System& s) {
  st.bind(1, s.id).bind(2, s.name).bind(3, std::string(to_string(s.kind))).bind(4, s.volume_l);
  if (s.volume_parts) {
    st.bind(5, s.volume_parts->display_l).bind(6, s.volume_parts->sump_l).bind(7, s.volume_parts->rock_displacement_l);
  } else {
    st.bind_null(5).bind_null(6).bind_null(7);
  }
  st.bind(8, s.default_salinity).bind(9, s.default_temperature_c);
  st.bind(10, std::string(units::to_string(s.units.alkalinity)));
  st.bind(11, std::string(units::to_string(s.units.calcium_magnesium)));
  st.bind(12, std::string(to_string(s.units.temperature)));
  st.bind(13, std::string(ph_scale_name(s.units.ph_scale)));
  st.bind(14, std::string(units::to_string(s.units.volume)));
  st.bind(15, s.targets.alkalinity_dkh).bind(16, s.targets.calcium_mg_l).bind(17, s.targets.magnesium_mg_l);
}

// Parameters 2.. of an event row (1 is the id).
void bind_event(Statement& st, const Event& e) {
  for (int i = 2; i <= 31; ++i) st.bind_null(i);
  st.bind(1, e.id).bind(2, e.system_id).bind(3, e.time_s).bind_text_or_null(4, e.time_text);
  st.bind(5, std::string(event_type_name(e.data)));
  if (const auto* t = std::get_if<TestResult>(&e.data)) {
    st.bind(6, std::string(tw::parameter_name(t->parameter))).bind_text_or_null(7, t->other_name);
    st.bind(8, t->value).bind(9, t->unit).bind(10, t->precision);
    if (t->ph_scale) st.bind(11, std::string(ph_scale_name(*t->ph_scale)));
    st.bind_text_or_null(12, t->kit);
  } else if (const auto* d = std::get_if<Dose>(&e.data)) {
    st.bind(13, d->additive_id).bind(14, d->amount).bind(15, std::string(to_string(d->unit)));
    st.bind(16, d->stock_g_per_l);
    if (d->mark != ScheduleMark::None) st.bind(25, std::string(to_string(d->mark)));
    if (d->schedule_id) st.bind(26, *d->schedule_id);
  } else if (const auto* p = std::get_if<DoseSchedule>(&e.data)) {
    st.bind(13, p->additive_id).bind(14, p->amount).bind(15, std::string(to_string(p->unit)));
    st.bind(16, p->stock_g_per_l);
    st.bind(27, p->device).bind_text_or_null(28, p->stock_name);
    st.bind(29, static_cast<std::int64_t>(p->doses_per_day)).bind(30, p->calibration);
    if (p->stop_time_s) st.bind(31, *p->stop_time_s);
  } else if (const auto* w = std::get_if<WaterChange>(&e.data)) {
    st.bind(17, w->volume_l).bind(18, w->alkalinity_dkh).bind(19, w->calcium_mg_l);
    st.bind(20, w->magnesium_mg_l).bind(21, w->salinity);
  } else if (const auto* o = std::get_if<TopOff>(&e.data)) {
    st.bind(17, o->volume_l).bind(22, std::string(to_string(o->kind))).bind(23, o->limewater_g_per_l);
  } else {
    st.bind(24, std::get<Note>(e.data).text);
  }
}

}  // namespace

void insert_system(sqlite3* db, const System& s) {
  Statement st(db, "INSERT INTO systems (id, name, kind, volume_l, display_l, sump_l, rock_displacement_l, "
                   "default_salinity, default_temperature_c, alkalinity_unit, calcium_magnesium_unit, "
                   "temperature_unit, ph_scale, volume_unit, target_alkalinity_dkh, target_calcium_mg_l, "
                   "target_magnesium_mg_l) VALUES (?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?)");
  bind_system(st, s);
  st.run();
}

void update_system_row(sqlite3* db, const System& s) {
  Statement st(db, "UPDATE systems SET name = ?2, kind = ?3, volume_l = ?4, display_l = ?5, sump_l = ?6, "
                   "rock_displacement_l = ?7, default_salinity = ?8, default_temperature_c = ?9, "
                   "alkalinity_unit = ?10, calcium_magnesium_unit = ?11, temperature_unit = ?12, "
                   "ph_scale = ?13, volume_unit = ?14, target_alkalinity_dkh = ?15, "
                   "target_calcium_mg_l = ?16, target_magnesium_mg_l = ?17 WHERE id = ?1");
  bind_system(st, s);
  st.run();
}

const char* event_insert_sql() {
  return "INSERT INTO events (id, system_id, time_s, time_text, type, parameter, other_name, value, unit, "
         "precision, ph_scale, kit, additive, amount, amount_unit, stock_g_per_l, volume_l, "
         "new_alkalinity_dkh, new_calcium_mg_l, new_magnesium_mg_l, new_salinity, top_off_kind, "
         "limewater_g_per_l, note, mark, schedule_id, device, stock_name, doses_per_day, calibration, stop_s) "
         "VALUES (?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?)";
}

void insert_event(Statement& insert, const Event& e) {
  insert.reset();
  bind_event(insert, e);
  insert.run();
}

void update_event_row(sqlite3* db, const Event& e) {
  Statement st(db, "UPDATE events SET system_id = ?2, time_s = ?3, time_text = ?4, type = ?5, parameter = ?6, "
                   "other_name = ?7, value = ?8, unit = ?9, precision = ?10, ph_scale = ?11, kit = ?12, "
                   "additive = ?13, amount = ?14, amount_unit = ?15, stock_g_per_l = ?16, volume_l = ?17, "
                   "new_alkalinity_dkh = ?18, new_calcium_mg_l = ?19, new_magnesium_mg_l = ?20, "
                   "new_salinity = ?21, top_off_kind = ?22, limewater_g_per_l = ?23, note = ?24, mark = ?25, "
                   "schedule_id = ?26, device = ?27, stock_name = ?28, doses_per_day = ?29, calibration = ?30, "
                   "stop_s = ?31 WHERE id = ?1");
  bind_event(st, e);
  st.run();
}

System read_system(const Statement& r) {
  System s;
  s.id = r.integer(0);
  s.name = r.text(1);
  s.kind = known(system_kind_from_string(r.text(2)), "kind", s.id);
  s.volume_l = r.real(3);
  if (!r.is_null(4)) s.volume_parts = VolumeParts{r.real(4), r.real(5), r.real(6)};
  s.default_salinity = r.real(7);
  s.default_temperature_c = r.real(8);
  s.units.alkalinity = known(units::alkalinity_unit_from_string(r.text(9)), "alkalinity unit", s.id);
  s.units.calcium_magnesium = known(units::concentration_unit_from_string(r.text(10)), "calcium/magnesium unit", s.id);
  s.units.temperature = known(temperature_unit_from_string(r.text(11)), "temperature unit", s.id);
  s.units.ph_scale = known(ph_scale_from_name(r.text(12)), "pH scale", s.id);
  s.units.volume = known(units::volume_unit_from_string(r.text(13)), "volume unit", s.id);
  s.targets = Targets{r.optional_real(14), r.optional_real(15), r.optional_real(16)};
  return s;
}

Event read_event(const Statement& r) {
  Event e;
  e.id = r.integer(0);
  e.system_id = r.integer(1);
  e.time_s = r.integer(2);
  e.time_text = r.text(3);
  const std::string type = r.text(4);
  if (type == "test") {
    TestResult t;
    t.parameter = known(tw::parameter_from_name(r.text(5)), "parameter", e.id);
    t.other_name = r.text(6);
    t.value = r.real(7);
    t.unit = r.text(8);
    t.precision = r.optional_real(9);
    if (!r.is_null(10)) t.ph_scale = known(ph_scale_from_name(r.text(10)), "pH scale", e.id);
    t.kit = r.text(11);
    e.data = std::move(t);
  } else if (type == "dose") {
    Dose d;
    d.additive_id = r.text(12);
    d.amount = r.real(13);
    d.unit = known(dose_unit_from_string(r.text(14)), "amount unit", e.id);
    d.stock_g_per_l = r.optional_real(15);
    if (!r.is_null(24)) {
      d.mark = known(schedule_mark_from_string(r.text(24)), "mark", e.id);
      d.schedule_id = r.integer(25);
    }
    e.data = std::move(d);
  } else if (type == "schedule") {
    DoseSchedule p;
    p.additive_id = r.text(12);
    p.amount = r.real(13);
    p.unit = known(dose_unit_from_string(r.text(14)), "amount unit", e.id);
    p.stock_g_per_l = r.optional_real(15);
    p.device = r.text(26);
    p.stock_name = r.text(27);
    p.doses_per_day = static_cast<int>(r.integer(28));
    p.calibration = r.real(29);
    if (!r.is_null(30)) p.stop_time_s = r.integer(30);
    e.data = std::move(p);
  } else if (type == "water_change") {
    e.data = WaterChange{r.real(16), r.optional_real(17), r.optional_real(18), r.optional_real(19),
                         r.optional_real(20)};
  } else if (type == "top_off") {
    e.data = TopOff{r.real(16), known(top_off_kind_from_string(r.text(21)), "top-off kind", e.id),
                    r.optional_real(22)};
  } else if (type == "note") {
    e.data = Note{r.text(23)};
  } else {
    throw StoreFailure("record " + std::to_string(e.id) + ": event type '" + type + "' is not known");
  }
  return e;
}

}  // namespace tw::store::detail
