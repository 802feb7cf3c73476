// The round of tests' Save (issue 15): many systems' tests in one change of the journal. Every
// typed value is read by the core's number rule and checked by the core's own validate_event
// (range in the unit typed, the kit precision's range) before any is added; the first refusal
// leaves the journal as it was and names the system, the field and the accepted range.
#include <algorithm>
#include <map>
#include <variant>

#include "actions.hpp"
#include "farm.hpp"
#include "platform.hpp"
#include "tidewright/common/number_text.hpp"
#include "tidewright/journal/test_precision.hpp"

namespace twapp {

namespace {

namespace jn = tw::journal;

const char* const kFieldKeys[kRoundFields] = {"alk", "ca", "mg", "ph"};
const tw::Parameter kFieldParameters[kRoundFields] = {tw::Parameter::Alkalinity, tw::Parameter::Calcium,
                                                      tw::Parameter::Magnesium, tw::Parameter::PH};

// The test a round field makes, in the system's own units and pH scale, with the typical kit
// precision the Log form fills in (the core's table, test_precision.hpp).
jn::TestResult test_of(const jn::System& sys, int field, double value) {
  jn::TestResult t;
  t.parameter = kFieldParameters[field];
  t.value = value;
  t.unit = round_unit(sys, field);
  if (t.parameter == tw::Parameter::PH) t.ph_scale = sys.units.ph_scale;
  t.precision = jn::typical_precision_in_unit(t.parameter, t.unit);
  return t;
}

std::string trimmed(const std::string& s) {
  const auto a = s.find_first_not_of(" \t");
  if (a == std::string::npos) return "";
  return s.substr(a, s.find_last_not_of(" \t") - a + 1);
}

}  // namespace

tw::Parameter round_parameter(int field) { return kFieldParameters[field]; }

std::string round_unit(const jn::System& sys, int field) {
  switch (kFieldParameters[field]) {
    case tw::Parameter::Alkalinity: return tw::units::to_string(sys.units.alkalinity);
    case tw::Parameter::PH: return "pH";
    default: return tw::units::to_string(sys.units.calcium_magnesium);
  }
}

std::string round_field_name(jn::SystemId id, int field) {
  return "round." + std::to_string(id) + "." + kFieldKeys[field];
}

bool due_a_test(const FarmRow& row) {
  bool any_test = false;
  for (const FarmLevel& l : row.levels) {
    if (l.tested && l.stale) return true;
    any_test = any_test || l.tested;
  }
  return !any_test;
}

std::vector<jn::SystemId> round_systems(const AppState& app) {
  const RoundChoice& choice = app.round_choice;
  std::map<jn::SystemId, bool> due;  // from the overview's rows, when built
  if (choice.scope == RoundScope::Due) {
    for (const FarmRow& row : app.ui.farm.cache.rows) due[row.id] = due_a_test(row);
  }
  std::vector<jn::SystemId> out;
  for (const jn::System& sys : app.journal.systems) {
    const auto typed = app.ui.farm.round.typed.find(sys.id);
    const bool has_typed = typed != app.ui.farm.round.typed.end() &&
                           std::any_of(typed->second.begin(), typed->second.end(),
                                       [](const std::string& t) { return !trimmed(t).empty(); });
    bool listed = has_typed;
    switch (choice.scope) {
      case RoundScope::All: listed = true; break;
      case RoundScope::Due: {
        const auto d = due.find(sys.id);
        listed = listed || d == due.end() || d->second;
        break;
      }
      case RoundScope::Chosen:
        listed = listed || std::binary_search(choice.chosen.begin(), choice.chosen.end(), sys.id);
        break;
    }
    if (listed) out.push_back(sys.id);
  }
  return out;
}

void toggle_round_system(AppState& app, jn::SystemId id) {
  auto& chosen = app.round_choice.chosen;
  const auto at = std::lower_bound(chosen.begin(), chosen.end(), id);
  if (at != chosen.end() && *at == id) {
    chosen.erase(at);
  } else {
    chosen.insert(at, id);
  }
  save(app);  // a preference: no result depends on it (no new revision)
}

void set_round_scope(AppState& app, RoundScope scope) {
  app.round_choice.scope = scope;
  save(app);
}

int save_round(AppState& app) {
  RoundForm& f = app.ui.farm.round;
  f.error.clear();
  f.error_field.clear();
  const std::int64_t now_s = platform::now_unix_seconds();
  const std::int64_t when = f.when_s.value_or(now_s);
  if (auto st = jn::check_not_in_future(when, now_s); !st) {
    f.error = st.error().message;
    notify(app, f.error, true);
    return 0;
  }
  std::vector<jn::Event> tests;
  std::vector<jn::SystemId> filled;
  for (const jn::System& sys : app.journal.systems) {  // journal order: the first refusal is the topmost
    const auto typed = f.typed.find(sys.id);
    if (typed == f.typed.end()) continue;
    bool any = false;
    for (int k = 0; k < kRoundFields; ++k) {
      const std::string text = trimmed(typed->second[static_cast<size_t>(k)]);
      if (text.empty()) continue;  // not tested this round
      const char* label = tw::parameter_label(kFieldParameters[k]);
      auto v = tw::number_text::read_decimal_or_error(label, text, tw::number_text::DecimalMark::PointOrComma);
      jn::Event e;
      e.system_id = sys.id;
      e.time_s = when;
      tw::Status st = v ? tw::Status{tw::Ok{}} : tw::Status{v.error()};
      if (v) {
        e.data = test_of(sys, k, *v);
        st = jn::validate_event(app.journal, e);
      }
      if (!st) {
        f.error = sys.name + ", " + label + ": " + st.error().message;
        f.error_field = round_field_name(sys.id, k);
        app.ui.reveal = f.error_field;  // scroll to the refused field, which shows the message
        return 0;
      }
      tests.push_back(std::move(e));
      any = true;
    }
    if (any) filled.push_back(sys.id);
  }
  if (tests.empty()) {
    f.error = "Nothing to save: type at least one value";
    notify(app, f.error, true);
    return 0;
  }
  // All checked: add them to a copy, so a refusal the checks did not foresee still loses nothing.
  jn::Journal next = app.journal;
  for (const jn::Event& e : tests) {
    if (auto id = jn::add_event(next, e); !id) {
      f.error = id.error().message;
      notify(app, f.error, true);
      return 0;
    }
  }
  app.journal = std::move(next);
  app.water.what_if = false;  // the Water screen follows the new readings
  f.typed.clear();
  f.when_s.reset();
  const auto count = [](size_t n, const char* one, const char* many) { return std::to_string(n) + " " + (n == 1 ? one : many); };
  notify(app, "Saved " + count(tests.size(), "test", "tests") + " of " + count(filled.size(), "system", "systems"));
  ++app.revision;
  save(app);  // one save: the store writes the new events in one transaction
  return static_cast<int>(tests.size());
}

}  // namespace twapp
