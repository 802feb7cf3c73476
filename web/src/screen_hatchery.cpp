// Hatchery: buffering intake seawater (flow-through) or a static culture tank (batch) with
// sodium carbonate, bicarbonate, hydroxide or a blend, to a target aragonite saturation, pH
// or alkalinity rise under a pH ceiling. All chemistry is the core's (tw::hatchery); this
// screen edits the form, shows the dose, the water through the line, the pump-side table and
// the cautions. Map: 1. form  2. results  3. the line (intake -> conditioned -> dosed -> tanks)
// 4. pump-side table  5. draw_hatchery.
#include <algorithm>
#include <string>

#include "actions.hpp"
#include "actions_dosing.hpp"
#include "fields.hpp"
#include "format.hpp"
#include "screens.hpp"
#include "theme.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/seawater/seawater.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

namespace hat = tw::hatchery;
namespace cb = tw::carbonate;
namespace jn = tw::journal;

// ---------------------------------------------------------------- 1. Form
// A salt mix's own composition (issue 18), as on the Water screen: measured total boron in place
// of the salinity-scaled value, and the Mg/Ca correction of the constants, off unless chosen.
// Ranges are the core's, shown in mg/L at this water's density.
void draw_salt_mix(AppState& app, HatcheryForm& f) {
  using tw::units::ConcentrationUnit, tw::units::Ion;
  namespace rg = tw::ranges;
  const double rho = tw::seawater::density_kg_per_l(f.salinity, f.temperature_c);
  const auto boron_mg_l = [rho](double umol_kg) {
    return tw::units::ion_from_umol_kg(umol_kg, ConcentrationUnit::MgPerL, Ion::Boron, rho);
  };
  ui::optional_number_field(app, "hatchery.boron",
                            {"Total boron (measured)", "mg/L", 2, 0.1, boron_mg_l(rg::kTotalBoronUmolKg.lo),
                             boron_mg_l(rg::kTotalBoronUmolKg.hi)},
                            &f.total_boron_mg_l);
  if (f.total_boron_mg_l && ui::button(app, "hatchery.boron.clear", "Scale boron from salinity instead", -1, ui::Tone::Quiet)) {
    f.total_boron_mg_l.reset();
  }
  static const char* const kMgCa[] = {"Seawater ratios", "Correct for Mg and Ca"};
  int mgca = f.mg_ca_correction ? 1 : 0;
  if (ui::choice(app, "hatchery.mg_ca", "Equilibrium constants", &mgca, kMgCa, 2)) f.mg_ca_correction = mgca == 1;
  if (!f.mg_ca_correction) return;
  const double mg_hi = tw::units::ion_from_umol_kg(rg::kMagnesiumUmolKg.hi, ConcentrationUnit::MgPerL, Ion::Magnesium, rho);
  ui::optional_number_field(app, "hatchery.magnesium",
                            {"Magnesium (measured)", rg::kMagnesiumMgL.unit, 0, 10, rg::kMagnesiumMgL.lo,
                             std::min(mg_hi, rg::kMagnesiumMgL.hi)},
                            &f.magnesium_mg_l);
  ui::dim_text("For salt mixes whose magnesium and calcium depart from seawater's: the constants are corrected by "
               "the MyAMI model's published polynomial (Hain et al. 2015), salinity 30-40 and 0-40 \u00b0C only. "
               "Needs measured calcium and magnesium.");
}

