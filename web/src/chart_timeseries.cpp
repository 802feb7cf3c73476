// Time-series chart (see chart_timeseries.hpp). Map: 1. ranges and ticks  2. drawing
// 3. touch.
#include "chart_timeseries.hpp"
#include "local_time.hpp"

#include <algorithm>
#include <cmath>

#include "format.hpp"
#include "theme.hpp"
#include "tidewright/common/datetime.hpp"
#include "ui.hpp"

namespace twapp::chart {

namespace {

// ---------------------------------------------------------------- 1. Ranges and ticks
struct Span {
  double lo = 1e300, hi = -1e300;
  void add(double v) {
    if (!std::isfinite(v)) return;
    lo = std::min(lo, v);
    hi = std::max(hi, v);
  }
  bool empty() const { return lo > hi; }
};

// A "nice" tick step (1, 2 or 5 x 10^n) giving about `count` intervals over `range`.
double nice_step(double range, int count) {
  const double raw = range / std::max(1, count);
  const double p = std::pow(10.0, std::floor(std::log10(raw)));
  const double m = raw / p;
  return (m < 1.5 ? 1 : m < 3.5 ? 2 : m < 7.5 ? 5 : 10) * p;
}

// Days between date ticks: the smallest of these that leaves at least `min_gap_px` per tick.
double day_step(double range_days, float width_px, float min_gap_px) {
  const double steps[] = {1, 2, 3, 7, 14, 28, 56, 91, 182, 365};
  for (double s : steps) {
    if (range_days / s * min_gap_px <= width_px) return s;
  }
  return 730;
}

// A dashed segment. `phase` (0 .. 2 dash) carries the pattern from the previous segment of a
// polyline: restarted on each segment, a line of many short segments (a daily forecast) drew
// every one whole and looked solid. Returns the phase at q.
float dashed_line(ImDrawList* d, ImVec2 p, ImVec2 q, ImU32 col, float thick, float dash, float phase = 0) {
  const float dx = q.x - p.x, dy = q.y - p.y;
  const float len = std::sqrt(dx * dx + dy * dy);
  if (len <= 0) return phase;
  float s = -phase;  // where the current period started, along this segment
  for (; s < len; s += 2 * dash) {
    const float a = std::max(0.0f, s), e = std::min(len, s + dash);
    if (e > a) {
      d->AddLine(ImVec2(p.x + dx * a / len, p.y + dy * a / len), ImVec2(p.x + dx * e / len, p.y + dy * e / len), col,
                 thick);
    }
  }
  return len - (s - 2 * dash);
}

ImU32 with_alpha(ImU32 col, int alpha) { return (col & ~IM_COL32_A_MASK) | (static_cast<ImU32>(alpha) << IM_COL32_A_SHIFT); }

}  // namespace

std::string day_label(double t_days) { return local_time::month_day(t_days); }

namespace {

// Dose marks gathered into ticks at least `room` apart: each tick at the mean x of its doses,
// with their count. xs need not be sorted.
struct DoseTick {
  float x = 0;
  int count = 0;
};
std::vector<DoseTick> dose_ticks(std::vector<float> xs, float room) {
  std::sort(xs.begin(), xs.end());
  std::vector<DoseTick> out;
  float first = 0, sum = 0;
  for (float x : xs) {
    if (!out.empty() && x - first < room) {
      ++out.back().count;
      sum += x;
      out.back().x = sum / static_cast<float>(out.back().count);
      continue;
    }
    out.push_back({x, 1});
    first = sum = x;
  }
  return out;
}

}  // namespace

// ---------------------------------------------------------------- 2. Drawing
bool draw_timeseries(AppState& app, const TimeSeries& s, std::optional<double>* probe_t) {
  const float e = ui::em(app);
  const float w = ImGui::GetContentRegionAvail().x;
  const float h = s.height_em * e;
  const ImVec2 origin = ImGui::GetCursorScreenPos();

  Span xs, ys;
  for (const Point& p : s.points) { xs.add(p.t); ys.add(p.v); }
  for (const Band& b : s.bands) {
    for (size_t i = 0; i < b.t.size(); ++i) { xs.add(b.t[i]); ys.add(b.lo[i]); ys.add(b.hi[i]); }
  }
  for (const Mark& m : s.marks) xs.add(m.t);
  if (s.now_t) xs.add(*s.now_t);
  if (s.target) ys.add(*s.target);
  if (s.band_lo) ys.add(*s.band_lo);
  if (s.band_hi) ys.add(*s.band_hi);
  if (s.zero_line) ys.add(*s.zero_line);
  if (xs.empty()) { xs.lo = 0; xs.hi = 1; }
  if (ys.empty()) { ys.lo = 0; ys.hi = 1; }
  if (xs.hi - xs.lo < 1) { xs.lo -= 0.5; xs.hi += 0.5; }
  const double yr0 = ys.hi - ys.lo;
  const double ypad = yr0 > 0 ? 0.08 * yr0 : std::max(1e-3, std::fabs(ys.hi) * 0.05);
  double y_lo = ys.lo - ypad, y_hi = ys.hi + ypad;
  const double xpad = 0.03 * (xs.hi - xs.lo);
  const double x_lo = xs.lo - xpad, x_hi = xs.hi + xpad;

  // Plot area inside the axes: values at the left, dates and marks below, unit on top.
  const float left = 3.6f * e;
  const ImVec2 a(origin.x + left, origin.y + 1.5f * e);
  const ImVec2 b(origin.x + w - 0.6f * e, origin.y + h - 2.0f * e);
  auto sx = [&](double t) { return static_cast<float>(a.x + (t - x_lo) / (x_hi - x_lo) * (b.x - a.x)); };
  auto sy = [&](double v) { return static_cast<float>(b.y - (v - y_lo) / (y_hi - y_lo) * (b.y - a.y)); };

  // ---------------------------------------------------------------- 3. Touch
  ImGui::PushID(s.name.c_str());
  ImGui::InvisibleButton("##ts", ImVec2(w, h));
  ImGui::PopID();
  ui::record(app, s.name);
  bool changed = false;
  if (ImGui::IsItemActive()) {
    app.ui.drag_owned = true;  // a drag on the chart reads values, it does not scroll the page
    const float mx = ImGui::GetIO().MousePos.x;
    const double t = std::clamp(x_lo + (mx - a.x) / (b.x - a.x) * (x_hi - x_lo), x_lo, x_hi);
    if (!probe_t->has_value() || std::fabs(**probe_t - t) > 1e-9) {
      *probe_t = t;
      changed = true;
    }
  }

  ImDrawList* d = ImGui::GetWindowDrawList();
  d->AddRectFilled(origin, ImVec2(origin.x + w, origin.y + h), theme::kSurface, 0.6f * e);
  const float line = std::max(1.0f, 0.12f * e);
  d->PushClipRect(origin, ImVec2(origin.x + w, origin.y + h), true);

  // Target band and line.
  if (s.band_lo && s.band_hi) {
    d->AddRectFilled(ImVec2(a.x, sy(*s.band_hi)), ImVec2(b.x, sy(*s.band_lo)), theme::with_alpha(theme::kAccent, 28));
  }
  // Grid and value labels.
  const double ystep = nice_step(y_hi - y_lo, 4);
  for (double v = std::ceil(y_lo / ystep) * ystep; v <= y_hi + 1e-9 * ystep; v += ystep) {
    const float y = sy(v);
    d->AddLine(ImVec2(a.x, y), ImVec2(b.x, y), theme::with_alpha(theme::kGrid, 110), line * 0.7f);
    const int dec = std::max(0, std::min(3, static_cast<int>(std::ceil(-std::log10(ystep) + 1e-9))));
    const std::string t = fmtx::fixed(std::fabs(v) < 1e-12 ? 0.0 : v, std::max(dec, 0));
    const ImVec2 ts = ImGui::CalcTextSize(t.c_str());
    d->AddText(ImVec2(a.x - ts.x - 0.35f * e, y - ts.y / 2), theme::kTextDim, t.c_str());
  }
  d->AddText(ImVec2(origin.x + 0.4f * e, origin.y + 0.15f * e), theme::kTextDim, s.y_unit.c_str());
  // Date ticks at local midnights, each date's with its own offset (a tick put at today's
  // offset sat an hour off midnight, and named the day before, across a daylight-saving change).
  const double dstep = day_step(x_hi - x_lo, b.x - a.x, 3.4f * e);
  for (const double t : local_time::midnights(x_lo, x_hi, static_cast<int>(dstep))) {
    const float x = sx(t);
    d->AddLine(ImVec2(x, a.y), ImVec2(x, b.y), theme::with_alpha(theme::kGrid, 90), line * 0.7f);
    const std::string lab = day_label(t + 1e-6);
    const ImVec2 ts = ImGui::CalcTextSize(lab.c_str());
    d->AddText(ImVec2(std::clamp(x - ts.x / 2, a.x - 0.3f * e, b.x - ts.x), b.y + 0.75f * e), theme::kTextDim,
               lab.c_str());
  }
  d->AddLine(ImVec2(a.x, b.y), ImVec2(b.x, b.y), theme::kGrid, line);
  if (s.target) {
    dashed_line(d, ImVec2(a.x, sy(*s.target)), ImVec2(b.x, sy(*s.target)), theme::kAccent, line, 0.4f * e);
  }
  if (s.zero_line) {
    d->AddLine(ImVec2(a.x, sy(*s.zero_line)), ImVec2(b.x, sy(*s.zero_line)), theme::kTextDim, line);
  }
  if (s.now_t) {
    const float x = sx(*s.now_t);
    dashed_line(d, ImVec2(x, a.y), ImVec2(x, b.y), theme::kTextDim, line, 0.25f * e);
    const ImVec2 ts = ImGui::CalcTextSize("now");
    d->AddText(ImVec2(std::min(x + 0.2f * e, b.x - ts.x), a.y - 1.3f * e), theme::kTextDim, "now");
  }

  // Bands: shaded lo..hi as quads, then the middle line.
  for (const Band& band : s.bands) {
    for (size_t i = 1; i < band.t.size(); ++i) {
      const ImVec2 q[4] = {ImVec2(sx(band.t[i - 1]), sy(band.hi[i - 1])), ImVec2(sx(band.t[i]), sy(band.hi[i])),
                           ImVec2(sx(band.t[i]), sy(band.lo[i])), ImVec2(sx(band.t[i - 1]), sy(band.lo[i - 1]))};
      d->AddConvexPolyFilled(q, 4, with_alpha(band.color, 45));
    }
    float phase = 0;
    for (size_t i = 1; i < band.t.size(); ++i) {
      const ImVec2 p(sx(band.t[i - 1]), sy(band.mid[i - 1])), q(sx(band.t[i]), sy(band.mid[i]));
      if (band.dashed) {
        phase = dashed_line(d, p, q, band.color, 1.6f * line, 0.35f * e, phase);
      } else {
        d->AddLine(p, q, band.color, 1.8f * line);
      }
    }
    if (band.t.size() == 1) d->AddCircleFilled(ImVec2(sx(band.t[0]), sy(band.mid[0])), 0.2f * e, band.color);
  }

  // Marks on the time axis: doses as upward ticks, water changes as open triangles. Doses
  // closer than a tick's room (a pump dosing many times a day over weeks) are drawn as one
  // taller tick, so they never merge into a solid bar.
  std::vector<float> dose_x;
  for (const Mark& m : s.marks) {
    const float x = sx(m.t);
    if (m.kind == MarkKind::Dose) {
      dose_x.push_back(x);
    } else {
      d->AddTriangle(ImVec2(x, b.y - 0.9f * e), ImVec2(x - 0.25f * e, b.y - 0.45f * e),
                     ImVec2(x + 0.25f * e, b.y - 0.45f * e), theme::kCo2, 1.2f * line);
    }
  }
  for (const DoseTick& t : dose_ticks(dose_x, 0.3f * e)) {
    const float tick_h = 0.45f * e * std::min(2.0f, 1.0f + 0.35f * std::log2(static_cast<float>(t.count)));
    d->AddLine(ImVec2(t.x, b.y), ImVec2(t.x, b.y - tick_h), theme::with_alpha(theme::kCo3, 190), 1.2f * line);
  }

  // Readings: used = filled dot; flagged = hollow ring in the warning colour with a cross;
  // level restart = filled square in the warning colour.
  const float r = 0.27f * e;
  int flagged = 0;
  for (const Point& p : s.points) {
    const ImVec2 c(sx(p.t), sy(p.v));
    switch (p.kind) {
      case PointKind::Used: d->AddCircleFilled(c, r, theme::kText); break;
      case PointKind::Flagged:
        // Named "<chart>.flagged.<n>" for the test interface (where to touch to read it).
        ui::record_rect(app, s.name + ".flagged." + std::to_string(flagged++), ImVec2(c.x - r, c.y - r),
                        ImVec2(c.x + r, c.y + r));
        d->AddCircle(c, r * 1.5f, theme::kError, 0, 1.6f * line);
        d->AddLine(ImVec2(c.x - r, c.y - r), ImVec2(c.x + r, c.y + r), theme::kError, 1.4f * line);
        d->AddLine(ImVec2(c.x - r, c.y + r), ImVec2(c.x + r, c.y - r), theme::kError, 1.4f * line);
        break;
      case PointKind::Restart:
        d->AddRectFilled(ImVec2(c.x - r, c.y - r), ImVec2(c.x + r, c.y + r), theme::kWarning);
        break;
    }
  }

  if (probe_t->has_value()) {
    const float x = sx(**probe_t);
    d->AddLine(ImVec2(x, a.y), ImVec2(x, b.y), theme::kWarning, line);
  }
  d->PopClipRect();
  return changed;
}

}  // namespace twapp::chart
