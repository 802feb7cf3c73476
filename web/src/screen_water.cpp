// Water: the full carbonate state of the current system (latest readings) or of what-if
// numbers, computed by the core; Omega with a plain reading; the species chart.
#include <algorithm>
#include <string>

#include "actions.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/common/units.hpp"
#include "tidewright/seawater/seawater.hpp"
#include "fields.hpp"
#include "format.hpp"
#include "screens.hpp"
#include "theme.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

namespace jn = tw::journal;
namespace cb = tw::carbonate;

const char* const kPairs[] = {"Alk + pH", "Alk + pCO\u2082", "Alk + DIC", "Alk + room air"};

// A plain reading of aragonite saturation for reef and shellfish keepers [common practice:
// rough bands, no single source; below 1 aragonite dissolves by definition of Omega].
const char* omega_reading(double omega, ImU32* color) {
  *color = theme::kText;
  if (omega < 1.0) {
    *color = theme::kError;
    return "Undersaturated: aragonite dissolves. Shells and skeletons cannot build; larvae fail.";
  }
  if (omega < 2.0) {
    *color = theme::kWarning;
    return "Low: calcifying is slow and costly for corals and larvae.";
  }
  if (omega < 3.0) return "Fair: growth, but below natural reef water.";
  if (omega < 4.5) return "Typical of healthy reef seawater.";
  if (omega < 6.0) return "High: fast growth; dose slowly, precipitation is nearer.";
  *color = theme::kWarning;
  return "Very high: carbonate may precipitate on heaters and pumps (snow), taking alkalinity with it.";
}

// The name of a source of uncertainty (core's UncertaintySource::name) in plain words.
std::string source_label(const std::string& name) {
  if (name == "alkalinity") return "alkalinity test";
  if (name == "ph") return "pH reading";
  if (name == "ph_scale_conversion") return "NBS-to-total conversion";
  if (name == "temperature_c") return "temperature";
  if (name == "pco2") return "pCO\u2082";
  if (name == "dic") return "DIC";
  return name;
}

// A salt mix's own composition (issue 18): measured total boron in place of the salinity-scaled
// value, and the Mg/Ca correction of the constants (Hain et al. 2015), off unless chosen. Both
// ranges are the core's, shown in mg/L at this water's density.
void draw_salt_mix(AppState& app, WaterInputs& w, bool& changed) {
  using tw::units::ConcentrationUnit, tw::units::Ion;
  const double rho = tw::seawater::density_kg_per_l(w.salinity, w.temperature_c);
  const double boron_hi = tw::units::ion_from_umol_kg(tw::ranges::kTotalBoronUmolKg.hi, ConcentrationUnit::MgPerL,
                                                      Ion::Boron, rho);
  changed |= ui::optional_number_field(app, "water.boron", {"Total boron (measured)", "mg/L", 2, 0.1, 0.0, boron_hi},
                                       &w.total_boron_mg_l);
  if (w.total_boron_mg_l && ui::button(app, "water.boron.clear", "Scale boron from salinity instead", -1, ui::Tone::Quiet)) {
    w.total_boron_mg_l.reset();
    changed = true;
  }
  static const char* kMgCa[] = {"Seawater ratios", "Correct for Mg and Ca"};
  int mgca = w.mg_ca_correction ? 1 : 0;
  if (ui::choice(app, "water.mg_ca", "Equilibrium constants", &mgca, kMgCa, 2)) {
    w.mg_ca_correction = mgca == 1;
    changed = true;
  }
  if (!w.mg_ca_correction) return;
  const double mg_hi = tw::units::ion_from_umol_kg(tw::ranges::kMagnesiumUmolKg.hi, ConcentrationUnit::MgPerL,
                                                   Ion::Magnesium, rho);
  changed |= ui::optional_number_field(app, "water.magnesium",
                                       {"Magnesium (measured)", "mg/L", 0, 10, 0.0, std::min(mg_hi, tw::ranges::kMagnesiumMgL.hi)},
                                       &w.magnesium_mg_l);
  ui::dim_text("For salt mixes whose magnesium and calcium depart from seawater's: the constants are corrected by "
               "the MyAMI model's published polynomial (Hain et al. 2015), salinity 30-40 and 0-40 \u00b0C only. "
               "Needs measured calcium and magnesium.");
}