void draw_water_form(AppState& app, HatcheryForm& f) {
  const auto u = fields::units(app);
  ui::card_begin(app);
  ui::heading(app, f.mode == HatcheryMode::FlowThrough ? "Intake water" : "Tank water");
  namespace rg = tw::ranges;
  ui::number_field(app, "hatchery.salinity",
                   {"Salinity", "psu", 1, 0.5, rg::kSalinityForCarbonateChemistry.lo, rg::kSalinityForCarbonateChemistry.hi},
                   &f.salinity);
  fields::temperature(app, "hatchery.temperature", "Temperature", &f.temperature_c, u.temperature);
  fields::alkalinity(app, "hatchery.alkalinity", "Alkalinity", &f.alkalinity_dkh, u.alkalinity);
  fields::ph_scale(app, "hatchery.ph_scale", "pH scale of your meter (used for every pH here)", &f.ph_scale);
  ui::number_field(app, "hatchery.ph", {"pH", fmtx::ph_scale_label(f.ph_scale), 2, 0.05, rg::kPh.lo, rg::kPh.hi}, &f.ph);
  // Measured calcium (empty: the core scales it from salinity and says how far that can be off).
  ui::optional_number_field(app, "hatchery.calcium",
                            {"Calcium (measured)", tw::ranges::kCalciumMgL.unit, 0, 10, tw::ranges::kCalciumMgL.lo,
                             tw::ranges::kCalciumMgL.hi},
                            &f.calcium_mg_l);
  if (f.calcium_mg_l && ui::button(app, "hatchery.calcium.clear", "Scale calcium from salinity instead", -1, ui::Tone::Quiet)) {
    f.calcium_mg_l.reset();
  }
  draw_salt_mix(app, f);
  // Carbonic acid constants for this water; below the default set's range the core suggests
  // the low-salinity set with its reason (computed with the results, not every frame).
  int set = f.k1k2 == cb::K1K2Option::Millero2010 ? 1 : 0;
  const char* const sets[] = {"Lueker et al. 2000", "Millero 2010"};
  if (ui::choice(app, "hatchery.k1k2", "Carbonic acid constants (K1 K2)", &set, sets, 2)) {
    f.k1k2 = set == 1 ? cb::K1K2Option::Millero2010 : cb::K1K2Option::Lueker2000;
  }
  const HatcheryCache& c = app.ui.dosing.hatchery_cache;
  if (c.valid && c.key == f && c.k1k2_suggestion) {
    ui::colored_wrapped(theme::kWarning,
                        ("Suggested: Millero 2010 (choose it above). The " + c.k1k2_suggestion->reason + ".").c_str());
  }
  ui::card_end(app);
}

