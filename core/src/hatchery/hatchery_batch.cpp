// Hatchery batch buffering: a static culture tank of a given volume, how many grams of each
// compound to add, and the chemistry after (fully mixed, then after gas exchange phi).
#include <fmt/format.h>

#include "hatchery_internal.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/additives/additives.hpp"
#include "tidewright/hatchery/hatchery.hpp"
#include "tidewright/seawater/seawater.hpp"

namespace tw::hatchery {

namespace detail {
double molar_mass_g_mol(Compound c);                                    // hatchery_flow.cpp
std::vector<std::pair<Compound, double>> components(const DoseMix& d);  // hatchery_flow.cpp
std::vector<Compound> compounds_of(Buffer b);                           // hatchery_flow.cpp
}  // namespace detail

Result<BatchPlan> plan_batch(const Water& tank, double volume_l, const Settings& s) {
  if (auto r = ranges::check("volume_l", volume_l, ranges::kSystemVolumeL); !r) return r.error();
  auto treatment = plan_treatment(tank, s);
  if (!treatment) return treatment.error();

  BatchPlan plan;
  plan.volume_l = volume_l;
  plan.water_mass_kg = volume_l * seawater::density_kg_per_l(tank.salinity, tank.temperature_c);
  plan.treatment = std::move(treatment).value();
  plan.warnings = plan.treatment.warnings;
  plan.cautions = detail::compounds_of(s.buffer).empty() ? std::vector<std::string>{}
                                                         : cautions_for(detail::compounds_of(s.buffer));
  if (!plan.treatment.dose_needed) {
    plan.warnings.push_back(fmt::format("the tank already meets {}: no addition needed",
                                        detail::describe_target(s.target)));
  }
  for (const auto& [c, umol] : detail::components(plan.treatment.dose)) {
    const double grams = umol * 1e-6 * detail::molar_mass_g_mol(c) * plan.water_mass_kg;
    plan.additions.push_back(BatchPlan::Addition{c, umol, grams});
  }
  const double om = plan.treatment.after_mixing.omega_aragonite;
  if (om > s.limits.mixing_omega_ceiling) {
    plan.warnings.push_back(fmt::format(
        "precipitation risk: Omega ar {:.2f} after mixing is above {:.1f} (Moras et al. 2022); "
        "add in smaller steps and re-measure between them", om, s.limits.mixing_omega_ceiling));
  }
  if (!plan.additions.empty()) {
    plan.warnings.push_back(
        "dissolve the salt fully in a few litres of tank water or fresh water first and pour it in "
        "slowly where the water moves fastest, away from animals (common practice); undissolved "
        "grains make local spots of very high pH and Omega");
  }
  return plan;
}

}  // namespace tw::hatchery