void draw_inputs(AppState& app, const jn::UnitPreferences& u) {
  WaterInputs w = app.water;
  bool changed = false;
  int pair = static_cast<int>(w.pair);
  if (ui::choice(app, "water.pair", "Solve from", &pair, kPairs, 4)) {
    w.pair = static_cast<WaterPair>(pair);
    changed = true;
  }
  changed |= fields::alkalinity(app, "water.alkalinity", "Alkalinity", &w.alkalinity_dkh, u.alkalinity);
  if (w.pair == WaterPair::AlkalinityPH) {
    const std::string label = std::string("pH (") + fmtx::ph_scale_label(w.ph_scale) + " scale)";
    changed |= ui::number_field(app, "water.ph", {label.c_str(), "", 2, 0.01, tw::ranges::kPh.lo, tw::ranges::kPh.hi}, &w.ph);
    changed |= fields::ph_scale(app, "water.ph_scale", "pH scale of that reading", &w.ph_scale);
  } else if (w.pair == WaterPair::AlkalinityPCO2) {
    changed |= ui::number_field(app, "water.pco2", {"pCO\u2082 of the water", "\u03bcatm", 0, 20, 10, 20000}, &w.pco2_uatm);
  } else if (w.pair == WaterPair::AlkalinityDIC) {
    changed |= ui::number_field(app, "water.dic", {"DIC", "\u03bcmol/kg", 0, 20, 100, 6000}, &w.dic_umol_kg);
  } else {
    ui::dim_text(("Water left to settle with the room's air at " + fmtx::fixed(app.settings.room_co2_ppm, 0) +
                  " ppm CO\u2082 (change it in Settings).").c_str());
  }
  // Empty: the core scales calcium from salinity and says so under the results.
  changed |= ui::optional_number_field(app, "water.calcium",
                                       {"Calcium (measured)", tw::ranges::kCalciumMgL.unit, 0, 10, tw::ranges::kCalciumMgL.lo,
                                        tw::ranges::kCalciumMgL.hi},
                                       &w.calcium_mg_l);
  if (w.calcium_mg_l && ui::button(app, "water.calcium.clear", "Scale calcium from salinity instead", -1, ui::Tone::Quiet)) {
    w.calcium_mg_l.reset();
    changed = true;
  }
  draw_salt_mix(app, w, changed);
  changed |= ui::number_field(app, "water.salinity", {"Salinity", "psu", 1, 0.5, tw::ranges::kSalinity.lo, tw::ranges::kSalinity.hi}, &w.salinity);
  changed |= fields::temperature(app, "water.temperature", "Temperature", &w.temperature_c, u.temperature);
  if (changed) set_water_inputs(app, w);
}