void draw_target_form(AppState& app, HatcheryForm& f) {
  const auto u = fields::units(app);
  ui::card_begin(app);
  ui::heading(app, "Target and buffer");
  int kind = static_cast<int>(f.target_kind);
  const char* const kinds[] = {"\u03a9 aragonite", "pH", "Alkalinity rise"};
  if (ui::choice(app, "hatchery.target_kind", "Raise the water to", &kind, kinds, 3)) {
    f.target_kind = static_cast<hat::TargetKind>(kind);
  }
  switch (f.target_kind) {
    case hat::TargetKind::OmegaAragonite:
      ui::number_field(app, "hatchery.target", {"Target \u03a9 aragonite", "", 2, 0.1, tw::ranges::kHatcheryTargetOmega.lo, tw::ranges::kHatcheryTargetOmega.hi}, &f.target_omega);
      break;
    case hat::TargetKind::PH:
      ui::number_field(app, "hatchery.target", {"Target pH", fmtx::ph_scale_label(f.ph_scale), 2, 0.05, tw::ranges::kHatcheryTargetPh.lo,
                                                 tw::ranges::kHatcheryTargetPh.hi},
                       &f.target_ph);
      break;
    case hat::TargetKind::AlkalinityRise: {
      const fmtx::UnitShown au = fmtx::alkalinity_shown(u.alkalinity);
      double r = fmtx::alkalinity_from_dkh(f.target_rise_dkh, u.alkalinity);
      if (ui::number_field(app, "hatchery.target",
                           {"Alkalinity to add", au.unit, au.decimals, au.step, 0.0,
                            fmtx::alkalinity_from_dkh(14.0, u.alkalinity)},
                           &r)) {
        f.target_rise_dkh = fmtx::alkalinity_to_dkh(r, u.alkalinity);
      }
      break;
    }
  }
  if (f.mode == HatcheryMode::FlowThrough) {
    int point = static_cast<int>(f.target_point);
    const char* const points[] = {"Right after mixing", "At the tanks"};
    if (ui::choice(app, "hatchery.target_point", "Where the target must be met", &point, points, 2)) {
      f.target_point = static_cast<hat::TargetPoint>(point);
    }
  }
  int buffer = static_cast<int>(f.buffer);
  const char* const buffers[] = {"Na\u2082CO\u2083", "NaHCO\u2083", "NaOH", "Blend"};
  if (ui::choice(app, "hatchery.buffer", "Buffer (blend: carbonate + bicarbonate, chosen for the pH ceiling)", &buffer,
                 buffers, 4)) {
    f.buffer = static_cast<hat::Buffer>(buffer);
  }
  ui::number_field(app, "hatchery.ph_ceiling", {"pH ceiling", fmtx::ph_scale_label(f.ph_scale), 2, 0.05, tw::ranges::kHatcheryPhCeiling.lo,
                                                    tw::ranges::kHatcheryPhCeiling.hi},
                   &f.ph_ceiling);
  // Dosing to a confidence: the target reached, and the ceiling kept, with this probability
  // given how precisely the intake was read (the core propagates it, Orr et al. 2018).
  const char* const sure[] = {"As read", "90% sure", "95% sure", "99% sure"};
  ui::choice(app, "hatchery.confidence", "Dose so the target is met and the ceiling kept", &f.confidence_index, sure, 4);
  if (f.confidence_index > 0) {
    const auto ap = *tw::carbonate::default_precision(tw::Parameter::Alkalinity);
    const double dkh_per_unit = tw::units::alkalinity_from_umol_kg(
        tw::units::alkalinity_to_umol_kg(1.0, u.alkalinity, jn::kNominalDensityKgPerL), tw::units::AlkalinityUnit::DKH,
        jn::kNominalDensityKgPerL);
    double shown = f.alkalinity_precision_dkh / dkh_per_unit;
    if (ui::number_field(app, "hatchery.alkalinity_precision",
                         {"Intake alkalinity test precision (1 sd)", fmtx::alkalinity_shown(u.alkalinity).unit, 2, 0.05,
                          0.0, ap.maximum / dkh_per_unit},
                         &shown)) {
      f.alkalinity_precision_dkh = shown * dkh_per_unit;
    }
    const auto pp = *tw::carbonate::default_precision(tw::Parameter::PH);
    ui::number_field(app, "hatchery.ph_precision", {"Intake pH reading precision (1 sd)", "pH", 3, 0.005, 0.0, pp.maximum},
                     &f.ph_precision);
  }
  if (f.mode == HatcheryMode::FlowThrough) {
    ui::number_field(app, "hatchery.flow", {"Intake flow", "L/min", 1, 5, tw::ranges::kIntakeFlowLPerMin.lo, tw::ranges::kIntakeFlowLPerMin.hi}, &f.flow_l_per_min);
    ui::optional_number_field(app, "hatchery.residence",
                              {"Time from injection to the tanks (optional)", "min", 0, 5, tw::ranges::kResidenceTimeMin.lo,
                               tw::ranges::kResidenceTimeMin.hi},
                              &f.residence_time_min);
    fields::temperature(app, "hatchery.stock_temperature", "Stock tank temperature", &f.stock_temperature_c,
                        fields::units(app).temperature, tw::ranges::kStockTemperatureC);
    ui::optional_number_field(app, "hatchery.stock_strength",
                              {"Stock strength made up (empty: the default, safely under saturation)", tw::ranges::kStockGPerL.unit,
                               0, 5, tw::ranges::kStockGPerL.lo, tw::ranges::kStockGPerL.hi},
                              &f.stock_g_per_l);
    if (f.stock_g_per_l &&
        ui::button(app, "hatchery.stock_strength.clear", "Use the default strength", -1, ui::Tone::Quiet)) {
      f.stock_g_per_l.reset();
    }
  } else {
    const auto vu = u.volume;
    double v = tw::units::volume_from_litres(f.volume_l, vu);
    if (ui::number_field(app, "hatchery.volume",
                         {"Tank volume", fmtx::volume_unit_text(vu), 0, 50, tw::units::volume_from_litres(tw::ranges::kSystemVolumeL.lo, vu),
                          tw::units::volume_from_litres(tw::ranges::kSystemVolumeL.hi, vu)},
                         &v)) {
      f.volume_l = tw::units::volume_to_litres(v, vu);
    }
    ui::optional_number_field(app, "hatchery.residence",
                              {"Time open to the air before use (optional)", "min", 0, 5, tw::ranges::kResidenceTimeMin.lo,
                               tw::ranges::kResidenceTimeMin.hi},
                              &f.residence_time_min);
  }
  ui::card_end(app);
}

