// Every number of a system or an event rounded as the journal stores it (stored_number.hpp),
// before it is validated and kept: conversions from the unit typed leave no noise in files.
#include "journal_tidy_internal.hpp"

#include "tidewright/common/stored_number.hpp"

namespace tw::journal {

namespace {
void tidy(double& v) { v = stored_number(v); }
void tidy(std::optional<double>& v) {
  if (v) *v = stored_number(*v);
}
}  // namespace

void tidy_numbers(System& s) {
  tidy(s.volume_l);
  if (s.volume_parts) {
    tidy(s.volume_parts->display_l);
    tidy(s.volume_parts->sump_l);
    tidy(s.volume_parts->rock_displacement_l);
  }
  tidy(s.default_salinity);
  tidy(s.default_temperature_c);
  tidy(s.targets.alkalinity_dkh);
  tidy(s.targets.calcium_mg_l);
  tidy(s.targets.magnesium_mg_l);
}

void tidy_numbers(Event& e) {
  if (auto* t = std::get_if<TestResult>(&e.data)) {
    tidy(t->value);
    tidy(t->precision);
  } else if (auto* d = std::get_if<Dose>(&e.data)) {
    tidy(d->amount);
    tidy(d->stock_g_per_l);
  } else if (auto* w = std::get_if<WaterChange>(&e.data)) {
    tidy(w->volume_l);
    tidy(w->alkalinity_dkh);
    tidy(w->calcium_mg_l);
    tidy(w->magnesium_mg_l);
    tidy(w->salinity);
  } else if (auto* o = std::get_if<TopOff>(&e.data)) {
    tidy(o->volume_l);
    tidy(o->limewater_g_per_l);
  } else if (auto* p = std::get_if<DoseSchedule>(&e.data)) {
    tidy(p->amount);
    tidy(p->stock_g_per_l);
    tidy(p->calibration);
  }
}

}  // namespace tw::journal