// The readings' precisions, editable (one standard deviation, in the system's units).
void draw_precision(AppState& app, const jn::UnitPreferences& u) {
  WaterPrecision p = app.water_precision;
  const WaterInputs& w = app.water;
  bool changed = false;
  const auto dflt = [](jn::Parameter par) { return *cb::default_precision(par); };
  const fmtx::UnitShown au = fmtx::alkalinity_shown(u.alkalinity);
  double alk = fmtx::alkalinity_from_dkh(p.alkalinity_dkh, u.alkalinity);
  if (ui::number_field(app, "water.u_alkalinity",
                       {"Alkalinity test \u00b1", au.unit, au.decimals + 1, au.step / 2, 0.0,
                        fmtx::alkalinity_from_dkh(dflt(jn::Parameter::Alkalinity).maximum, u.alkalinity)},
                       &alk)) {
    p.alkalinity_dkh = fmtx::alkalinity_to_dkh(alk, u.alkalinity);
    changed = true;
  }
  if (w.pair == WaterPair::AlkalinityPH) {
    changed |= ui::number_field(app, "water.u_ph", {"pH reading \u00b1", "", 2, 0.01, 0.0, dflt(jn::Parameter::PH).maximum}, &p.ph);
    if (w.ph_scale == cb::PhScale::NBS)
      changed |= ui::number_field(app, "water.u_ph_conversion",
                                  {"NBS reading to total scale \u00b1", "", 2, 0.01, 0.0, cb::kMaxUncertaintyPh},
                                  &p.ph_conversion);
  } else if (w.pair == WaterPair::AlkalinityPCO2) {
    changed |= ui::number_field(app, "water.u_pco2", {"pCO\u2082 \u00b1", "\u03bcatm", 0, 5, 0.0,
                                                      cb::kMaxUncertaintyRelative * w.pco2_uatm}, &p.pco2_uatm);
  } else if (w.pair == WaterPair::AlkalinityDIC) {
    changed |= ui::number_field(app, "water.u_dic", {"DIC \u00b1", "\u03bcmol/kg", 0, 5, 0.0,
                                                     cb::kMaxUncertaintyRelative * w.dic_umol_kg}, &p.dic_umol_kg);
  }
  changed |= ui::number_field(app, "water.u_salinity", {"Salinity \u00b1", "psu", 1, 0.1, 0.0, dflt(jn::Parameter::Salinity).maximum}, &p.salinity);
  // A temperature difference in the shown unit: the one C/F conversion taken between two points.
  const double per_c = fmtx::temperature_shown(1.0, u.temperature) - fmtx::temperature_shown(0.0, u.temperature);
  double t = p.temperature_c * per_c;
  if (ui::number_field(app, "water.u_temperature",
                       {"Temperature \u00b1", fmtx::temperature_unit_text(u.temperature), 1, 0.1, 0.0,
                        dflt(jn::Parameter::Temperature).maximum * per_c},
                       &t)) {
    p.temperature_c = t / per_c;
    changed = true;
  }
  // A measured composition's precisions, shown only where that value is used.
  if (w.calcium_mg_l)
    changed |= ui::number_field(app, "water.u_calcium", {"Calcium test \u00b1", "mg/L", 0, 1, 0.0,
                                                         dflt(jn::Parameter::Calcium).maximum}, &p.calcium_mg_l);
  if (w.mg_ca_correction && w.magnesium_mg_l)
    changed |= ui::number_field(app, "water.u_magnesium", {"Magnesium test \u00b1", "mg/L", 0, 5, 0.0,
                                                           dflt(jn::Parameter::Magnesium).maximum}, &p.magnesium_mg_l);
  if (w.total_boron_mg_l) {
    double percent = 100.0 * p.total_boron_relative;
    if (ui::number_field(app, "water.u_boron", {"Total boron \u00b1", "%", 0, 1, 0.0, 100.0 * cb::kMaxUncertaintyRelative},
                         &percent)) {
      p.total_boron_relative = percent / 100.0;
      changed = true;
    }
  }
  if (ui::button(app, "water.u_defaults", "Typical hobby kit precisions", 0, ui::Tone::Quiet)) {
    p = WaterPrecision{};
    changed = true;
  }
  if (changed) set_water_precision(app, p);
}

