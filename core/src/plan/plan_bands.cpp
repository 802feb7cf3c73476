// A plan that knows how sure it is (plan.hpp PlanInput::spread): a 95 % band on each forecast
// level from the uncertainty of today's level and of the demand (estimate::LevelSpread, the
// filter's own forecast variance; the doses are known exactly and move only the centre), bands
// on pH and Omega from those levels' bands, the moment to test again (before a band reaches a
// limit as the keeper set it), and what the room kept for the band costs against the same plan
// at the limits as set.
//
// Sections: 1. chemistry sensitivity  2. bands on the days  3. the moment to test again
//           4. margin cost
#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "plan_internal.hpp"
#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/common/datetime.hpp"
#include "tidewright/common/units.hpp"
#include "tidewright/plan/plan_from_journal.hpp"
#include "tidewright/seawater/seawater.hpp"

namespace tw::plan {
namespace detail {

// ================================================================ 1. Chemistry sensitivity
Result<ChemistrySensitivity> chemistry_sensitivity(const SystemState& sys, double alk_dkh, double ca_mg_l) {
  carbonate::Conditions cond;
  cond.salinity = sys.salinity;
  cond.temperature_c = sys.temperature_c;
  const double rho = seawater::density_kg_per_l(sys.salinity, sys.temperature_c);
  cond.calcium_umol_kg = ca_mg_l / units::kMolarMassCa * 1000.0 / rho;
  auto k = carbonate::compute_constants(cond);
  if (!k) return k.error();
  const double h = 0.05;  // dKH: small against the level, large against solver tolerance
  auto at = [&](double dkh) { return carbonate::equilibrate_with_air(*k, dkh * units::kMeqPerLPerDKH * 1000.0 / rho, sys.air_co2_ppm); };
  auto up = at(alk_dkh + h);
  auto down = at(std::max(0.5, alk_dkh - h));
  auto mid = at(alk_dkh);
  if (!up) return up.error();
  if (!down) return down.error();
  if (!mid) return mid.error();
  const double span = alk_dkh + h - std::max(0.5, alk_dkh - h);
  ChemistrySensitivity s;
  s.ph_per_dkh = (up->ph_total - down->ph_total) / span;
  s.omega_per_dkh = (up->omega_aragonite - down->omega_aragonite) / span;
  s.omega_per_mg_l_calcium = ca_mg_l > 0 ? mid->omega_aragonite / ca_mg_l : 0.0;  // Omega is proportional to Ca
  return s;
}

ChemistryHalfWidth chemistry_half_width(const ChemistrySensitivity& s, double alk_sd, double ca_sd, double z) {
  ChemistryHalfWidth w;
  w.ph = z * std::fabs(s.ph_per_dkh) * alk_sd;
  w.omega = z * std::hypot(s.omega_per_dkh * alk_sd, s.omega_per_mg_l_calcium * ca_sd);
  return w;
}

namespace {

constexpr double kDay = 1440.0;
const char* const kName[3] = {"alkalinity", "calcium", "magnesium"};
const char* const kUnit[3] = {"dKH", "mg/L", "mg/L"};
const LimitId kFloor[3] = {LimitId::AlkalinityFloor, LimitId::CalciumFloor, LimitId::MagnesiumFloor};
const LimitId kCeiling[3] = {LimitId::AlkalinityCeiling, LimitId::CalciumCeiling, LimitId::MagnesiumCeiling};

std::array<double, 3> levels_of(const WaterState& w) { return {w.alkalinity_dkh, w.calcium_mg_l, w.magnesium_mg_l}; }

double sd_at(const PlanInput& in, std::size_t p, double minute) {
  return in.spread[p] ? in.spread[p]->sd_after(minute / kDay) : 0.0;
}

std::string moment_text(const PlanInput& in, int day, int minute) {
  std::string date;
  if (auto start = datetime::parse_datetime(in.start_date + "T00:00:00Z")) {
    date = " (" + datetime::format_date_utc(*start + static_cast<std::int64_t>(day - 1) * 86400) + ")";
  }
  return fmt::format("day {}{} at {:02d}:{:02d}", day, date, minute / 60, minute % 60);
}

// ================================================================ 3. The moment to test again
struct Crossing {
  double minute = 1e300;
  std::size_t parameter = 0;
  std::optional<LimitId> limit;
  std::string what;
};

void consider(Crossing& c, double minute, std::size_t p, std::optional<LimitId> limit, std::string what) {
  if (minute < c.minute) c = Crossing{minute, p, limit, std::move(what)};
}

}  // namespace

// ================================================================ 2. Bands on the days
Status add_bands(const PlanInput& in, Plan& plan) {
  const Limits& set = in.limits_as_set ? *in.limits_as_set : in.limits;
  const double z = estimate::z95();
  PlanUncertainty u;
  // Sensitivity of pH and Omega per day (at the day's start water; it changes slowly).
  std::vector<ChemistrySensitivity> sens;
  for (const auto& d : plan.days) {
    auto s = chemistry_sensitivity(in.system, d.start.alkalinity_dkh, d.start.calcium_mg_l);
    if (!s) return s.error();
    sens.push_back(*s);
  }
  for (std::size_t i = 0; i < plan.days.size(); ++i) {
    DaySummary& d = plan.days[i];
    const double end_min = d.day * kDay;
    const auto lv = levels_of(d.end);
    for (std::size_t p = 0; p < 3; ++p) {
      if (!in.spread[p]) continue;
      const double sd = sd_at(in, p, end_min);
      d.end_band[p] = Band95{std::max(0.0, lv[p] - z * sd), lv[p] + z * sd};
    }
    const auto hw = chemistry_half_width(sens[i], sd_at(in, 0, end_min), sd_at(in, 1, end_min), z);
    d.end_ph_band = Band95{d.end.ph_total - hw.ph, d.end.ph_total + hw.ph};
    d.end_omega_band = Band95{std::max(0.0, d.end.omega_aragonite - hw.omega), d.end.omega_aragonite + hw.omega};
  }

  // The first moment a band reaches a limit as set (a floor only once the centre is above it,
  // as the checker applies floors; a limit the centre itself crosses is the verdict's business).
  Crossing first;
  for (const Moment& m : plan.timeline) {
    const std::size_t day_index =
        std::min(plan.days.empty() ? 0 : plan.days.size() - 1, static_cast<std::size_t>(std::max(0.0, m.minute) / kDay));
    const auto lv = levels_of(m.water);
    for (std::size_t p = 0; p < 3; ++p) {
      if (!in.spread[p]) continue;
      const double half = z * sd_at(in, p, m.minute);
      const double fl = set.get(kFloor[p]), ce = set.get(kCeiling[p]);
      if (lv[p] >= fl && lv[p] - half < fl) {
        consider(first, m.minute, p, kFloor[p], fmt::format("the 95 % band of {} reaches the floor {:g} {}", kName[p], fl, kUnit[p]));
      }
      if (lv[p] <= ce && lv[p] + half > ce) {
        consider(first, m.minute, p, kCeiling[p], fmt::format("the 95 % band of {} reaches the ceiling {:g} {}", kName[p], ce, kUnit[p]));
      }
    }
    if (sens.empty()) continue;
    const auto hw = chemistry_half_width(sens[day_index], sd_at(in, 0, m.minute), sd_at(in, 1, m.minute), z);
    const double ph = m.water.ph_total, om = m.water.omega_aragonite;
    const std::size_t by = in.spread[0] ? 0 : 1;
    if (ph >= set.get(LimitId::PhFloor) && ph - hw.ph < set.get(LimitId::PhFloor)) {
      consider(first, m.minute, by, LimitId::PhFloor, fmt::format("the 95 % band of pH reaches the floor {:g}", set.get(LimitId::PhFloor)));
    }
    if (om >= set.get(LimitId::OmegaAragoniteFloor) && om - hw.omega < set.get(LimitId::OmegaAragoniteFloor)) {
      consider(first, m.minute, by, LimitId::OmegaAragoniteFloor,
               fmt::format("the 95 % band of Omega aragonite reaches the floor {:g}", set.get(LimitId::OmegaAragoniteFloor)));
    }
    if (m.after_dose && ph <= set.get(LimitId::PhAfterDose) && ph + hw.ph > set.get(LimitId::PhAfterDose)) {
      consider(first, m.minute, by, LimitId::PhAfterDose,
               fmt::format("the 95 % band of pH after a dose reaches the ceiling {:g}", set.get(LimitId::PhAfterDose)));
    }
    if (m.after_dose && om <= set.get(LimitId::OmegaAragoniteAfterDose) &&
        om + hw.omega > set.get(LimitId::OmegaAragoniteAfterDose)) {
      consider(first, m.minute, by, LimitId::OmegaAragoniteAfterDose,
               fmt::format("the 95 % band of Omega aragonite after a dose reaches the ceiling {:g}",
                           set.get(LimitId::OmegaAragoniteAfterDose)));
    }
  }
  // A level's estimate grows stale at its useful horizon whatever the band does.
  for (std::size_t p = 0; p < 3; ++p) {
    if (!in.spread[p]) continue;
    const double stale = estimate::useful_horizon_days(static_cast<Parameter>(p)) * kDay;
    consider(first, stale, p, std::nullopt,
             fmt::format("the {} estimate grows stale ({:g} days after its test)", kName[p],
                         estimate::useful_horizon_days(static_cast<Parameter>(p))));
  }
  const double end = in.horizon_days * kDay;
  Retest r;
  if (first.minute >= end) {
    r.day = in.horizon_days;
    r.minute = static_cast<int>(kDay) - 1;
    r.parameter = kName[first.parameter];
    r.message = fmt::format("test again by the end of the plan, {}: every band stays inside the limits until then",
                            moment_text(in, r.day, r.minute));
  } else {
    const int minute = static_cast<int>(std::floor(first.minute));
    r.day = minute / static_cast<int>(kDay) + 1;
    r.minute = minute % static_cast<int>(kDay);
    r.parameter = kName[first.parameter];
    r.limit = first.limit;
    r.message = r.day == 1 && r.minute == 0
                    ? fmt::format("test {} now: {} already", r.parameter, first.what)
                    : fmt::format("test {} again before {}: after that {}", r.parameter, moment_text(in, r.day, r.minute),
                                  first.what);
  }
  u.retest = r;

  // ================================================================ 4. Margin cost
  if (in.limits_as_set) {
    MarginCost cost;
    for (const auto& spec : limit_specs()) {
      const double a = in.limits_as_set->get(spec.id), b = in.limits.get(spec.id);
      if (std::fabs(a - b) < 1e-12) continue;
      const int dp = std::fabs(a) < 20 ? 2 : 0;
      cost.room.push_back(fmt::format("{}: {:.{}f}{} instead of {:.{}f}", spec.description, b, dp, spec.unit_suffix(), a, dp));
    }
    if (!cost.room.empty()) {
      PlanInput bare = in;
      bare.limits = *in.limits_as_set;
      bare.limits_as_set.reset();
      bare.spread = {};
      auto without = make_plan(bare);
      if (!without) return without.error();
      cost.target_day_without_room = without->target_day;
      const std::size_t n = in.deliveries.size();
      cost.amount_with_room.assign(n, 0.0);
      cost.amount_without_room.assign(n, 0.0);
      for (const auto& d : plan.doses) cost.amount_with_room[d.delivery] += d.amount;
      for (const auto& d : without->doses) cost.amount_without_room[d.delivery] += d.amount;
      std::vector<std::string> parts;
      for (std::size_t p = 0; p < 3; ++p) {
        const auto& a = plan.target_day[p];
        const auto& b = cost.target_day_without_room[p];
        if (a == b) continue;
        parts.push_back(fmt::format("{} reaches its band {} instead of {}", kName[p],
                                    a ? fmt::format("on day {}", *a) : std::string("not within the plan"),
                                    b ? fmt::format("day {}", *b) : std::string("never")));
      }
      for (std::size_t i = 0; i < n; ++i) {
        const double a = cost.amount_with_room[i], b = cost.amount_without_room[i];
        if (std::fabs(a - b) <= 0.005 * std::max(1.0, b)) continue;
        parts.push_back(fmt::format("{} {:.1f} {} over the plan instead of {:.1f}", in.deliveries[i].additive.name, a,
                                    additives::to_string(in.deliveries[i].additive.unit), b));
      }
      const bool crosses_without = !without->verdict.holds && plan.verdict.holds;
      cost.effect = fmt::format(
          "{}{}", parts.empty() ? std::string("the same doses and days to target") : fmt::format("{}", fmt::join(parts, "; ")),
          crosses_without ? " (that plan would not hold)" : "");
      cost.summary = fmt::format("room for the estimates' uncertainty: {} limits tightened ({}); cost against the plan "
                                 "at the limits as set: {}",
                                 cost.room.size(), fmt::join(cost.room, "; "), cost.effect);
      u.cost = std::move(cost);
    }
  }
  plan.uncertainty = std::move(u);
  return Ok{};
}

}  // namespace detail

}  // namespace tw::plan