// ---------------------------------------------------------------- 2. Results
void water_table(AppState& app, const hat::Treatment& t, bool batch) {
  const auto u = fields::units(app);
  if (!ImGui::BeginTable("##through", 4, ImGuiTableFlags_RowBg | ImGuiTableFlags_SizingStretchProp)) return;
  ImGui::TableSetupColumn("");
  ImGui::TableSetupColumn(batch ? "Before" : "Intake");
  ImGui::TableSetupColumn("Mixed");
  ImGui::TableSetupColumn(batch ? "Later" : "Tanks");
  ImGui::TableHeadersRow();
  const cb::CarbonateState* s[3] = {&t.intake, &t.after_mixing, &t.at_tanks};
  auto row = [&](const char* label, auto value) {
    ImGui::TableNextRow();
    ImGui::TableNextColumn();
    ImGui::TextUnformatted(label);
    for (int i = 0; i < 3; ++i) {
      ImGui::TableNextColumn();
      ImGui::TextUnformatted(value(*s[i]).c_str());
    }
  };
  const std::string ph_label = std::string("pH ") + fmtx::ph_scale_label(app.ui.dosing.hatchery.ph_scale);
  row(ph_label.c_str(), [&](const cb::CarbonateState& c) { return fmtx::fixed(fmtx::ph_on_scale(c, app.ui.dosing.hatchery.ph_scale), 2); });
  row("\u03a9 arag.", [](const cb::CarbonateState& c) { return fmtx::fixed(c.omega_aragonite, 2); });
  const std::string alk_label = std::string("Alk. ") + fmtx::alkalinity_shown(u.alkalinity).unit;
  row(alk_label.c_str(), [&](const cb::CarbonateState& c) {
    return fmtx::alkalinity_text(tw::units::alkalinity_from_umol_kg(c.alkalinity_umol_kg, tw::units::AlkalinityUnit::DKH,
                                                                    jn::kNominalDensityKgPerL),
                                 u.alkalinity);
  });
  row("pCO\u2082 \u03bcatm", [](const cb::CarbonateState& c) { return fmtx::fixed(c.pco2_uatm, 0); });
  ImGui::EndTable();
  ui::record(app, "hatchery.water_table");
  if (!batch) {
    ui::dim_text(("Mixed: fully mixed, before any gas exchange. Tanks: after " +
                  fmtx::fixed(100 * t.degassing_fraction, 0) + "% of the way to equilibrium with outdoor air.").c_str());
  }
}

void list(const std::vector<std::string>& lines, ImU32 color) {
  for (const std::string& l : lines) ui::colored_wrapped(color, ("\u2022 " + l).c_str());
}

// Where calcium came from (the core's sentence). At low salinity the same sentence is one of
// the warnings listed below it, drawn there in the warning colour instead.
void calcium_line(const hat::Treatment& t) {
  if (std::find(t.warnings.begin(), t.warnings.end(), t.calcium_source) == t.warnings.end())
    ui::dim_text(("Saturation uses " + t.calcium_source + ".").c_str());
}

// Which boron the borate alkalinity used, measured or scaled from salinity (the core's sentence).
// The Mg/Ca correction, when applied, is among the warnings (the core's sentence too).
void boron_line(AppState& app) {
  ui::dim_text(("Borate uses " + app.ui.dosing.hatchery_cache.boron.note + ".").c_str());
  ui::record(app, "hatchery.boron_source");
}

