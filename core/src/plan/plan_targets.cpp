// Targets against the limits at the room's CO2 (issue 10): water held at the alkalinity and
// calcium targets settles, between doses, toward equilibrium with the room air (the planner's
// water model, plan.hpp). If that resting water already crosses the pH or saturation ceiling
// after a dose, every dose is held back; if it sits under the pH or saturation floor, the water
// is below a floor whenever it rests. Each such conflict is reported with the reason and the
// target that fits: the highest alkalinity (ceilings) or the lowest (floors) at the calcium
// target, and for saturation the calcium that fits at the alkalinity target.
//
// Chemistry: carbonate::equilibrate_with_air (K0 Weiss 1974, K1 K2 Lueker et al. 2000, the
// moist-air pCO2 of Weiss & Price 1980; Omega aragonite with Ksp of Mucci 1983) at the system's
// salinity and temperature and the calcium target. At a fixed pCO2, [CO3--] = K0 K1 K2 fCO2 /
// [H+]^2 rises with alkalinity, so pH and Omega both rise with the alkalinity target (bisection
// is safe); Omega = [Ca][CO3]/Ksp is proportional to calcium, [CO3] not depending on it.
#include <cmath>

#include <fmt/format.h>

#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/common/units.hpp"
#include "tidewright/plan/plan.hpp"
#include "tidewright/seawater/seawater.hpp"

