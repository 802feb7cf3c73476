// Pump-side table for hatchery staff: across a range of one intake reading (the other held
// fixed), the metering-pump setting that reaches the target, as CSV and as printable text.
#include <cmath>

#include <fmt/format.h>

#include "hatchery_internal.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/common/csv.hpp"
#include "tidewright/hatchery/hatchery.hpp"

namespace tw::hatchery {

namespace cb = tw::carbonate;

namespace detail {
std::vector<Compound> compounds_of(Buffer b);  // hatchery_flow.cpp
}  // namespace detail

namespace {

constexpr int kMaxRows = 400;

std::string reading_label(const PumpTable& t) {
  switch (t.range.varied) {
    case cb::Quantity::PH: return fmt::format("reading_ph_{}", cb::to_string(t.fixed.measurements.ph_scale));
    case cb::Quantity::PCO2: return "reading_pco2_uatm";
    case cb::Quantity::FCO2: return "reading_fco2_uatm";
    case cb::Quantity::Alkalinity: return "reading_alkalinity_umol_kg";
    case cb::Quantity::DIC: return "reading_dic_umol_kg";
    case cb::Quantity::Carbonate: return "reading_carbonate_umol_kg";
  }
  return "reading";
}

std::string fixed_label(const cb::Measurement& m, cb::PhScale scale) {
  switch (m.quantity) {
    case cb::Quantity::PH: return fmt::format("pH {:.3f} ({} scale)", m.value, cb::to_string(scale));
    case cb::Quantity::PCO2: return fmt::format("pCO2 {:.0f} uatm", m.value);
    case cb::Quantity::FCO2: return fmt::format("fCO2 {:.0f} uatm", m.value);
    case cb::Quantity::Alkalinity: return fmt::format("alkalinity {:.0f} umol/kg", m.value);
    case cb::Quantity::DIC: return fmt::format("DIC {:.0f} umol/kg", m.value);
    case cb::Quantity::Carbonate: return fmt::format("carbonate ion {:.0f} umol/kg", m.value);
  }
  return "?";
}

int decimals_of(cb::Quantity q) { return q == cb::Quantity::PH ? 2 : 0; }

}  // namespace

namespace detail {
Result<PumpTable> build_table_with(const Water& intake, double flow_l_per_min, const TableRange& range,
                                   const Settings& settings, const RowPlan& row_plan) {
  if (auto r = ranges::check("flow", flow_l_per_min, ranges::kIntakeFlowLPerMin); !r) return r.error();
  if (auto v = detail::validate_settings(settings); !v) return v.error();
  if (!std::isfinite(range.step) || range.step <= 0.0) {
    return Error{"step", fmt::format("step {:g} must be above 0", range.step)};
  }
  if (!std::isfinite(range.from) || !std::isfinite(range.to) || range.to < range.from) {
    return Error{"to", fmt::format("the range from {:g} to {:g} must run upward (to >= from)", range.from, range.to)};
  }
  const double n_real = std::floor((range.to - range.from) / range.step + 1e-9) + 1.0;
  if (n_real > kMaxRows) {
    return Error{"step", fmt::format("the range gives {:.0f} rows; at most {} are accepted (use a larger step)",
                                     n_real, kMaxRows)};
  }
  if (intake.measurements.first.quantity != range.varied) {
    return Error{"vary", "the varied reading must be the first intake measurement"};
  }
  PumpTable t;
  t.flow_l_per_min = flow_l_per_min;
  t.fixed = intake;
  t.range = range;
  t.settings = settings;
  t.columns = detail::compounds_of(settings.buffer);
  for (Compound c : t.columns) {
    auto g = stock_strength_g_per_l(c, settings.stock);
    if (!g) return g.error();
    t.stock_g_per_l.push_back(*g);
  }
  t.cautions = cautions_for(t.columns);
  t.calcium_source = cb::calcium_source(conditions_of(intake)).note;
  const int n = static_cast<int>(n_real);
  for (int i = 0; i < n; ++i) {
    TableRow row;
    row.reading = range.from + i * range.step;
    row.pump_ml_per_min.assign(t.columns.size(), 0.0);
    row.grams_per_hour.assign(t.columns.size(), 0.0);
    Water w = intake;
    w.measurements.first.value = row.reading;
    auto plan = row_plan(w);
    if (!plan) {
      row.note = plan.error().message;
      t.rows.push_back(row);
      continue;
    }
    row.ok = true;
    const Treatment& tr = plan->treatment;
    row.intake_omega_aragonite = tr.intake.omega_aragonite;
    row.intake_ph_total = tr.intake.ph_total;
    row.ph_total_after_mixing = tr.after_mixing.ph_total;
    row.omega_aragonite_after_mixing = tr.after_mixing.omega_aragonite;
    row.ph_total_at_tanks = tr.at_tanks.ph_total;
    row.omega_aragonite_at_tanks = tr.at_tanks.omega_aragonite;
    row.confidence = tr.confidence;
    if (!tr.dose_needed) row.note = "no dose needed";
    for (const StockLine& sl : plan->lines) {
      for (size_t k = 0; k < t.columns.size(); ++k) {
        if (t.columns[k] == sl.compound) {
          row.pump_ml_per_min[k] = sl.pump_ml_per_min;
          row.grams_per_hour[k] = sl.grams_per_hour;
        }
      }
    }
    t.rows.push_back(row);
  }
  return t;
}
}  // namespace detail

Result<PumpTable> build_pump_table(const Water& intake, double flow_l_per_min,
                                   const TableRange& range, const Settings& settings) {
  return detail::build_table_with(intake, flow_l_per_min, range, settings,
                                  [&](const Water& w) { return plan_flow(w, flow_l_per_min, settings); });
}

std::string pump_table_csv(const PumpTable& t) {
  std::vector<std::string> head{reading_label(t), "intake_ph_total", "intake_omega_aragonite"};
  for (Compound c : t.columns) {
    head.push_back(fmt::format("{}_pump_ml_per_min", formula_of(c)));
    head.push_back(fmt::format("{}_g_per_h", formula_of(c)));
  }
  for (const char* h : {"ph_total_after_mixing", "omega_aragonite_after_mixing", "ph_total_at_tanks",
                        "omega_aragonite_at_tanks"}) {
    head.push_back(h);
  }
  // Dosing to a confidence: the target's one-sided bound and the highest pH's, at that probability.
  const bool conf = t.settings.confidence.has_value();
  if (conf) {
    head.push_back(fmt::format("target_at_least_{:g}pct", 100 * t.settings.confidence->probability));
    head.push_back(fmt::format("ph_max_at_most_{:g}pct", 100 * t.settings.confidence->probability));
  }
  head.push_back("note");
  std::string out = csv::format_row(head);
  const int dp = decimals_of(t.range.varied) + 1;
  for (const TableRow& r : t.rows) {
    std::vector<std::string> cells{fmt::format("{:.{}f}", r.reading, dp)};
    auto num = [&](double v, int d) { return r.ok ? fmt::format("{:.{}f}", v, d) : std::string(); };
    cells.push_back(num(r.intake_ph_total, 3));
    cells.push_back(num(r.intake_omega_aragonite, 3));
    for (size_t k = 0; k < t.columns.size(); ++k) {
      cells.push_back(num(r.pump_ml_per_min[k], 3));
      cells.push_back(num(r.grams_per_hour[k], 2));
    }
    cells.push_back(num(r.ph_total_after_mixing, 3));
    cells.push_back(num(r.omega_aragonite_after_mixing, 3));
    cells.push_back(num(r.ph_total_at_tanks, 3));
    cells.push_back(num(r.omega_aragonite_at_tanks, 3));
    if (conf) {
      cells.push_back(r.ok && r.confidence ? fmt::format("{:.3f}", r.confidence->target_bound) : std::string());
      cells.push_back(r.ok && r.confidence ? fmt::format("{:.3f}", r.confidence->ph_bound) : std::string());
    }
    cells.push_back(r.note);
    out += csv::format_row(cells, true);
  }
  return out;
}

std::string pump_table_text(const PumpTable& t) {
  std::string out = "Pump settings for buffering the intake\n";
  out += fmt::format("  flow {:.1f} L/min ({:.2f} m3/h); salinity {:g}, {:g} C; fixed {}\n", t.flow_l_per_min,
                     flow_from_l_per_min(t.flow_l_per_min, FlowUnit::CubicMetrePerHour), t.fixed.salinity,
                     t.fixed.temperature_c, fixed_label(t.fixed.measurements.second, t.fixed.measurements.ph_scale));
  out += fmt::format("  target {} {}; pH ceiling {:.2f} ({} scale); additive {}\n",
                     detail::describe_target(t.settings.target),
                     t.settings.target_point == TargetPoint::AtTanks ? "at the tanks" : "after mixing",
                     t.settings.limits.ph_ceiling, cb::to_string(t.settings.limits.ph_ceiling_scale),
                     to_string(t.settings.buffer));
  if (!t.line_note.empty()) out += "  " + t.line_note + "\n";
  out += fmt::format("  K1 K2 {}; {}\n", cb::to_string(t.fixed.k1k2), t.calcium_source);
  for (size_t k = 0; k < t.columns.size(); ++k) {
    out += fmt::format("  stock {}: {:.1f} g/L (anhydrous, made up to volume, kept at {:g} C)\n",
                       formula_of(t.columns[k]), t.stock_g_per_l[k], t.settings.stock.temperature_c);
  }
  out += "\n";
  const std::string rl = t.range.varied == cb::Quantity::PH
                             ? fmt::format("pH_{}", cb::to_string(t.fixed.measurements.ph_scale))
                             : std::string(cb::to_string(t.range.varied));
  std::string head = fmt::format("{:>9} {:>7}", rl, "Omega");
  for (Compound c : t.columns) head += fmt::format(" {:>14}", fmt::format("{} mL/min", formula_of(c)));
  const bool conf = t.settings.confidence.has_value();
  head += fmt::format(" {:>8} {:>7}", "pH_T out", "Om out");
  if (conf) head += fmt::format(" {:>10} {:>10}", "target >=", "pH max <=");
  head += "  note";
  out += head + "\n";
  out += std::string(head.size() + 10, '-') + "\n";
  const int dp = decimals_of(t.range.varied);
  for (const TableRow& r : t.rows) {
    std::string line = fmt::format("{:>9.{}f}", r.reading, dp);
    if (!r.ok) {
      out += line + "  refused: " + r.note + "\n";
      continue;
    }
    line += fmt::format(" {:>7.2f}", r.intake_omega_aragonite);
    for (size_t k = 0; k < t.columns.size(); ++k) line += fmt::format(" {:>14.2f}", r.pump_ml_per_min[k]);
    const bool tanks = t.settings.target_point == TargetPoint::AtTanks || t.rows.empty() ||
                       std::fabs(r.ph_total_at_tanks - r.ph_total_after_mixing) > 1e-9;
    line += fmt::format(" {:>8.3f} {:>7.2f}", tanks ? r.ph_total_at_tanks : r.ph_total_after_mixing,
                        tanks ? r.omega_aragonite_at_tanks : r.omega_aragonite_after_mixing);
    if (conf && r.confidence) line += fmt::format(" {:>10.3f} {:>10.3f}", r.confidence->target_bound, r.confidence->ph_bound);
    if (!r.note.empty()) line += "  " + r.note;
    out += line + "\n";
  }
  out += "\n\"out\" is the water reaching the tanks (after mixing and any gas exchange).\n";
  if (conf) {
    out += fmt::format("Dosed for {:g} % confidence from the intake readings' precision: \"target >=\" is what the "
                       "target reaches with that probability, \"pH max <=\" the highest pH with that probability "
                       "(ceiling {:.2f}).\n",
                       100 * t.settings.confidence->probability, t.settings.limits.ph_ceiling);
  }
  out += "Cautions:\n";
  for (const std::string& c : t.cautions) out += "  - " + c + "\n";
  return out;
}

}  // namespace tw::hatchery