// What dosing to a confidence gives: both one-sided bounds and the extra alkalinity.
void confidence_line(AppState& app, const hat::Treatment& t) {
  if (!t.confidence) return;
  const hat::ConfidenceReport& r = *t.confidence;
  const auto& f = app.ui.dosing.hatchery;
  const int dp_t = std::max(2, cb::decimals_for_uncertainty(r.target_u));
  const std::string target = f.target_kind == hat::TargetKind::OmegaAragonite ? "\u03a9 arag." : "the target";
  ui::colored_wrapped(theme::kAccent,
                      (fmtx::fixed(100 * r.probability, 0) + "% sure: " + target + " at least " +
                       fmtx::fixed(r.target_bound, dp_t) + " and pH at most " + fmtx::fixed(r.ph_bound, 2) +
                       " (ceiling " + fmtx::fixed(f.ph_ceiling, 2) + "), from the intake readings' precision. The margin "
                       "adds " + fmtx::fixed(r.added_alkalinity_umol_kg - r.centre_added_alkalinity_umol_kg, 0) +
                       " \u03bcmol/kg of alkalinity to the dose for the readings as they stand.")
                          .c_str());
  ui::record(app, "hatchery.confidence_result");
}

void draw_flow_result(AppState& app, const hat::FlowPlan& p, const HatcheryCache& c) {
  ui::card_begin(app);
  ui::heading(app, p.treatment.dose_needed ? "Dose" : "No dose needed");
  if (c.line) {
    ui::dim_text("Through the line: for the conditioned water, at the flow where the dose goes in.");
    ui::label_value(app, "Flow at the dose", fmtx::fixed(c.dosed_flow_l_per_min, 1) + " L/min");
    ui::record(app, "hatchery.dosed_flow");
    app.ui.widgets["hatchery.dosed_flow"].text = fmtx::fixed(c.dosed_flow_l_per_min, 3);
  }
  if (!p.treatment.dose_needed) ui::wrapped(c.line ? "The conditioned water already meets the target." : "The intake already meets the target.");
  for (const hat::StockLine& l : p.lines) {
    ImGui::PushFont(app.ui.fonts.bold);
    ImGui::TextUnformatted((std::string(hat::to_string(l.compound)) + " (" + hat::formula_of(l.compound) + ")").c_str());
    ImGui::PopFont();
    ui::label_value(app, "Pump", fmtx::fixed(l.pump_ml_per_min, 1) + " mL/min");
    ui::record(app, std::string("hatchery.pump.") + hat::formula_of(l.compound));
    ui::label_value(app, "Stock strength", fmtx::fixed(l.stock_g_per_l, 0) + " g/L (saturated \u2248 " +
                                               fmtx::fixed(l.saturation_g_per_l, 0) + ")");
    ui::label_value(app, "Salt", fmtx::fixed(l.grams_per_hour, 1) + " g/h, " + fmtx::fixed(l.grams_per_day / 1000, 2) + " kg/day");
    ui::label_value(app, "Stock used", fmtx::fixed(l.stock_litres_per_day, 1) + " L/day");
    if (l.injection_dilution_needed > 0) {
      ui::dim_text(("Mix the stock into at least " + fmtx::fixed(l.injection_dilution_needed, 0) +
                    " volumes of water at the injection point to keep the local \u03a9 under the mixing ceiling.").c_str());
    }
  }
  if (p.lines.size() > 1) {
    ui::dim_text(("Blend: " + fmtx::fixed(100 * p.treatment.carbonate_share, 0) + "% of the added alkalinity as carbonate.").c_str());
  }
  confidence_line(app, p.treatment);
  water_table(app, p.treatment, false);
  calcium_line(p.treatment);
  boron_line(app);
  list(p.warnings, theme::kWarning);
  ui::card_end(app);
}

void draw_batch_result(AppState& app, const hat::BatchPlan& p) {
  ui::card_begin(app);
  ui::heading(app, p.treatment.dose_needed ? "Add to the tank" : "No dose needed");
  for (const auto& a : p.additions) {
    const std::string g = a.grams >= 1000 ? fmtx::fixed(a.grams / 1000, 2) + " kg" : fmtx::fixed(a.grams, 1) + " g";
    ui::label_value(app, (std::string(hat::to_string(a.compound)) + " (" + hat::formula_of(a.compound) + ")").c_str(), g);
    ui::record(app, std::string("hatchery.grams.") + hat::formula_of(a.compound));
  }
  ui::dim_text("Dissolve in a bucket of tank water first and add it slowly where the water moves.");
  confidence_line(app, p.treatment);
  water_table(app, p.treatment, true);
  calcium_line(p.treatment);
  boron_line(app);
  list(p.warnings, theme::kWarning);
  ui::card_end(app);
}

