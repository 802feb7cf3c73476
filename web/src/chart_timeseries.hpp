// A time-series chart drawn with ImDrawList: one quantity over days, with axes (dates below,
// values and unit at the left), a target line with its band, lines with uncertainty bands
// (estimate, forecast), test readings as dots (flagged ones as hollow warning rings, level
// restarts as squares), dose marks as ticks on the time axis and water changes as open
// triangles. Touch (or drag) sets a probe time; the caller reads the values there and prints
// them under the chart (nothing is hover-only).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "app_state.hpp"
#include "imgui.h"

namespace twapp::chart {

enum class PointKind { Used, Flagged, Restart };
struct Point {
  double t = 0;  // days since 1970-01-01 UTC
  double v = 0;
  PointKind kind = PointKind::Used;
};

// A line with a shaded band (lo..hi) around it; the vectors have equal length.
struct Band {
  std::vector<double> t, mid, lo, hi;
  ImU32 color = 0;
  bool dashed = false;  // forecasts
};

enum class MarkKind { Dose, WaterChange };
struct Mark {
  double t = 0;
  MarkKind kind = MarkKind::Dose;
};

struct TimeSeries {
  std::string name;      // widget name for tests ("demand.chart.level")
  std::string y_unit;    // printed above the value axis
  int decimals = 1;      // of the value labels
  std::vector<Point> points;
  std::vector<Band> bands;
  std::vector<Mark> marks;
  std::optional<double> target;              // a line
  std::optional<double> band_lo, band_hi;    // the target band (shaded)
  std::optional<double> now_t;               // a vertical "now" line
  std::optional<double> zero_line;           // e.g. 0 on the consumption chart
  float height_em = 12.0f;
};

// Draws the chart across the available width. *probe_t is the touched time; returns true when
// it changed this frame. The chart owns a drag that starts on it (the page does not scroll).
bool draw_timeseries(AppState& app, const TimeSeries& series, std::optional<double>* probe_t);

// "11-30" (local month-day, with that date's own UTC offset) for a time in days since the epoch.
std::string day_label(double t_days);

}  // namespace twapp::chart
