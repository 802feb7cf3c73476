// Adopting a plan as the standing schedules (plan_adopt.hpp).
#include "tidewright/plan/plan_adopt.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "tidewright/journal/device_name.hpp"
#include "tidewright/journal/schedule.hpp"

namespace tw::plan {
namespace {

// Grams of the compound per unit of the additive, from the largest component of its chemistry.
double grams_per_unit(const additives::Additive& a, const additives::Compound& c) {
  const additives::ChemicalChange& u = a.per_unit;
  const additives::ChemicalChange& m = c.per_mole;
  const double pairs[][2] = {{u.alkalinity_eq, m.alkalinity_eq}, {u.calcium_mol, m.calcium_mol},
                             {u.magnesium_mol, m.magnesium_mol}, {u.dic_mol, m.dic_mol},
                             {u.sodium_mol, m.sodium_mol},       {u.chloride_mol, m.chloride_mol},
                             {u.sulfate_mol, m.sulfate_mol},     {u.potassium_mol, m.potassium_mol}};
  for (const auto& p : pairs) {
    if (p[1] != 0.0 && p[0] != 0.0) return p[0] / p[1] * c.molar_mass_g_mol();
  }
  return 0.0;
}

double step_round(double amount, journal::DoseUnit unit) {
  const double step = unit == journal::DoseUnit::Millilitres ? 0.1 : 0.01;
  return std::round(amount / step) * step;
}

}  // namespace

Result<DeliveryRecipe> recipe_of(const additives::Additive& a) {
  if (a.limewater) return DeliveryRecipe{"limewater", journal::DoseUnit::Millilitres, std::nullopt};
  if (a.compounds.size() != 1) {
    return Error{"additive", fmt::format("'{}' is not one catalog compound, so a schedule cannot name it; "
                                         "log its doses instead", a.name)};
  }
  const additives::Compound& c = additives::compound(a.compounds[0]);
  if (a.unit == additives::DoseUnit::Gram) return DeliveryRecipe{c.key, journal::DoseUnit::Grams, std::nullopt};
  const double g_per_ml = grams_per_unit(a, c);
  if (!(g_per_ml > 0.0)) return Error{"additive", fmt::format("the strength of '{}' cannot be worked out", a.name)};
  return DeliveryRecipe{c.key, journal::DoseUnit::Millilitres, g_per_ml * 1000.0};
}

std::optional<ScheduledPump> scheduled_pump_for(const journal::Journal& journal, journal::SystemId system,
                                                const additives::Additive& additive, std::int64_t now_s) {
  auto recipe = recipe_of(additive);
  if (!recipe) return std::nullopt;
  const journal::DoseSchedule* found = nullptr;
  for (const journal::Event* e : journal::schedules_of(journal, system)) {  // in start order
    const auto& s = std::get<journal::DoseSchedule>(e->data);
    if (s.additive_id != recipe->additive_id || (s.stop_time_s && *s.stop_time_s <= now_s)) continue;
    if (e->time_s > now_s && found) break;  // one running now wins over one that starts later
    found = &s;
    if (e->time_s > now_s) break;
  }
  if (!found) return std::nullopt;
  return ScheduledPump{found->device, found->calibration, found->doses_per_day, found->amount, found->stock_g_per_l};
}

Result<std::vector<AdoptedSchedule>> schedules_from_plan(const PlanInput& input, const Plan& plan,
                                                         std::int64_t day1_start_s) {
  std::vector<AdoptedSchedule> out;
  for (std::size_t k = 0; k < input.deliveries.size(); ++k) {
    const Delivery& d = input.deliveries[k];
    auto recipe = recipe_of(d.additive);
    if (!recipe) return recipe.error();
    std::optional<AdoptedSchedule> open;  // the run of days being built
    for (const DaySummary& day : plan.days) {
      int count = 0, first_minute = 24 * 60;
      for (const DoseRecord& r : plan.doses) {
        if (r.day != day.day || r.delivery != k || !(r.amount > 0.0)) continue;
        ++count;
        first_minute = std::min(first_minute, r.minute);
      }
      const double total = k < day.amount_per_delivery.size() ? day.amount_per_delivery[k] : 0.0;
      // The schedule holds the amount SET on the pump and its calibration, so the journal counts
      // set x calibration = the plan's dose (within half a step x calibration).
      const double per_dose = count > 0 ? step_round(d.set_amount(total / count), recipe->unit) : 0.0;
      const std::int64_t start = day1_start_s + static_cast<std::int64_t>(day.day - 1) * 86400 + first_minute * 60;
      if (open && per_dose > 0.0 && open->schedule.amount == per_dose && open->schedule.doses_per_day == count) {
        continue;  // the same program goes on
      }
      if (open) {
        open->schedule.stop_time_s = count > 0 ? start : day1_start_s + static_cast<std::int64_t>(day.day - 1) * 86400;
        out.push_back(*open);
        open.reset();
      }
      if (per_dose > 0.0) {
        journal::DoseSchedule s;
        s.device = d.device.empty() ? "pump" : d.device.substr(0, journal::kMaxDeviceNameChars);
        s.additive_id = recipe->additive_id;
        s.amount = per_dose;
        s.unit = recipe->unit;
        s.stock_g_per_l = recipe->stock_g_per_l;
        s.stock_name = d.additive.name.substr(0, 60);
        s.doses_per_day = std::clamp(count, 1, journal::kMaxDosesPerDay);
        s.calibration = d.calibration;
        open = AdoptedSchedule{k, start, s};
      }
    }
    if (open) out.push_back(*open);
  }
  return out;
}

Result<std::vector<journal::EventId>> adopt_plan(journal::Journal& journal, journal::SystemId system,
                                                 const PlanInput& input, const Plan& plan,
                                                 std::int64_t day1_start_s) {
  auto adopted = schedules_from_plan(input, plan, day1_start_s);
  if (!adopted) return adopted.error();
  if (adopted->empty()) return Error{"plan", "the plan gives no doses, so there is nothing to adopt"};
  journal::Journal trial = journal;
  std::int64_t first = adopted->front().start_s;
  for (const auto& a : *adopted) first = std::min(first, a.start_s);
  auto same_pump = [&](const journal::DoseSchedule& old) {
    return std::any_of(adopted->begin(), adopted->end(), [&](const AdoptedSchedule& a) {
      return a.schedule.device == old.device || a.schedule.additive_id == old.additive_id;
    });
  };
  for (const journal::Event* e : journal::schedules_running(journal, system, first)) {
    if (!same_pump(std::get<journal::DoseSchedule>(e->data))) continue;
    if (auto st = journal::stop_schedule(trial, e->id, std::max(first, e->time_s + 1)); !st) return st.error();
  }
  // A plan adopted earlier may have set later runs of the same pump that have not begun yet
  // (its ramp days): the new plan replaces them, or the pump would run both.
  for (const journal::Event* e : journal::schedules_of(journal, system)) {
    if (e->time_s < first || !same_pump(std::get<journal::DoseSchedule>(e->data))) continue;
    if (auto st = journal::remove_event(trial, e->id); !st) return st.error();
  }
  std::vector<journal::EventId> ids;
  for (const auto& a : *adopted) {
    auto id = journal::start_schedule(trial, system, a.start_s, a.schedule);
    if (!id) return id.error();
    ids.push_back(*id);
  }
  journal = std::move(trial);
  return ids;
}

}  // namespace tw::plan