// ---------------------------------------------------------------- 3. The line
// Conditioning between the intake and the dose (hatchery::Conditioning), as the core takes it.
void draw_line_form(AppState& app, HatcheryForm& f) {
  namespace rg = tw::ranges;
  const auto u = fields::units(app);
  fields::optional_temperature(app, "hatchery.line.tank_temperature", "Tank temperature after heating or cooling (empty: as mixed)",
                               &f.line_tank_temperature_c, u.temperature);
  ui::optional_number_field(app, "hatchery.line.mix_fraction",
                            {"Other water mixed in, share by volume (empty: none)", "", 2, 0.05, rg::kMixVolumeFraction.lo,
                             rg::kMixVolumeFraction.hi},
                            &f.mix_fraction);
  if (!f.mix_fraction) return;
  ui::number_field(app, "hatchery.line.mix_salinity", {"Its salinity (0: fresh water)", "psu", 1, 0.5, rg::kSalinity.lo, rg::kSalinity.hi},
                   &f.mix_salinity);
  fields::temperature(app, "hatchery.line.mix_temperature", "Its temperature", &f.mix_temperature_c, u.temperature);
  fields::alkalinity(app, "hatchery.line.mix_alkalinity", "Its alkalinity", &f.mix_alkalinity_dkh, u.alkalinity);
  ui::number_field(app, "hatchery.line.mix_dic",
                   {"Its dissolved inorganic carbon (DIC)", "\u03bcmol/kg", 0, 50, rg::kMixWaterCarbonUmolKg.lo,
                    rg::kMixWaterCarbonUmolKg.hi},
                   &f.mix_dic_umol_kg);
  ui::number_field(app, "hatchery.line.mix_calcium", {"Its calcium", rg::kCalciumMgL.unit, 0, 5, rg::kCalciumMgL.lo, rg::kCalciumMgL.hi},
                   &f.mix_calcium_mg_l);
}

// One row per point of the line, in the user's units and pH scale.
void line_table(AppState& app, const hat::HatcheryLine& line) {
  const auto u = fields::units(app);
  const cb::PhScale scale = app.ui.dosing.hatchery.ph_scale;
  static const char* const kPoints[] = {"Intake", "Conditioned", "Dosed", "At the tanks"};
  const fmtx::UnitShown shown = fmtx::alkalinity_shown(u.alkalinity);  // the unit is in the header
  if (!ImGui::BeginTable("##line", 6, ImGuiTableFlags_RowBg | ImGuiTableFlags_SizingStretchProp)) return;
  const std::string ph = std::string("pH ") + fmtx::ph_scale_label(scale);
  ImGui::TableSetupColumn("");
  ImGui::TableSetupColumn(fmtx::temperature_unit_text(u.temperature));
  ImGui::TableSetupColumn("S");
  ImGui::TableSetupColumn(ph.c_str());
  ImGui::TableSetupColumn("\u03a9 ar.");
  ImGui::TableSetupColumn(shown.unit);
  ImGui::TableHeadersRow();
  for (std::size_t i = 0; i < line.points.size() && i < 4; ++i) {
    const hat::LinePoint& p = line.points[i];
    // Per litre at the point's own density, as the intake's alkalinity was typed.
    const double dkh = tw::units::alkalinity_from_umol_kg(p.state.alkalinity_umol_kg, tw::units::AlkalinityUnit::DKH,
                                                          tw::seawater::density_kg_per_l(p.salinity, p.temperature_c));
    const std::string cells[] = {kPoints[i], fmtx::fixed(fmtx::temperature_shown(p.temperature_c, u.temperature), 1),
                                 fmtx::fixed(p.salinity, 1), fmtx::fixed(fmtx::ph_on_scale(p.state, scale), 2),
                                 fmtx::fixed(p.state.omega_aragonite, 2),
                                 fmtx::fixed(fmtx::alkalinity_from_dkh(dkh, u.alkalinity), shown.decimals)};
    ImGui::TableNextRow();
    for (const std::string& c : cells) {
      ImGui::TableNextColumn();
      ImGui::TextUnformatted(c.c_str());
    }
  }
  ImGui::EndTable();
  ui::record(app, "hatchery.line.table");
}

