// Hatchery dosing to a confidence (hatchery.hpp Confidence): the dose that reaches the target
// with a chosen probability while the pH ceiling holds with the same probability, given the
// intake readings' precision.
//
// Method: at a dose D (fixed amounts of each compound), the target's quantity T(D) and the
// highest pH P(D) are functions of the intake readings x (the measured pair, the pH scale
// conversion, salinity, temperature, calcium, and a salt mix's measured boron and magnesium). Their standard uncertainties follow Orr et al.
// (2018, Mar. Chem. 207:84): u(T)^2 = sum_i (dT/dx_i)^2 u(x_i)^2, the readings independent, the
// derivatives central differences of the same chain the dose is planned with (apply_dose:
// intake solve, dose, gas exchange). The dose is then planned for the target raised to
// T + z u(T) under the ceiling lowered to C - z u(P), with z the one-sided normal quantile of
// the probability, and repeated at the new dose until it settles (u changes little with D).
#include <algorithm>
#include <cmath>
#include <functional>
#include <vector>

#include <fmt/format.h>

#include "hatchery_internal.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/common/result.hpp"

namespace tw::hatchery {

namespace cb = tw::carbonate;

Result<double> one_sided_z(double probability) {
  // The range is in percent (common/ranges.hpp), as keepers say it.
  if (auto r = ranges::check("confidence", probability * 100.0, ranges::kDoseConfidencePercent); !r) return r.error();
  // Phi(z) = erfc(-z / sqrt 2) / 2 is increasing: bisection on [0, 4].
  double lo = 0.0, hi = 4.0;
  for (int i = 0; i < 80; ++i) {
    const double mid = 0.5 * (lo + hi);
    (0.5 * std::erfc(-mid / std::sqrt(2.0)) < probability ? lo : hi) = mid;
  }
  return 0.5 * (lo + hi);
}

namespace detail {
namespace {

struct AtDose {
  double target = 0, ph_max = 0;
};

Result<AtDose> at_dose(const Water& w, const DoseMix& dose, const Settings& s) {
  auto t = apply_dose(w, dose, s);
  if (!t) return t.error();
  const Chain chain{t->after_mixing, t->at_tanks};
  return AtDose{metric(chain, s, t->intake.alkalinity_umol_kg), highest_ph(chain, s.limits.ph_ceiling_scale)};
}

// Standard uncertainties of the target's quantity and the highest pH at `dose`.
Result<AtDose> uncertainty_at(const Water& w, const DoseMix& dose, const Settings& s,
                              const cb::InputUncertainties& u) {
  struct Source {
    double u;
    std::function<void(Water&, double)> move;
  };
  const bool first_ph = w.measurements.first.quantity == cb::Quantity::PH;
  const bool second_ph = w.measurements.second.quantity == cb::Quantity::PH;
  std::vector<Source> sources = {
      {u.first, [](Water& x, double h) { x.measurements.first.value += h; }},
      {u.second, [](Water& x, double h) { x.measurements.second.value += h; }},
      // The pH scale conversion moves the pH reading it converts.
      {(first_ph || second_ph) ? u.ph_scale_conversion : 0.0,
       [first_ph](Water& x, double h) { (first_ph ? x.measurements.first : x.measurements.second).value += h; }},
      {u.salinity, [](Water& x, double h) { x.salinity += h; }},
      {u.temperature_c, [](Water& x, double h) { x.temperature_c += h; }},
      {w.calcium_umol_kg ? u.calcium_umol_kg : 0.0, [](Water& x, double h) { *x.calcium_umol_kg += h; }},
      // A salt mix's measured boron, and magnesium when the Mg/Ca correction reads it.
      {w.total_boron_umol_kg ? u.total_boron_umol_kg : 0.0, [](Water& x, double h) { *x.total_boron_umol_kg += h; }},
      {w.magnesium_umol_kg && w.mg_ca_correction ? u.magnesium_umol_kg : 0.0,
       [](Water& x, double h) { *x.magnesium_umol_kg += h; }},
  };
  double vt = 0, vp = 0;
  for (const Source& src : sources) {
    if (!(src.u > 0)) continue;
    const double h = 0.1 * src.u;  // small against u: the first-order term
    Water up = w, down = w;
    src.move(up, h);
    src.move(down, -h);
    auto a = at_dose(up, dose, s);
    if (!a) return a.error();
    auto b = at_dose(down, dose, s);
    if (!b) return b.error();
    const double dt = (a->target - b->target) / (2 * h), dp = (a->ph_max - b->ph_max) / (2 * h);
    vt += dt * dt * src.u * src.u;
    vp += dp * dp * src.u * src.u;
  }
  return AtDose{std::sqrt(vt), std::sqrt(vp)};
}

}  // namespace

Result<Treatment> treatment_to_confidence(const Water& w, const Settings& s) {
  const Confidence& c = *s.confidence;
  auto z = one_sided_z(c.probability);
  if (!z) return z.error();
  Settings plain = s;
  plain.confidence.reset();
  auto centre = plan_treatment(w, plain);
  if (!centre) return centre.error();
  Treatment t = *centre;
  Settings shifted = plain;
  AtDose u{};
  for (int i = 0; i < 8; ++i) {
    auto ui = uncertainty_at(w, t.dose, plain, c.intake);
    if (!ui) return ui.error();
    u = *ui;
    shifted.target.value = s.target.value + *z * u.target;
    shifted.limits.ph_ceiling = s.limits.ph_ceiling - *z * u.ph_max;
    auto next = plan_treatment(w, shifted);
    if (!next) {
      return Error{next.error().field,
                   fmt::format("at {:g} % confidence (the target raised by {:.3g} and the pH ceiling lowered by {:.3g} "
                               "for the intake readings' precision): {}; or lower the confidence, or measure the "
                               "intake more precisely",
                               100 * c.probability, *z * u.target, *z * u.ph_max, next.error().message)};
    }
    const double change = std::fabs(next->dose.alkalinity_umol_kg() - t.dose.alkalinity_umol_kg());
    t = *next;
    if (change < 0.05) break;
  }
  auto final_u = uncertainty_at(w, t.dose, plain, c.intake);
  if (!final_u) return final_u.error();
  auto v = at_dose(w, t.dose, plain);
  if (!v) return v.error();
  ConfidenceReport r;
  r.probability = c.probability;
  r.z = *z;
  r.centre_added_alkalinity_umol_kg = centre->dose.alkalinity_umol_kg();
  r.added_alkalinity_umol_kg = t.dose.alkalinity_umol_kg();
  r.target_value = v->target;
  r.target_u = final_u->target;
  r.target_bound = v->target - *z * final_u->target;
  r.ph_max = v->ph_max;
  r.ph_u = final_u->ph_max;
  r.ph_bound = v->ph_max + *z * final_u->ph_max;
  const std::string what = describe_target(s.target);
  r.summary = fmt::format(
      "dosed for {:g} % confidence: {} reached with {:g} % probability ({:.3g} +/- {:.2g} at this dose, "
      "one-sided bound {:.3g}) and the highest pH {:.3f} +/- {:.3f} ({} scale) stays under the ceiling {:.2f} with "
      "the same probability (bound {:.3f}); added alkalinity {:.1f} umol/kg instead of {:.1f} for the readings as "
      "they stand (+{:.1f}, the margin's cost)",
      100 * c.probability, what, 100 * c.probability, r.target_value, r.target_u, r.target_bound, r.ph_max, r.ph_u,
      cb::to_string(s.limits.ph_ceiling_scale), s.limits.ph_ceiling, r.ph_bound, r.added_alkalinity_umol_kg,
      r.centre_added_alkalinity_umol_kg, r.added_alkalinity_umol_kg - r.centre_added_alkalinity_umol_kg);
  t.confidence = r;
  return t;
}

}  // namespace detail
}  // namespace tw::hatchery