namespace tw::plan {

namespace {

namespace cb = tw::carbonate;
constexpr double kCaGMol = 40.078;                        // IUPAC
constexpr double kFitStepDkh = 0.05;                       // fits are reported on this grid, on the safe side

struct Resting {
  double ph_total = 0, omega_aragonite = 0;
};

struct AirModel {
  cb::Constants k;
  double lowest_dkh = 0, highest_dkh = 0;  // a fitting target must lie between the alkalinity floor and ceiling
  double rho = 1;
  double air_co2_ppm = 0;
  Result<Resting> at(double alkalinity_dkh) const {
    const double alk_umol_kg = alkalinity_dkh * units::kMeqPerLPerDKH * 1000.0 / rho;
    auto st = cb::equilibrate_with_air(k, alk_umol_kg, air_co2_ppm);
    if (!st) return st.error();
    return Resting{st->ph_total, st->omega_aragonite};
  }
};

bool is_ph(LimitId id) { return id == LimitId::PhAfterDose || id == LimitId::PhFloor; }

// The alkalinity where the resting value meets `allowed`, on the safe side of the grid: for a
// ceiling the highest grid value at or below it that fits, for a floor the lowest at or above.
Result<std::optional<double>> alkalinity_fit(const AirModel& m, LimitId id, double allowed, bool ceiling) {
  auto value = [&](double dkh) -> Result<double> {
    auto r = m.at(dkh);
    if (!r) return r.error();
    return is_ph(id) ? r->ph_total : r->omega_aragonite;
  };
  auto lo_v = value(m.lowest_dkh);
  if (!lo_v) return lo_v.error();
  auto hi_v = value(m.highest_dkh);
  if (!hi_v) return hi_v.error();
  if (ceiling && *lo_v > allowed) return std::optional<double>{};
  if (!ceiling && *hi_v < allowed) return std::optional<double>{};
  double lo = m.lowest_dkh, hi = m.highest_dkh;  // value(lo) <= allowed < value(hi) (monotonic)
  if (ceiling && *hi_v <= allowed) return std::optional<double>{m.highest_dkh};
  if (!ceiling && *lo_v >= allowed) return std::optional<double>{m.lowest_dkh};
  for (int i = 0; i < 60 && hi - lo > 1e-6; ++i) {
    const double mid = 0.5 * (lo + hi);
    auto v = value(mid);
    if (!v) return v.error();
    (*v <= allowed ? lo : hi) = mid;
  }
  const double cross = ceiling ? lo : hi;
  const double grid = ceiling ? std::floor(cross / kFitStepDkh + 1e-9) * kFitStepDkh
                              : std::ceil(cross / kFitStepDkh - 1e-9) * kFitStepDkh;
  return std::optional<double>{grid};
}

}  // namespace

Result<std::vector<TargetConflict>> check_targets_at_air(const PlanInput& in) {
  const SystemState& sys = in.system;
  const double alk_target = in.targets.alkalinity_dkh.target;
  const double ca_target = in.targets.calcium_mg_l.target;
  // A conflict is with the limits the keeper set: the room kept inside them for the levels' bands
  // (keep_room_for_uncertainty) is the planner's business, not a different target to fit.
  const Limits& limits = in.limits_as_set ? *in.limits_as_set : in.limits;
  AirModel m;
  m.rho = seawater::density_kg_per_l(sys.salinity, sys.temperature_c);
  m.air_co2_ppm = sys.air_co2_ppm;
  m.lowest_dkh = limits.get(LimitId::AlkalinityFloor);
  m.highest_dkh = limits.get(LimitId::AlkalinityCeiling);
  cb::Conditions cond;
  cond.salinity = sys.salinity;
  cond.temperature_c = sys.temperature_c;
  cond.calcium_umol_kg = ca_target / kCaGMol * 1000.0 / m.rho;
  auto k = cb::compute_constants(cond);
  if (!k) return k.error();
  m.k = *k;
  auto rest = m.at(alk_target);
  if (!rest) return rest.error();

  struct Check {
    LimitId id;
    bool ceiling;
  };
  const Check checks[] = {{LimitId::OmegaAragoniteAfterDose, true},
                          {LimitId::PhAfterDose, true},
                          {LimitId::PhFloor, false},
                          {LimitId::OmegaAragoniteFloor, false}};
  std::vector<TargetConflict> out;
  for (const Check& c : checks) {
    const double allowed = limits.get(c.id);
    const double value = is_ph(c.id) ? rest->ph_total : rest->omega_aragonite;
    if (c.ceiling ? value <= allowed : value >= allowed) continue;
    TargetConflict t{};
    t.limit = c.id;
    t.ph_total = rest->ph_total;
    t.omega_aragonite = rest->omega_aragonite;
    t.value = value;
    t.allowed = allowed;
    auto fit = alkalinity_fit(m, c.id, allowed, c.ceiling);
    if (!fit) return fit.error();
    t.alkalinity_fit_dkh = *fit;
    if (!is_ph(c.id)) {
      // Omega is proportional to calcium: the calcium that puts it on the limit, rounded to the safe side.
      // Offered only between the calcium floor and ceiling (a fit outside them is no fit).
      const double ca = ca_target * allowed / value;
      const double fit_ca = c.ceiling ? std::floor(ca) : std::ceil(ca);
      if (fit_ca >= limits.get(LimitId::CalciumFloor) && fit_ca <= limits.get(LimitId::CalciumCeiling)) {
        t.calcium_fit_mg_l = fit_ca;
      }
    }
    const char* quantity = is_ph(c.id) ? "pH (total scale)" : "aragonite saturation";
    const std::string consequence =
        c.ceiling ? fmt::format("above the limit of {:g} right after a dose, so every dose would be held back", allowed)
                  : fmt::format("below the floor of {:g} whenever the water rests", allowed);
    std::string fits;
    if (t.alkalinity_fit_dkh) {
      fits = fmt::format("the {} alkalinity target that fits is {:.2f} dKH (at calcium {:g} mg/L)",
                         c.ceiling ? "highest" : "lowest", *t.alkalinity_fit_dkh, ca_target);
    } else {
      fits = fmt::format("no alkalinity target between {:g} and {:g} dKH (the alkalinity floor and ceiling) fits at "
                         "calcium {:g} mg/L",
                         m.lowest_dkh, m.highest_dkh, ca_target);
    }
    if (t.calcium_fit_mg_l) {
      fits += fmt::format(", or calcium {} {:.0f} mg/L at {:g} dKH", c.ceiling ? "at most" : "at least",
                          *t.calcium_fit_mg_l, alk_target);
    }
    if (!c.ceiling) fits += "; or more fresh air (less CO2 in the room)";
    t.message = fmt::format(
        "TARGET CONFLICT: at {:g} dKH and calcium {:g} mg/L, water settled with room air of {:g} ppm CO2 "
        "({:g} C, salinity {:g}) has {} {:.3g}, {}; {}.",
        alk_target, ca_target, sys.air_co2_ppm, sys.temperature_c, sys.salinity, quantity, value, consequence, fits);
    out.push_back(std::move(t));
  }
  return out;
}

}  // namespace tw::plan