void draw_line_result(AppState& app, const HatcheryCache& c) {
  if (!c.line_error.empty()) {
    ui::colored_wrapped(theme::kError, c.line_error.c_str());
    ui::record(app, "hatchery.line.error");
  }
  if (!c.line) return;
  const hat::HatcheryLine& line = *c.line;
  line_table(app, line);
  const auto u = fields::units(app);
  const hat::LinePoint& dosed = line.points.size() > 2 ? line.points[2] : line.points.back();
  const double dkh = tw::units::alkalinity_from_umol_kg(line.treatment.dose.alkalinity_umol_kg(), tw::units::AlkalinityUnit::DKH,
                                                        tw::seawater::density_kg_per_l(dosed.salinity, dosed.temperature_c));
  ui::wrapped(("Dose planned on the conditioned water: +" + fmtx::alkalinity_text(dkh, u.alkalinity) +
               " of alkalinity. The pump rates and the pump-side table follow the line while it is shown: "
               "they are for this water, at the intake flow plus any water mixed in.")
                  .c_str());
  ui::record(app, "hatchery.line.dose");
  for (const std::string& n : line.notes) ui::dim_text(("\u2022 " + n).c_str());
}

void draw_line(AppState& app, HatcheryForm& f, const HatcheryCache& c) {
  ui::heading(app, "The line: heating, cooling, mixing");
  if (!f.line_shown) {
    ui::dim_text("The water at each point from the intake to the tanks, when it is heated, cooled or mixed with other "
                 "water before the dose.");
    if (ui::button(app, "hatchery.line.show", "Show the line")) f.line_shown = true;
    return;
  }
  draw_line_form(app, f);
  draw_line_result(app, c);
  if (ui::button(app, "hatchery.line.hide", "Hide the line", 0, ui::Tone::Quiet)) f.line_shown = false;
}

// ---------------------------------------------------------------- 4. Pump-side table
void draw_pump_table(AppState& app, HatcheryForm& f, const HatcheryCache& c) {
  ui::heading(app, "Pump-side table");
  ui::dim_text("Pump rates for a range of intake pH at this alkalinity, flow and target, to post by the pump.");
  if (!f.show_table) {
    if (ui::button(app, "hatchery.table.show", "Show the table")) f.show_table = true;
    return;
  }
  const float half = (ImGui::GetContentRegionAvail().x - ImGui::GetStyle().ItemSpacing.x) / 2;
  ui::number_field(app, "hatchery.table.from", {"From intake pH", fmtx::ph_scale_label(f.ph_scale), 2, 0.05, tw::ranges::kPh.lo, tw::ranges::kPh.hi},
                   &f.table_from_ph);
  ui::number_field(app, "hatchery.table.to", {"To intake pH", fmtx::ph_scale_label(f.ph_scale), 2, 0.05, tw::ranges::kPh.lo, tw::ranges::kPh.hi},
                   &f.table_to_ph);
  ui::number_field(app, "hatchery.table.step", {"Step", "pH", 2, 0.01, tw::ranges::kPumpTableStepPh.lo, tw::ranges::kPumpTableStepPh.hi}, &f.table_step_ph);
  if (!c.table_error.empty()) ui::colored_wrapped(theme::kError, c.table_error.c_str());
  if (c.table) {
    const hat::PumpTable& t = *c.table;
    const bool conf = t.settings.confidence.has_value();
    const int cols = 3 + static_cast<int>(t.columns.size()) + (conf ? 2 : 0);
    if (ImGui::BeginTable("##pump", cols, ImGuiTableFlags_RowBg | ImGuiTableFlags_SizingStretchProp)) {
      ImGui::TableSetupColumn("pH in");
      for (hat::Compound k : t.columns) ImGui::TableSetupColumn((std::string(hat::formula_of(k)) + " mL/min").c_str());
      ImGui::TableSetupColumn("pH out");
      ImGui::TableSetupColumn("\u03a9 out");
      if (conf) {
        ImGui::TableSetupColumn("target \u2265");
        ImGui::TableSetupColumn("pH \u2264");
      }
      ImGui::TableHeadersRow();
      for (const hat::TableRow& r : t.rows) {
        ImGui::TableNextRow();
        ImGui::TableNextColumn();
        ImGui::TextUnformatted(fmtx::fixed(r.reading, 2).c_str());
        if (!r.ok) {
          ImGui::TableNextColumn();
          ImGui::PushStyleColor(ImGuiCol_Text, theme::kTextDim);
          ImGui::TextWrapped("%s", r.note.c_str());
          ImGui::PopStyleColor();
          continue;
        }
        for (double ml : r.pump_ml_per_min) {
          ImGui::TableNextColumn();
          ImGui::TextUnformatted(fmtx::fixed(ml, 1).c_str());
        }
        const bool tanks = f.target_point == hat::TargetPoint::AtTanks;
        ImGui::TableNextColumn();
        ImGui::TextUnformatted(fmtx::fixed(tanks ? r.ph_total_at_tanks : r.ph_total_after_mixing, 2).c_str());
        ImGui::TableNextColumn();
        ImGui::TextUnformatted(
            fmtx::fixed(tanks ? r.omega_aragonite_at_tanks : r.omega_aragonite_after_mixing, 2).c_str());
        if (conf && r.confidence) {
          ImGui::TableNextColumn();
          ImGui::TextUnformatted(fmtx::fixed(r.confidence->target_bound, 2).c_str());
          ImGui::TableNextColumn();
          ImGui::TextUnformatted(fmtx::fixed(r.confidence->ph_bound, 2).c_str());
        }
      }
      ImGui::EndTable();
    }
    ui::record(app, "hatchery.table");
    ui::dim_text(conf ? "pH out is on the total scale; the stock strengths are those of the dose above. Target \u2265 and "
                        "pH \u2264: what each row reaches and stays under with the chosen probability."
                      : "pH out is on the total scale; the stock strengths are those of the dose above.");
    if (ui::button(app, "hatchery.table.export_csv", "Download CSV", half)) export_pump_table(app, true);
    ImGui::SameLine();
    if (ui::button(app, "hatchery.table.export_text", "Download text", half)) export_pump_table(app, false);
  }
  if (ui::button(app, "hatchery.table.hide", "Hide the table", 0, ui::Tone::Quiet)) f.show_table = false;
}

}  // namespace

