// The Hatchery screen's results (recomputed when the form differs from the cached key) and its
// pump-side table export.
#include "actions_dosing.hpp"

#include "actions.hpp"
#include "format.hpp"
#include "platform.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/common/units.hpp"
#include "tidewright/seawater/seawater.hpp"

namespace twapp {

namespace hat = tw::hatchery;
namespace cb = tw::carbonate;

// ---------------------------------------------------------------- Hatchery
namespace {

using tw::units::ConcentrationUnit, tw::units::Ion;

// The intake (or tank) water as the core takes it, per kg at the water's own density.
hat::Water water_of(const HatcheryForm& f) {
  const double density = tw::seawater::density_kg_per_l(f.salinity, f.temperature_c);
  hat::Water water;
  water.salinity = f.salinity;
  water.temperature_c = f.temperature_c;
  water.k1k2 = f.k1k2;
  if (f.calcium_mg_l) water.calcium_umol_kg = tw::units::ion_to_umol_kg(*f.calcium_mg_l, ConcentrationUnit::MgPerL, Ion::Calcium, density);
  if (f.total_boron_mg_l)
    water.total_boron_umol_kg = tw::units::ion_to_umol_kg(*f.total_boron_mg_l, ConcentrationUnit::MgPerL, Ion::Boron, density);
  if (f.magnesium_mg_l)
    water.magnesium_umol_kg = tw::units::ion_to_umol_kg(*f.magnesium_mg_l, ConcentrationUnit::MgPerL, Ion::Magnesium, density);
  water.mg_ca_correction = f.mg_ca_correction;
  water.measurements = {{cb::Quantity::Alkalinity,
                         tw::units::alkalinity_to_umol_kg(f.alkalinity_dkh, tw::units::AlkalinityUnit::DKH, density)},
                        {cb::Quantity::PH, f.ph},
                        f.ph_scale};
  return water;
}

// The core refuses under its own field names; the screen names its own fields. The Mg/Ca
// correction also says which measured fields it needs, with their accepted ranges (ranges.hpp).
std::string refusal_text(const tw::Error& e, const HatcheryForm& f) {
  // The line refuses a mix that leaves the water too fresh under its share's field name.
  if (e.field == "mix_fraction") return "Other water mixed in, share by volume: " + e.message;
  if (e.field != "mg_ca_correction") return e.message;
  std::string m = e.message;
  const std::string code = "mg_ca_correction";
  if (m.rfind(code, 0) == 0) m.replace(0, code.size(), "\"Correct for Mg and Ca\"");
  std::string missing;
  auto need = [&](const std::optional<double>& v, const char* name, const tw::ranges::Range& r) {
    if (v) return;
    missing += std::string(missing.empty() ? "" : "; ") + name + ", accepted " + fmtx::fixed(r.lo, 0) + " to " +
               fmtx::fixed(r.hi, 0) + " " + r.unit;
  };
  need(f.calcium_mg_l, "Calcium (measured)", tw::ranges::kCalciumMgL);
  need(f.magnesium_mg_l, "Magnesium (measured)", tw::ranges::kMagnesiumMgL);
  if (!missing.empty()) m += ". Fill in: " + missing;
  return m;
}

// The conditioning step of the line, as hatchery::Conditioning takes it; the other water's
// per-litre values are turned per kg at its own density.
hat::Conditioning conditioning_of(const HatcheryForm& f) {
  hat::Conditioning c;
  c.tank_temperature_c = f.line_tank_temperature_c;
  if (f.mix_fraction) {
    const double density = tw::seawater::density_kg_per_l(f.mix_salinity, f.mix_temperature_c);
    hat::OtherWater o;
    o.volume_fraction = *f.mix_fraction;
    o.salinity = f.mix_salinity;
    o.temperature_c = f.mix_temperature_c;
    o.alkalinity_umol_kg = tw::units::alkalinity_to_umol_kg(f.mix_alkalinity_dkh, tw::units::AlkalinityUnit::DKH, density);
    o.dic_umol_kg = f.mix_dic_umol_kg;
    o.calcium_umol_kg = tw::units::ion_to_umol_kg(f.mix_calcium_mg_l, ConcentrationUnit::MgPerL, Ion::Calcium, density);
    c.mix = o;
  }
  return c;
}

hat::Settings settings_of(const HatcheryForm& f) {
  const double density = tw::seawater::density_kg_per_l(f.salinity, f.temperature_c);
  hat::Settings s;
  s.target.kind = f.target_kind;
  s.target.ph_scale = f.ph_scale;
  switch (f.target_kind) {
    case hat::TargetKind::OmegaAragonite: s.target.value = f.target_omega; break;
    case hat::TargetKind::PH: s.target.value = f.target_ph; break;
    case hat::TargetKind::AlkalinityRise:
      s.target.value = tw::units::alkalinity_to_umol_kg(f.target_rise_dkh, tw::units::AlkalinityUnit::DKH, density);
      break;
  }
  s.target_point = f.target_point;
  s.buffer = f.buffer;
  s.limits.ph_ceiling = f.ph_ceiling;
  s.limits.ph_ceiling_scale = f.ph_scale;
  s.gas.residence_time_min = f.residence_time_min;
  s.stock.temperature_c = f.stock_temperature_c;
  s.stock.strength_g_per_l = f.stock_g_per_l;  // absent: the core's default strength
  if (f.confidence_index > 0) {
    hat::Confidence conf;
    conf.probability = kConfidenceChoices[f.confidence_index];
    // The kit defaults of the core's table for every reading (salinity, temperature, calcium,
    // a salt mix's boron and magnesium), as `buffer --confidence` takes them, with the form's
    // own alkalinity and pH precisions in place of theirs.
    const hat::Water water = water_of(f);
    conf.intake = cb::default_input_uncertainties(hat::conditions_of(water), water.measurements);
    conf.intake.first = tw::units::alkalinity_to_umol_kg(f.alkalinity_precision_dkh, tw::units::AlkalinityUnit::DKH, density);
    conf.intake.second = f.ph_precision;
    s.confidence = conf;
  }
  return s;
}

// Flow-through: the dose and pump rates on the intake as read, or, with the line shown, on the
// conditioned water at the flow through the dose point (hatchery::plan_line_flow), and the
// pump-side table likewise; a refused line gives no pump rates (they would be the intake's).
void compute_flow(const HatcheryForm& f, const hat::Water& water, const hat::Settings& s, HatcheryCache& out) {
  if (f.line_shown) {
    auto lf = hat::plan_line_flow(water, conditioning_of(f), f.flow_l_per_min, s);
    if (lf) {
      out.dosed_flow_l_per_min = lf->dosed_flow_l_per_min;
      out.flow = std::move(lf->flow);
      out.line = std::move(lf->line);
    } else {
      out.line_error = refusal_text(lf.error(), f);
      out.error = "No pump rates while the line is refused (see the line): " + out.line_error;
    }
  } else {
    auto plan = hat::plan_flow(water, f.flow_l_per_min, s);
    if (plan) {
      out.flow = std::move(plan).value();
    } else {
      out.error = refusal_text(plan.error(), f);
    }
  }
  if (f.show_table) {
    hat::Water varied = water;
    varied.measurements = {{cb::Quantity::PH, f.ph}, water.measurements.first, f.ph_scale};
    const hat::TableRange range{cb::Quantity::PH, f.table_from_ph, f.table_to_ph, f.table_step_ph};
    auto table = f.line_shown ? hat::build_line_pump_table(varied, conditioning_of(f), f.flow_l_per_min, range, s)
                              : hat::build_pump_table(varied, f.flow_l_per_min, range, s);
    if (table) {
      out.table = std::move(table).value();
    } else {
      out.table_error = refusal_text(table.error(), f);
    }
  }
}

}  // namespace

void refresh_hatchery(AppState& app) {
  const HatcheryForm& f = app.ui.dosing.hatchery;
  HatcheryCache& c = app.ui.dosing.hatchery_cache;
  if (c.valid && c.key == f) return;
  HatcheryCache out;
  out.valid = true;
  out.key = f;
  out.computed_count = c.computed_count + 1;
  const hat::Water water = water_of(f);
  {
    cb::Conditions here;
    here.salinity = f.salinity;
    here.temperature_c = f.temperature_c;
    here.k1k2 = f.k1k2;
    out.k1k2_suggestion = cb::suggest_k1k2(here);
  }
  out.boron = cb::boron_source(hat::conditions_of(water));
  const hat::Settings s = settings_of(f);
  if (f.mode == HatcheryMode::FlowThrough) {
    compute_flow(f, water, s, out);
  } else {
    auto plan = hat::plan_batch(water, f.volume_l, s);
    if (plan) {
      out.batch = std::move(plan).value();
    } else {
      out.error = refusal_text(plan.error(), f);
    }
  }
  c = std::move(out);
}

bool export_pump_table(AppState& app, bool csv) {
  const HatcheryCache& c = app.ui.dosing.hatchery_cache;
  if (!c.table) {
    notify(app, "No pump-side table to export: " + (c.table_error.empty() ? std::string("show it first") : c.table_error),
           true);
    return false;
  }
  std::string where;
  const std::string text = csv ? hat::pump_table_csv(*c.table) : hat::pump_table_text(*c.table);
  if (!platform::export_file(csv ? "tidewright-pump-table.csv" : "tidewright-pump-table.txt",
                             csv ? "text/csv" : "text/plain", text, &where)) {
    notify(app, "Export failed: " + where, true);
    return false;
  }
  notify(app, "Pump-side table saved to " + where);
  return true;
}

// Plan export: format 0 CSV (RFC 4180), 1 iCalendar (RFC 5545), 2 plain text, 3 JSON (the
// command line's `plan --json`, the same core writer).

}  // namespace twapp
