// The carbonate species chart: fraction of DIC as CO2*, HCO3- and CO3-- from pH 6 to 10 on the
// input's pH scale (the core solved each point, water.cpp), this water marked, axes with
// units. Touch or click the plot to read the fractions at a pH; the read-out stays below.
#include <algorithm>
#include <cmath>
#include <string>

#include "format.hpp"
#include "imgui.h"
#include "screens.hpp"
#include "theme.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

float interpolate(const std::vector<float>& xs, const std::vector<float>& ys, float x) {
  if (xs.empty()) return 0;
  if (x <= xs.front()) return ys.front();
  if (x >= xs.back()) return ys.back();
  const auto it = std::lower_bound(xs.begin(), xs.end(), x);
  const size_t i = static_cast<size_t>(it - xs.begin());
  const float t = (x - xs[i - 1]) / (xs[i] - xs[i - 1]);
  return ys[i - 1] + t * (ys[i] - ys[i - 1]);
}

std::string percent(float f) { return fmtx::fixed(100.0 * f, f < 0.1f ? 1 : 0) + "%"; }

}  // namespace

void draw_species_chart(AppState& app) {
  const WaterResult& r = app.water_result;
  if (!r.ok || r.curve.ph.size() < 2) {
    ui::dim_text("No chart without a result.");
    return;
  }
  const SpeciesCurve& c = r.curve;
  const float e = ui::em(app);
  const float w = ImGui::GetContentRegionAvail().x;
  const float h = 14 * e;
  const ImVec2 origin = ImGui::GetCursorScreenPos();
  // Plot area inside the axes.
  const ImVec2 a(origin.x + 3.0f * e, origin.y + 1.9f * e);
  const ImVec2 b(origin.x + w - 0.6f * e, origin.y + h - 2.6f * e);
  const float x_lo = 6.0f, x_hi = 10.0f;
  auto sx = [&](float ph) { return a.x + (ph - x_lo) / (x_hi - x_lo) * (b.x - a.x); };
  auto sy = [&](float f) { return b.y - f * (b.y - a.y); };

  ImGui::InvisibleButton("##species_chart", ImVec2(w, h));
  ui::record(app, "water.chart");
  const bool active = ImGui::IsItemActive();
  if (active) app.ui.drag_owned = true;  // a drag on the chart reads values, it does not scroll
  if (active || (ImGui::IsItemHovered() && !ImGui::GetIO().MouseDown[0] && ImGui::GetIO().MouseDelta.x != 0)) {
    const float mx = ImGui::GetIO().MousePos.x;
    app.ui.chart_probe_ph = std::clamp(x_lo + (mx - a.x) / (b.x - a.x) * (x_hi - x_lo), x_lo, x_hi);
  }

  ImDrawList* d = ImGui::GetWindowDrawList();
  d->AddRectFilled(origin, ImVec2(origin.x + w, origin.y + h), theme::kSurface, 0.6f * e);
  const float line = std::max(1.0f, 0.12f * e);
  // Grid and axes: y in % of DIC, x in pH units.
  for (int i = 0; i <= 4; ++i) {
    const float f = 0.25f * static_cast<float>(i);
    d->AddLine(ImVec2(a.x, sy(f)), ImVec2(b.x, sy(f)), theme::with_alpha(theme::kGrid, i == 0 ? 255 : 110), line * 0.7f);
    if (i % 2 == 0) {
      const std::string t = std::to_string(25 * i) + "%";
      const ImVec2 ts = ImGui::CalcTextSize(t.c_str());
      d->AddText(ImVec2(a.x - ts.x - 0.4f * e, sy(f) - ts.y / 2), theme::kTextDim, t.c_str());
    }
  }
  for (int ph = 6; ph <= 10; ++ph) {
    const float x = sx(static_cast<float>(ph));
    d->AddLine(ImVec2(x, a.y), ImVec2(x, b.y), theme::with_alpha(theme::kGrid, 110), line * 0.7f);
    const std::string t = std::to_string(ph);
    const ImVec2 ts = ImGui::CalcTextSize(t.c_str());
    d->AddText(ImVec2(x - ts.x / 2, b.y + 0.25f * e), theme::kTextDim, t.c_str());
  }
  const std::string x_title = std::string("pH (") + fmtx::ph_scale_label(app.water.ph_scale) + " scale)";
  const ImVec2 xt = ImGui::CalcTextSize(x_title.c_str());
  d->AddText(ImVec2((a.x + b.x - xt.x) / 2, b.y + 1.3f * e), theme::kTextDim, x_title.c_str());
  d->AddText(ImVec2(origin.x + 0.5f * e, origin.y + 0.35f * e), theme::kTextDim, "Share of DIC");

  // Curves.
  const std::vector<float>* ys[3] = {&c.co2, &c.hco3, &c.co3};
  const ImU32 cols[3] = {theme::kCo2, theme::kHco3, theme::kCo3};
  for (int k = 0; k < 3; ++k) {
    for (size_t i = 0; i < c.ph.size(); ++i) d->PathLineTo(ImVec2(sx(c.ph[i]), sy((*ys[k])[i])));
    d->PathStroke(cols[k], 0, 2.2f * line);
  }
  // This water.
  const float here = static_cast<float>(fmtx::ph_on_scale(r.state, app.water.ph_scale));
  if (here >= x_lo && here <= x_hi) {
    const float x = sx(here);
    d->AddLine(ImVec2(x, a.y), ImVec2(x, b.y), theme::kText, 1.5f * line);
    for (int k = 0; k < 3; ++k) d->AddCircleFilled(ImVec2(x, sy(interpolate(c.ph, *ys[k], here))), 0.3f * e, cols[k]);
    const char* tag = "this water";
    const ImVec2 ts = ImGui::CalcTextSize(tag);
    const float tx = std::min(x + 0.3f * e, b.x - ts.x);
    d->AddText(ImVec2(tx, a.y - 1.3f * e), theme::kText, tag);
  }
  // The probe (touched pH).
  if (app.ui.chart_probe_ph) {
    const float x = sx(*app.ui.chart_probe_ph);
    d->AddLine(ImVec2(x, a.y), ImVec2(x, b.y), theme::kWarning, line);
  }

  // Legend and the read-out: plain text, nothing hover-only.
  ImGui::Dummy(ImVec2(0, 0.1f * e));
  const char* names[3] = {"CO\u2082*", "HCO\u2083\u207b", "CO\u2083\u00b2\u207b"};
  for (int k = 0; k < 3; ++k) {
    if (k) ImGui::SameLine(0, 1.2f * e);
    const ImVec2 p = ImGui::GetCursorScreenPos();
    const float lh = ImGui::GetTextLineHeight();
    d->AddRectFilled(ImVec2(p.x, p.y + lh * 0.3f), ImVec2(p.x + 0.9f * e, p.y + lh * 0.7f), cols[k], 0.2f * e);
    ImGui::Dummy(ImVec2(1.1f * e, lh));
    ImGui::SameLine(0, 0.2f * e);
    ImGui::TextUnformatted(names[k]);
  }
  const float at = app.ui.chart_probe_ph.value_or(here);
  const std::string readout = std::string(app.ui.chart_probe_ph ? "At pH " : "This water, pH ") + fmtx::fixed(at, 2) + ":  " +
                              names[0] + " " + percent(interpolate(c.ph, c.co2, at)) + ",  " + names[1] + " " +
                              percent(interpolate(c.ph, c.hco3, at)) + ",  " + names[2] + " " +
                              percent(interpolate(c.ph, c.co3, at));
  ui::wrapped(readout.c_str());
  ui::record(app, "water.chart_readout");
  if (!app.ui.chart_probe_ph) ui::dim_text("Touch the chart to read it at another pH.");
}

}  // namespace twapp
