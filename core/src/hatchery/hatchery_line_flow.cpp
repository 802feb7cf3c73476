// Pump rates through the hatchery line: the line's dose (plan_line) as metering-pump settings
// at the flow of the dose point, and the pump-side table with each row conditioned first.
#include <fmt/format.h>

#include "hatchery_internal.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/hatchery/hatchery_line.hpp"

namespace tw::hatchery {

namespace {

// Above this share the other water is all but the whole flow: the intake flow cannot set it.
constexpr double kMaxMixFractionForFlow = 0.99;

Result<double> dosed_flow(const Conditioning& c, double intake_flow_l_per_min) {
  if (auto r = ranges::check("flow", intake_flow_l_per_min, ranges::kIntakeFlowLPerMin); !r) return r.error();
  if (!c.mix) return intake_flow_l_per_min;
  const double f = c.mix->volume_fraction;
  if (!(f < kMaxMixFractionForFlow)) {
    return Error{"mix_fraction", fmt::format("with {:g} of the flow from the other water the intake's flow does not "
                                             "set the flow at the dose; accepted 0 to {:g}",
                                             f, kMaxMixFractionForFlow)};
  }
  return intake_flow_l_per_min / (1.0 - f);
}

std::string line_note(const Conditioning& c, double intake_flow, double dosed) {
  std::string out = "through the line:";
  if (c.mix) out += fmt::format(" {:.1f} % by volume of other water (salinity {:g}) mixed in;", 100 * c.mix->volume_fraction, c.mix->salinity);
  if (c.tank_temperature_c) out += fmt::format(" brought to {:g} C;", *c.tank_temperature_c);
  out += fmt::format(" intake {:.1f} L/min, dosed flow {:.1f} L/min", intake_flow, dosed);
  return out;
}

}  // namespace

Result<LineFlowPlan> plan_line_flow(const Water& intake, const Conditioning& conditioning,
                                    double intake_flow_l_per_min, const Settings& settings) {
  auto flow = dosed_flow(conditioning, intake_flow_l_per_min);
  if (!flow) return flow.error();
  auto line = plan_line(intake, conditioning, settings);
  if (!line) return line.error();
  auto plan = plan_flow(line->conditioned, *flow, settings);
  if (!plan) return plan.error();
  LineFlowPlan out;
  out.dosed_flow_l_per_min = *flow;
  out.flow = std::move(plan).value();
  // The line's own account of calcium (mixed from both waters) replaces the conditioned water's
  // "as measured", so both parts of the result say the same.
  out.flow.treatment.calcium_source = line->treatment.calcium_source;
  out.line = std::move(line).value();
  return out;
}

Result<PumpTable> build_line_pump_table(const Water& intake, const Conditioning& conditioning,
                                        double intake_flow_l_per_min, const TableRange& range,
                                        const Settings& settings) {
  auto flow = dosed_flow(conditioning, intake_flow_l_per_min);
  if (!flow) return flow.error();
  auto table = detail::build_table_with(intake, *flow, range, settings, [&](const Water& w) -> Result<FlowPlan> {
    auto lf = plan_line_flow(w, conditioning, intake_flow_l_per_min, settings);
    if (!lf) return lf.error();
    return std::move(lf->flow);
  });
  if (!table) return table.error();
  table->line_note = line_note(conditioning, intake_flow_l_per_min, *flow);
  return table;
}

}  // namespace tw::hatchery
