// Stocks a pump can give and how a pump's settings start (plan_stocks.hpp).
#include "tidewright/plan/plan_stocks.hpp"

#include <algorithm>

#include "tidewright/journal/schedule.hpp"
#include "tidewright/plan/plan_starter.hpp"

namespace tw::plan {

namespace ad = additives;

std::span<const PlanStock> magnesium_stocks() {
  static constexpr PlanStock kStocks[] = {
      {ad::CompoundId::MagnesiumChlorideHexahydrate, kStarterMagnesiumChlorideGPerL},
      {ad::CompoundId::MagnesiumSulfateHeptahydrate, kStarterMagnesiumSulfateGPerL},
  };
  return kStocks;
}

PumpProgram pump_program_from(const std::optional<ScheduledPump>& schedule) {
  PumpProgram p;
  if (!schedule) return p;
  p.doses_per_day = schedule->doses_per_day;
  p.max_dose = std::max(kDefaultMaxDoseMl, schedule->amount);
  return p;
}

std::optional<DosedStock> dosed_stock_for(const journal::Journal& journal, journal::SystemId system,
                                          std::span<const ad::CompoundId> compounds, std::int64_t now_s) {
  const auto compound_of = [&](const std::string& key) -> std::optional<ad::CompoundId> {
    for (ad::CompoundId id : compounds) {
      if (ad::compound(id).key == key) return id;
    }
    return std::nullopt;
  };
  // A schedule: the one running now wins over one that starts later (scheduled_pump_for's rule).
  const journal::Event* found = nullptr;
  for (const journal::Event* e : journal::schedules_of(journal, system)) {  // in start order
    const auto& s = std::get<journal::DoseSchedule>(e->data);
    if (!compound_of(s.additive_id) || (s.stop_time_s && *s.stop_time_s <= now_s)) continue;
    if (e->time_s > now_s && found) break;
    found = e;
    if (e->time_s > now_s) break;
  }
  if (found) {
    const auto& s = std::get<journal::DoseSchedule>(found->data);
    const bool ml = s.unit == journal::DoseUnit::Millilitres;
    return DosedStock{*compound_of(s.additive_id), ml ? s.stock_g_per_l : std::nullopt,
                      ScheduledPump{s.device, s.calibration, s.doses_per_day, s.amount, s.stock_g_per_l}};
  }
  // Else the newest dose logged in the last weeks.
  const std::int64_t since = now_s - static_cast<std::int64_t>(kStarterRecentDoseDays * 86400);
  const journal::Event* newest = nullptr;
  for (const journal::Event& e : journal.events) {
    if (e.system_id != system || e.time_s < since || e.time_s > now_s) continue;
    const auto* dose = std::get_if<journal::Dose>(&e.data);
    if (!dose || dose->mark != journal::ScheduleMark::None || !compound_of(dose->additive_id)) continue;
    if (!newest || e.time_s >= newest->time_s) newest = &e;
  }
  if (!newest) return std::nullopt;
  const auto& dose = std::get<journal::Dose>(newest->data);
  const bool ml = dose.unit == journal::DoseUnit::Millilitres;
  return DosedStock{*compound_of(dose.additive_id), ml ? dose.stock_g_per_l : std::nullopt, std::nullopt};
}

}  // namespace tw::plan
