// The Hatchery screen's results (recomputed when the form differs from the cached key) and its
// pump-side table export.
#include "actions_dosing.hpp"

#include "actions.hpp"
#include "platform.hpp"
#include "tidewright/common/units.hpp"
#include "tidewright/seawater/seawater.hpp"

namespace twapp {

namespace hat = tw::hatchery;
namespace cb = tw::carbonate;

// ---------------------------------------------------------------- Hatchery
void refresh_hatchery(AppState& app) {
  const HatcheryForm& f = app.ui.dosing.hatchery;
  HatcheryCache& c = app.ui.dosing.hatchery_cache;
  if (c.valid && c.key == f) return;
  HatcheryCache out;
  out.valid = true;
  out.key = f;
  out.computed_count = c.computed_count + 1;
  const double density = tw::seawater::density_kg_per_l(f.salinity, f.temperature_c);
  hat::Water water;
  water.salinity = f.salinity;
  water.temperature_c = f.temperature_c;
  water.k1k2 = f.k1k2;
  {
    cb::Conditions here;
    here.salinity = f.salinity;
    here.temperature_c = f.temperature_c;
    here.k1k2 = f.k1k2;
    out.k1k2_suggestion = cb::suggest_k1k2(here);
  }
  if (f.calcium_mg_l) {
    water.calcium_umol_kg =
        tw::units::ion_to_umol_kg(*f.calcium_mg_l, tw::units::ConcentrationUnit::MgPerL, tw::units::Ion::Calcium, density);
  }
  water.measurements = {{cb::Quantity::Alkalinity,
                         tw::units::alkalinity_to_umol_kg(f.alkalinity_dkh, tw::units::AlkalinityUnit::DKH, density)},
                        {cb::Quantity::PH, f.ph},
                        f.ph_scale};
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
    conf.intake.first = tw::units::alkalinity_to_umol_kg(f.alkalinity_precision_dkh, tw::units::AlkalinityUnit::DKH, density);
    conf.intake.second = f.ph_precision;
    if (f.ph_scale != cb::PhScale::Total) conf.intake.ph_scale_conversion = cb::kPhNbsToTotalUncertainty;
    s.confidence = conf;
  }
  if (f.mode == HatcheryMode::FlowThrough) {
    auto plan = hat::plan_flow(water, f.flow_l_per_min, s);
    if (plan) {
      out.flow = std::move(plan).value();
    } else {
      out.error = plan.error().message;
    }
    if (f.show_table) {
      hat::Water varied = water;
      varied.measurements = {{cb::Quantity::PH, f.ph}, water.measurements.first, f.ph_scale};
      const hat::TableRange range{cb::Quantity::PH, f.table_from_ph, f.table_to_ph, f.table_step_ph};
      auto table = hat::build_pump_table(varied, f.flow_l_per_min, range, s);
      if (table) {
        out.table = std::move(table).value();
      } else {
        out.table_error = table.error().message;
      }
    }
  } else {
    auto plan = hat::plan_batch(water, f.volume_l, s);
    if (plan) {
      out.batch = std::move(plan).value();
    } else {
      out.error = plan.error().message;
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