// ---------------------------------------------------------------- 5. The screen
void draw_hatchery(AppState& app) {
  HatcheryForm& f = app.ui.dosing.hatchery;
  ui::panes_begin(app);  // wide: the water and the target beside the dose and the line
  ui::heading(app, "Hatchery buffering");
  ui::colored_wrapped(theme::kWarning,
                      "Sodium hydroxide and strong carbonate stocks are caustic: gloves and eye protection, add to "
                      "water, never water to the solid. Food-production hatcheries: follow local regulations and "
                      "licensed practice; these are model estimates to confirm by measurement.");
  int mode = static_cast<int>(f.mode);
  const char* const modes[] = {"Flow-through", "Batch tank"};
  if (ui::choice(app, "hatchery.mode", "", &mode, modes, 2)) f.mode = static_cast<HatcheryMode>(mode);
  draw_water_form(app, f);
  draw_target_form(app, f);
  ui::panes_next(app);
  refresh_hatchery(app);
  const HatcheryCache& c = app.ui.dosing.hatchery_cache;
  if (!c.error.empty()) {
    ui::card_begin(app);
    ui::colored_wrapped(theme::kError, c.error.c_str());
    ui::record(app, "hatchery.error");
    ui::card_end(app);
  }
  const std::vector<std::string>* cautions = nullptr;
  if (c.flow) {
    draw_flow_result(app, *c.flow, c);
    cautions = &c.flow->cautions;
  }
  if (c.batch) {
    draw_batch_result(app, *c.batch);
    cautions = &c.batch->cautions;
  }
  if (f.mode == HatcheryMode::FlowThrough) {
    draw_line(app, f, c);
    draw_pump_table(app, f, c);
  }
  if (cautions && !cautions->empty()) {
    ui::heading(app, "Cautions");
    list(*cautions, theme::kText);
    ui::record(app, "hatchery.cautions");
  }
  ui::panes_end(app);
}

}  // namespace twapp
