// The hatchery line: intake -> conditioned (heated, cooled, mixed) -> dosed (see the header).
// Mixing check value (hand-worked, tests/unit/hatchery/test_hatchery_line.cpp): 1 part fresh
// water to 3 parts S 30 seawater at 15 C, densities 0.99910 and 1.02254 kg/L (EOS-80): mass
// fraction of fresh water 0.99910 / (0.99910 + 3 x 1.02254) = 0.24568, salinity 22.630.
#include "tidewright/hatchery/hatchery_line.hpp"

#include <fmt/format.h>

#include "hatchery_internal.hpp"
#include "tidewright/carbonate/carbonate_formulas.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/seawater/seawater.hpp"

namespace tw::hatchery {

namespace cb = tw::carbonate;

Result<MixResult> mix_waters(double salinity, double temperature_c, double alkalinity_umol_kg, double dic_umol_kg,
                             double calcium_umol_kg, const OtherWater& o) {
  if (auto r = ranges::check("mix_fraction", o.volume_fraction, ranges::kMixVolumeFraction); !r) return r.error();
  // The other water's density is EOS-80's too: the water's ranges (common/ranges.hpp).
  if (auto r = ranges::check("mix_salinity", o.salinity, ranges::kSalinity); !r) return r.error();
  if (auto r = ranges::check("mix_temperature_c", o.temperature_c, ranges::kTemperatureC); !r) return r.error();
  if (auto r = ranges::check("mix_alkalinity", o.alkalinity_umol_kg, ranges::kMixWaterCarbonUmolKg); !r) return r.error();
  if (auto r = ranges::check("mix_dic", o.dic_umol_kg, ranges::kMixWaterCarbonUmolKg); !r) return r.error();
  if (auto r = check_range("mix_calcium", o.calcium_umol_kg, 0.0, cb::kCalciumMaxUmolKg, "umol/kg"); !r)
    return r.error();
  // Volume fraction -> mass fraction with each water's own density (EOS-80).
  const double m_intake = (1.0 - o.volume_fraction) * seawater::density_kg_per_l(salinity, temperature_c);
  const double m_other = o.volume_fraction * seawater::density_kg_per_l(o.salinity, o.temperature_c);
  const double x = m_other / (m_intake + m_other);
  const auto by_mass = [x](double a, double b) { return (1.0 - x) * a + x * b; };
  MixResult out;
  out.mass_fraction_other = x;
  out.salinity = by_mass(salinity, o.salinity);
  out.temperature_c = by_mass(temperature_c, o.temperature_c);  // equal heat capacities assumed
  out.alkalinity_umol_kg = by_mass(alkalinity_umol_kg, o.alkalinity_umol_kg);
  out.dic_umol_kg = by_mass(dic_umol_kg, o.dic_umol_kg);
  out.calcium_umol_kg = by_mass(calcium_umol_kg, o.calcium_umol_kg);
  return out;
}

namespace {

// A salt mix's measured boron and magnesium mix by mass, as calcium does; the added water is
// taken to carry seawater's at its own salinity (none when fresh): Uppstrom (1974) boron and
// the reference composition's magnesium (Millero et al. 2008), each scaled by salinity.
void mix_salt_mix_ions(const Water& intake, const OtherWater& other, double mass_fraction_other, Water& mixed,
                       std::vector<std::string>& notes) {
  const double x = mass_fraction_other;
  if (intake.total_boron_umol_kg) {
    const double added = cb::total_boron_uppstrom1974(other.salinity) * 1e6;
    mixed.total_boron_umol_kg = (1.0 - x) * *intake.total_boron_umol_kg + x * added;
    notes.push_back(fmt::format("measured boron mixed by mass: {:.0f} umol/kg, taking {:.0f} umol/kg (seawater's "
                                "ratio at salinity {:g}) in the added water",
                                *mixed.total_boron_umol_kg, added, other.salinity));
  }
  if (intake.magnesium_umol_kg) {
    const double added = cb::kMyamiModernMagnesiumMolKg * 1e6 * other.salinity / 35.0;
    mixed.magnesium_umol_kg = (1.0 - x) * *intake.magnesium_umol_kg + x * added;
    notes.push_back(fmt::format("measured magnesium mixed by mass: {:.0f} umol/kg, taking {:.0f} umol/kg (seawater's "
                                "ratio at salinity {:g}) in the added water",
                                *mixed.magnesium_umol_kg, added, other.salinity));
  }
}

}  // namespace

Result<HatcheryLine> plan_line(const Water& intake, const Conditioning& c, const Settings& s) {
  auto line = detail::solve_intake(intake);
  if (!line) return line.error();
  HatcheryLine out;
  const double ca_intake = line->constants.calcium.calcium_umol_kg;
  out.points.push_back({"intake", intake.salinity, intake.temperature_c, ca_intake, line->intake});

  // Conditioned water: alkalinity and DIC are conserved by heating; mixing changes them by mass.
  MixResult m{0, intake.salinity, intake.temperature_c, line->intake.alkalinity_umol_kg, line->intake.dic_umol_kg,
              ca_intake};
  if (c.mix) {
    auto mixed = mix_waters(intake.salinity, intake.temperature_c, line->intake.alkalinity_umol_kg,
                            line->intake.dic_umol_kg, ca_intake, *c.mix);
    if (!mixed) return mixed.error();
    m = *mixed;
    out.notes.push_back(fmt::format("mixed {:.1f} % by volume ({:.1f} % by mass) of water at salinity {:g} into the "
                                    "intake: salinity {:.2f}",
                                    100 * c.mix->volume_fraction, 100 * m.mass_fraction_other, c.mix->salinity,
                                    m.salinity));
  }
  if (c.tank_temperature_c) {
    if (auto r = ranges::check("tank_temperature_c", *c.tank_temperature_c, ranges::kTemperatureC); !r) return r.error();
    m.temperature_c = *c.tank_temperature_c;
  }
  if (m.salinity < cb::kSalinityMin) {
    return Error{"mix_fraction", fmt::format("the mixed water's salinity {:.2f} is below {:g}, where the seawater "
                                             "carbonate constants end; use less fresh water (accepted salinity {:g} "
                                             "to {:g})",
                                             m.salinity, cb::kSalinityMin, cb::kSalinityMin, cb::kSalinityMax)};
  }
  Water w = intake;
  w.salinity = m.salinity;
  w.temperature_c = m.temperature_c;
  w.calcium_umol_kg = m.calcium_umol_kg;  // carried from the intake (measured or scaled), then mixed
  if (c.mix) mix_salt_mix_ions(intake, *c.mix, m.mass_fraction_other, w, out.notes);
  w.measurements = {{cb::Quantity::Alkalinity, m.alkalinity_umol_kg}, {cb::Quantity::DIC, m.dic_umol_kg},
                    cb::PhScale::Total};
  auto cond = detail::solve_intake(w);
  if (!cond) return cond.error();
  out.points.push_back({"conditioned", w.salinity, w.temperature_c, m.calcium_umol_kg, cond->intake});

  auto t = plan_treatment(w, s);
  if (!t) return t.error();
  out.points.push_back({"dosed (after mixing)", w.salinity, w.temperature_c, m.calcium_umol_kg, t->after_mixing});
  out.points.push_back({"at the tanks", w.salinity, w.temperature_c, m.calcium_umol_kg, t->at_tanks});
  out.treatment = std::move(t).value();
  if (c.mix) {  // not "as measured": mixed from the intake's calcium and the added water's
    out.treatment.calcium_source = fmt::format(
        "calcium mixed by mass, {:.0f} umol/kg, from the intake's ({}) and {:.0f} umol/kg in the added water",
        m.calcium_umol_kg, line->constants.calcium.note, c.mix->calcium_umol_kg);
  }
  out.conditioned = w;
  return out;
}

}  // namespace tw::hatchery