void draw_results(AppState& app, const jn::UnitPreferences& u) {
  const WaterResult& r = app.water_result;
  if (!r.ok) {
    ui::colored_wrapped(theme::kError, ("No result: " + r.error).c_str());
    return;
  }
  const cb::CarbonateState& s = r.state;
  const float e = ui::em(app);
  // Every number with its band: the standard uncertainty from the readings' precision
  // (Inputs, below); without it, a plain value with few digits and the reason.
  const bool has_u = r.u.has_value();
  const cb::CarbonateOutputs uu = has_u ? *r.u : cb::CarbonateOutputs{};
  const auto shown = [&](double value, double cb::CarbonateOutputs::*field, int plain_decimals,
                         const char* unit) {
    if (has_u) return fmtx::with_u(value, uu.*field, unit);
    return fmtx::fixed(value, plain_decimals) + (*unit ? std::string(" ") + unit : "");
  };
  const auto ph_u = [&](cb::PhScale sc) {
    switch (sc) {
      case cb::PhScale::Total: return &cb::CarbonateOutputs::ph_total;
      case cb::PhScale::Seawater: return &cb::CarbonateOutputs::ph_sws;
      case cb::PhScale::Free: return &cb::CarbonateOutputs::ph_free;
      case cb::PhScale::NBS: return &cb::CarbonateOutputs::ph_nbs;
    }
    return &cb::CarbonateOutputs::ph_total;
  };
  // The headline: Omega aragonite, big, with its band and its plain reading.
  ui::card_begin(app);
  ui::dim_text("Aragonite saturation \u03a9");
  ImGui::PushFont(app.ui.fonts.big);
  ImGui::TextUnformatted((has_u ? fmtx::fixed(s.omega_aragonite, cb::decimals_for_uncertainty(uu.omega_aragonite))
                                : fmtx::fixed(s.omega_aragonite, 1)).c_str());
  ImGui::PopFont();
  ui::record(app, "water.omega");
  if (has_u) {
    ui::wrapped(("Likely " + fmtx::between_95(s.omega_aragonite, uu.omega_aragonite) +
                 " (95 %), from how precise the readings are" +
                 (r.omega_main_source.empty() ? std::string(".") : "; most of that from the " + source_label(r.omega_main_source) + ".")).c_str());
    ui::record(app, "water.omega_band");
  } else {
    ui::colored_wrapped(theme::kWarning, r.u_error.c_str());
  }
  ImU32 col = 0;
  const char* reading = omega_reading(s.omega_aragonite, &col);
  ui::colored_wrapped(col, reading);
  if (has_u) {
    const cb::Range band = cb::range95(s.omega_aragonite, uu.omega_aragonite);
    ImU32 band_col = 0;
    const char* low_reading = omega_reading(band.low, &band_col);
    if (low_reading != reading)
      ui::colored_wrapped(band_col == theme::kText ? theme::kWarning : band_col,
                          (std::string("At the low end of that range: ") + low_reading).c_str());
  }
  ui::card_end(app);

  ui::card_begin(app);
  const cb::PhScale meter = u.ph_scale;
  ui::label_value(app, (std::string("pH, ") + fmtx::ph_scale_label(meter) + " scale (your meter)").c_str(),
                  shown(fmtx::ph_on_scale(s, meter), ph_u(meter), 2, ""), theme::kAccent);
  for (cb::PhScale sc : fields::kPhScales) {
    if (sc == meter) continue;
    ui::label_value(app, (std::string("pH, ") + fmtx::ph_scale_label(sc) + " scale").c_str(),
                    shown(fmtx::ph_on_scale(s, sc), ph_u(sc), 2, ""));
  }
  ui::divider(app);
  const fmtx::UnitShown au = fmtx::alkalinity_shown(u.alkalinity);
  ui::label_value(app, "Alkalinity",
                  has_u ? fmtx::with_u(fmtx::alkalinity_from_dkh(app.water.alkalinity_dkh, u.alkalinity),
                                       fmtx::alkalinity_from_dkh(app.water_precision.alkalinity_dkh, u.alkalinity), au.unit)
                        : fmtx::alkalinity_text(app.water.alkalinity_dkh, u.alkalinity));
  ui::label_value(app, "DIC", shown(s.dic_umol_kg, &cb::CarbonateOutputs::dic_umol_kg, 0, "\u03bcmol/kg"));
  ui::label_value(app, "Bicarbonate HCO\u2083\u207b", shown(s.hco3_umol_kg, &cb::CarbonateOutputs::hco3_umol_kg, 0, "\u03bcmol/kg"), theme::kHco3);
  ui::label_value(app, "Carbonate CO\u2083\u00b2\u207b", shown(s.co3_umol_kg, &cb::CarbonateOutputs::co3_umol_kg, 0, "\u03bcmol/kg"), theme::kCo3);
  ui::label_value(app, "CO\u2082*", shown(s.co2_umol_kg, &cb::CarbonateOutputs::co2_umol_kg, 1, "\u03bcmol/kg"), theme::kCo2);
  ui::label_value(app, "pCO\u2082", shown(s.pco2_uatm, &cb::CarbonateOutputs::pco2_uatm, 0, "\u03bcatm"));
  ui::label_value(app, "\u03a9 calcite", shown(s.omega_calcite, &cb::CarbonateOutputs::omega_calcite, 1, ""));
  ui::label_value(app, "Revelle factor", shown(s.revelle_factor, &cb::CarbonateOutputs::revelle_factor, 1, ""));
  ui::label_value(app, "Buffer capacity \u03b2", shown(s.buffer_capacity_umol_kg, &cb::CarbonateOutputs::buffer_capacity_umol_kg, 0, "\u03bcmol/kg per pH"));
  if (has_u)
    ui::dim_text("\u00b1 is one standard deviation from the readings' precision (Inputs, below); "
                 "the 95 % range is about twice that either side (a linear approximation).");
  ui::card_end(app);

  if (r.air) {
    ui::card_begin(app);
    ui::dim_text(("After settling with the room's air (" + fmtx::fixed(app.settings.room_co2_ppm, 0) + " ppm CO\u2082, same alkalinity):").c_str());
    ui::label_value(app, (std::string("pH, ") + fmtx::ph_scale_label(meter) + " scale").c_str(), fmtx::fixed(fmtx::ph_on_scale(*r.air, meter), 2));
    ui::label_value(app, "\u03a9 aragonite", fmtx::fixed(r.air->omega_aragonite, 1));
    const double gap = fmtx::ph_on_scale(s, meter) - fmtx::ph_on_scale(*r.air, meter);
    if (app.water.pair != WaterPair::AlkalinityAir) {
      ui::dim_text(gap > 0.05 ? "The water's pH is above where the room's air would settle it: CO\u2082 taken up from the air will pull it down over hours."
                   : gap < -0.05 ? "The water's pH is below where the room's air would settle it: it holds extra CO\u2082 (animals, little aeration); more gas exchange would raise it."
                                 : "The water is close to equilibrium with the room's air.");
    }
    ui::card_end(app);
  } else if (!r.air_error.empty()) {
    ui::colored_wrapped(theme::kWarning, r.air_error.c_str());
  }
  // Where calcium came from (the core's sentence); at low salinity the same sentence is one of
  // the warnings below, drawn there in the warning colour instead.
  if (!r.calcium.low_salinity) ui::dim_text(("Saturation uses " + r.calcium.note + ".").c_str());
  if (r.boron.measured) ui::dim_text(("Borate uses " + r.boron.note + ".").c_str());
  // The Mg/Ca correction, when applied, is among the warnings below (the core's sentence).
  for (const auto& wmsg : s.warnings) ui::colored_wrapped(theme::kWarning, wmsg.c_str());
  (void)e;
}

}  // namespace

void draw_water(AppState& app) {
  const jn::System* sys = current_system(app);
  const jn::UnitPreferences u = sys ? sys->units : app.settings.units;
  ui::panes_begin(app);  // wide: the results and their chart beside the inputs
  ui::heading(app, "Water");
  ui::dim_text(app.water.source.c_str());
  if (app.water.what_if && sys) {
    if (ui::button(app, "water.use_latest", "Use latest readings")) use_latest_readings(app);
  }
  draw_results(app, u);
  ui::heading(app, "Species across pH");
  draw_species_chart(app);
  ui::panes_next(app);
  ui::heading(app, "Inputs");
  ui::dim_text("Change any number for a what-if; the log is not touched.");
  draw_inputs(app, u);
  ui::heading(app, "How precise the readings are");
  ui::dim_text("One standard deviation of each reading. The defaults are typical hobby kits and "
               "meters (common practice: alkalinity kits 0.2-0.5 dKH, pH meters 0.05-0.1, and a few "
               "hundredths more to put an NBS reading on the total scale). Change them to your own.");
  draw_precision(app, u);
  ui::panes_end(app);
}

}  // namespace twapp
