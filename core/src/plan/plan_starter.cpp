// A plan input to start from, built from a system's journal (plan_starter.hpp).
#include "tidewright/plan/plan_starter.hpp"

#include <algorithm>
#include <tuple>

#include <fmt/format.h>

#include "tidewright/additives/additives.hpp"
#include "tidewright/common/datetime.hpp"
#include "tidewright/common/parameter.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/journal/schedule.hpp"
#include "tidewright/plan/plan_from_journal.hpp"

namespace tw::plan {
namespace {

namespace ad = additives;

// What a schedule or a logged dose names: the compound, the unit and the stock's strength.
struct DosedAdditive {
  std::string additive_id;
  journal::DoseUnit unit = journal::DoseUnit::Millilitres;
  std::optional<double> stock_g_per_l;
  std::string stock_name;
  std::string device;
  int doses_per_day = 1;
  double calibration = 1.0;  // a running schedule's pump calibration
  bool same_as(const DosedAdditive& o) const {
    return std::tie(additive_id, unit, stock_g_per_l) == std::tie(o.additive_id, o.unit, o.stock_g_per_l);
  }
};

ad::Additive stock_of(const ad::Compound& c, double g_per_l, const std::string& name) {
  ad::StockRecipe r;
  r.name = name.empty() ? fmt::format("{} {:g} g/L", c.name, g_per_l) : name;
  r.ingredients.push_back({c.id, g_per_l});
  r.temperature_c = 25;
  auto a = ad::additive_from_stock(r);
  // The strengths come from the journal, which checked them against the same ranges.
  return a ? *a : ad::additive_from_compound(c.id);
}

Result<Delivery> delivery_of(const DosedAdditive& d, double temperature_c) {
  if (d.additive_id == "limewater") {  // a schedule's saturated Ca(OH)2, not a catalog compound
    auto lime = ad::limewater_additive(temperature_c);
    if (!lime) return Error{"additives", lime.error().message};
    Delivery out;
    out.additive = std::move(lime).value();
    out.device = d.device;
    out.doses_per_day = d.doses_per_day;
    out.calibration = d.calibration;
    return out;
  }
  auto c = ad::find_compound(d.additive_id);
  if (!c) return Error{"additives", c.error().message};
  Delivery out;
  if (d.unit == journal::DoseUnit::Millilitres) {
    if (!d.stock_g_per_l) return Error{"additives", d.additive_id + " in mL with no stock strength"};
    out.additive = stock_of(**c, *d.stock_g_per_l, d.stock_name);
  } else {
    out.additive = ad::additive_from_compound((*c)->id);
    out.manual = true;  // weighed and added by hand
  }
  out.device = d.device;
  out.doses_per_day = d.doses_per_day;
  out.calibration = d.calibration;
  return out;
}

// The pumps' schedules running now, and the additives dosed by hand or pump in the last weeks
// that no schedule gives (a keeper's magnesium by hand beside two pumps), one each.
std::vector<DosedAdditive> dosed_additives(const journal::Journal& j, journal::SystemId id, std::int64_t now_s,
                                           std::vector<std::string>& sources) {
  std::vector<DosedAdditive> out;
  auto add = [&out](const DosedAdditive& d) {
    if (std::none_of(out.begin(), out.end(), [&](const DosedAdditive& o) { return o.same_as(d); })) out.push_back(d);
  };
  for (const journal::Event* e : journal::schedules_running(j, id, now_s)) {
    const auto& s = std::get<journal::DoseSchedule>(e->data);
    add(DosedAdditive{s.additive_id, s.unit, s.stock_g_per_l, s.stock_name, s.device, s.doses_per_day, s.calibration});
  }
  const std::size_t scheduled = out.size();
  if (scheduled > 0) sources.push_back(fmt::format("{} from the schedules running now (device, recipe, doses per day and calibration)", scheduled));
  const auto since = now_s - static_cast<std::int64_t>(kStarterRecentDoseDays * 86400);
  int pumps = 0;
  for (const journal::Event& e : j.events) {
    if (e.system_id != id || e.time_s < since || e.time_s > now_s) continue;
    const auto* dose = std::get_if<journal::Dose>(&e.data);
    if (!dose || dose->mark != journal::ScheduleMark::None) continue;  // marks belong to a schedule
    const bool hand = dose->unit == journal::DoseUnit::Grams;
    DosedAdditive d{dose->additive_id, dose->unit, dose->stock_g_per_l, "", "hand", 1, 1.0};
    if (std::any_of(out.begin(), out.end(), [&](const DosedAdditive& o) { return o.same_as(d); })) continue;
    if (!hand) d.device = fmt::format("pump {}", scheduled + static_cast<std::size_t>(++pumps));
    out.push_back(d);
  }
  if (out.size() > scheduled) {
    sources.push_back(fmt::format("{} from the doses logged in the last {:g} days that no schedule gives (one dose a "
                                  "day each: set your own)",
                                  out.size() - scheduled, kStarterRecentDoseDays));
  }
  return out;
}

std::vector<Delivery> starting_pair() {
  const ad::Compound& soda = ad::compound(ad::CompoundId::SodiumCarbonate);
  const ad::Compound& cacl = ad::compound(ad::CompoundId::CalciumChlorideDihydrate);
  Delivery alk, ca;
  alk.additive = stock_of(soda, kStarterSodaAshGPerL, "");
  alk.device = "pump 1";
  ca.additive = stock_of(cacl, kStarterCalciumChlorideGPerL, "");
  ca.device = "pump 2";
  for (Delivery* d : {&alk, &ca}) d->doses_per_day = 12;
  return {alk, ca};
}

}  // namespace

Result<StarterInput> starter_plan_input(const journal::Journal& journal, journal::SystemId system,
                                        std::int64_t now_s) {
  const journal::System* sys = journal::find_system(journal, system);
  if (!sys) return Error{"system", fmt::format("system {} is not in the journal", system)};
  StarterInput out;
  PlanInput& in = out.input;
  in.system.name = sys->name;
  in.system.volume_l = sys->volume_l;
  out.notes.push_back(fmt::format("System \"{}\", {:g} L net water volume (the journal's).", sys->name, sys->volume_l));

  // Targets: the system's own, else the parameter table's, each with its band.
  std::vector<std::string> defaulted;
  auto target = [&](Parameter p, Band& band) {
    const auto own = journal::target_of(*sys, p);
    band = own ? target_band(p, *own) : default_target_band(p);
    if (!own) defaulted.push_back(parameter_name(p));
  };
  target(Parameter::Alkalinity, in.targets.alkalinity_dkh);
  target(Parameter::Calcium, in.targets.calcium_mg_l);
  target(Parameter::Magnesium, in.targets.magnesium_mg_l);
  out.notes.push_back(defaulted.empty() ? std::string("Targets: the system's own.")
                                        : fmt::format("Targets: the system's own, the planner's default for {}.",
                                                      fmt::join(defaulted, ", ")));

  // The water and the consumption: the core's one rule, as `plan --journal` and the app. A
  // parameter never tested starts at its target (the basis's lines say so).
  in.system.alkalinity_dkh = in.targets.alkalinity_dkh.target;
  in.system.calcium_mg_l = in.targets.calcium_mg_l.target;
  in.system.magnesium_mg_l = in.targets.magnesium_mg_l.target;
  BasisOptions bo;
  bo.series.until_s = now_s;
  bo.accept_stale = true;
  auto basis = plan_basis_from_journal(journal, system, bo);
  if (!basis) return basis.error();
  for (const auto& p : basis->provenance) out.notes.push_back(p);
  for (const KeptFromInput& k : put_basis_water(*basis, in)) {
    out.notes.push_back(k.no_test ? fmt::format("{}: no test in the journal; starts at its target {:g} with no "
                                                "consumption (test it before dosing)", k.parameter, k.level)
                                  : fmt::format("{}: consumption unknown (fewer than two tests); 0 per day", k.parameter));
  }
  for (const auto& f : basis->flags) out.notes.push_back("Check: " + f);
  for (const auto& n : basis->notes) out.notes.push_back("Journal: " + n);

  std::vector<std::string> sources;
  std::vector<DosedAdditive> dosed = dosed_additives(journal, system, now_s, sources);
  for (const DosedAdditive& d : dosed) {
    auto delivery = delivery_of(d, in.system.temperature_c);
    if (!delivery) {
      out.notes.push_back(fmt::format("Left out {}: {}.", d.additive_id, delivery.error().message));
      continue;
    }
    if (in.deliveries.size() < static_cast<std::size_t>(ranges::kPlanAdditives.hi)) {
      in.deliveries.push_back(std::move(delivery).value());
    }
  }
  if (in.deliveries.empty()) {
    in.deliveries = starting_pair();
    out.notes.push_back(fmt::format(
        "Additives: no schedule running and no dose logged in the last {:g} days, so a starting pair: soda ash "
        "{:g} g/L on pump 1 and calcium chloride dihydrate {:g} g/L on pump 2, 12 doses a day. Change them to "
        "what you dose.",
        kStarterRecentDoseDays, kStarterSodaAshGPerL, kStarterCalciumChlorideGPerL));
  } else {
    out.notes.push_back(fmt::format("Additives: {}. Check each pump's largest dose (max_dose) and daily volume.",
                                    fmt::join(sources, "; ")));
  }
  const bool lime = std::any_of(dosed.begin(), dosed.end(), [](const DosedAdditive& d) { return d.additive_id == "limewater"; });
  if (lime) {
    out.notes.push_back("Limewater rides on the top-off: set evaporation_l_per_day to the water the tank loses a day "
                        "(0 here, so no limewater can be planned until it is set).");
  }
  in.start_date = datetime::format_date_utc((now_s / 86400 + 1) * 86400);
  out.notes.push_back(fmt::format("Day 1 is {} (UTC), {} days ahead.", in.start_date, in.horizon_days));
  return out;
}

}  // namespace tw::plan
