// The independent checker's replay engine (plan_checker.cpp), shared with the mishap answers
// (plan_mishap.cpp). It never calls the scheduler: it steps the water model of plan.hpp with its
// own code, checks every state against every limit, and can be copied just before a dose to
// follow what a missed or doubled dose would do.
#pragma once

#include <cstddef>
#include <deque>
#include <optional>
#include <string>
#include <vector>

#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/plan/plan.hpp"

namespace tw::plan::replay {

struct Tank {
  double alk_umol_kg = 0, dic_umol_kg = 0, ca_mg_l = 0, mg_mg_l = 0;
};

// One checked state: minute since the start of day 1, levels (dKH, mg/L, mg/L), pH, Omega.
struct Sample {
  double t = 0;
  double level[3] = {0, 0, 0};
  double ph = 0, omega = 0;
};

struct Setup {
  const PlanInput* in = nullptr;
  carbonate::Constants k;
  double density = 1, kg = 1, umol_per_dkh = 1;
  std::vector<double> steps;  // every model step (each slot of each delivery, each day end), sorted
  Tank start;
};
// Errors go to `other` of the report.
std::optional<Setup> make_setup(const PlanInput& in, std::vector<std::string>& other);

class Engine {
 public:
  explicit Engine(const Setup& s);
  // Steps the model through every step at or before minute t (absolute).
  void run_to(double t);
  // Gives a dose at its slot; idx is the dose's index in the caller's list (for the report).
  void dose(std::size_t idx, const PlannedDose& d);
  // Runs to the end of the horizon and makes the end checks (floors never reached).
  void finish();
  // Runs to the end of day `day` (inclusive).
  void run_to_end_of_day(int which_day) { run_to(which_day * 1440.0); }
  // Forgets what was found so far (for a copy that follows a mishap).
  void reset_findings();

  CheckReport report;
  // The smallest margin to any limit seen (as a share of the limit; negative = crossed).
  std::optional<LimitId> closest;
  double closest_margin = 1e9, closest_value = 0, closest_allowed = 0;
  Tank tank;
  double clock = 0;  // minutes
  int day = 1;

 private:
  const Setup* s_;
  std::size_t step_ = 0;
  std::deque<Sample> window_;  // the last 24 hours of samples, plus one before
  bool armed_[5] = {false, false, false, false, false};  // alk, Ca, Mg, pH, Omega floors
  std::vector<double> given_today_, given_total_;
  double limewater_today_ = 0;

  bool state_of(const Tank& x, WaterState& out) const;
  bool pass_time(double minutes);
  Sample sample_now(const WaterState& w) const;
  void check_sample(const Sample& s, std::size_t dose_idx);
  void check_window(const Sample& s, std::size_t dose_idx);
  void violate(std::size_t dose, double t, LimitId id, double value, double allowed);
  void margin(LimitId id, double value, double allowed, bool upper);
  void end_of_day();
};

}  // namespace tw::plan::replay
