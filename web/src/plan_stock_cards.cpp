// The Plan's three stock cards (alkalinity, calcium, magnesium): what each pump gives, the
// stock's strength (its accepted range up to the compound's solubility, from the core), and the
// pump's own name, calibration, doses a day and largest dose. Shown values are the plan's
// (PlanCache: the keeper's, else the log's schedule, else the defaults); a change is kept as the
// keeper's own. Map: 1. a strength  2. a pump  3. the cards.
#include <cmath>
#include <functional>
#include <string>

#include "actions_dosing.hpp"
#include "format.hpp"
#include "screens.hpp"
#include "theme.hpp"
#include "tidewright/additives/additives.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/plan/plan_stocks.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

namespace rg = tw::ranges;
namespace add = tw::additives;

// ---------------------------------------------------------------- 1. A strength
// "Magnesium stock strength": 1 g/L up to the strongest stock the compound's solubility allows.
bool strength_field(AppState& app, const std::string& name, const char* label, add::CompoundId id, double step,
                    double* g_per_l) {
  return ui::number_field(app, name, {label, "g/L", 0, step, 1, plan_stock_max_g_per_l(id), false}, g_per_l);
}

// ---------------------------------------------------------------- 2. A pump
// Two fields a row in table cells (as the farm's round of tests), so the card stays short on a
// phone: strength | calibration, then doses a day | largest dose; the name under them.
// A refusal of one of its numbers names the pump: its role, its name and what it doses
// (`Calcium pump "pump 2", Calcium chloride dihydrate: Doses per day 300 is outside ...`).
void draw_pump(AppState& app, int slot, const PlanPump& shown, const std::string& id, const char* role,
               const std::string& chemical, bool limewater, const std::function<void()>& strength) {
  PlanPumpSetting& set = app.ui.dosing.plan.pumps[static_cast<std::size_t>(slot)];
  const std::string owner = std::string(role) + " \"" + shown.name + "\", " + chemical;
  if (ImGui::BeginTable(("##" + id).c_str(), 2, ImGuiTableFlags_SizingStretchSame)) {
    ImGui::TableNextColumn();
    strength();
    ImGui::TableNextColumn();
    if (!limewater) {
      double k = shown.calibration;
      if (ui::number_field(app, id + ".calibration", {"Calibration (delivered per mL set)", "", 2, 0.01,
                                                       rg::kPumpCalibration.lo, rg::kPumpCalibration.hi, false, owner.c_str()},
                           &k)) {
        set.calibration = k;
      }
    }
    ImGui::TableNextColumn();
    double n = shown.doses_per_day;
    if (ui::number_field(app, id + ".doses_per_day", {"Doses per day", "", 0, 1, rg::kDosesPerDay.lo, rg::kDosesPerDay.hi, false, owner.c_str()},
                         &n)) {
      set.doses_per_day = static_cast<int>(n);
    }
    ImGui::TableNextColumn();
    if (!limewater) {
      double m = shown.max_dose_ml;
      if (ui::number_field(app, id + ".max_dose", {"Largest dose (set)", "mL", 0, 5, rg::kPlannedDoseMax.lo, rg::kPlannedDoseMax.hi, false, owner.c_str()},
                           &m)) {
        set.max_dose_ml = m;
      }
    }
    ImGui::EndTable();
  }
  if (limewater) return;  // the top-off keeps its name; its volume is bounded by the evaporation
  std::string name = shown.name;
  if (ui::text_field(app, id + ".name", "Pump name", &name, "1 to 60 characters")) set_plan_pump_name(app, slot, name);
  if (shown.from_schedule || shown.program_from_schedule) {
    ui::dim_text("Taken from this pump's schedule in the log until you change it.");
  }
  if (shown.calibration != 1.0) {
    ui::dim_text(("The plan's doses are what reaches the tank; set " + fmtx::fixed(1.0 / shown.calibration, 2) +
                  " mL on the pump for each mL. The day table shows the amounts to set.")
                     .c_str());
  }
}

}  // namespace

// ---------------------------------------------------------------- 3. The cards
void draw_plan_stock_cards(AppState& app, PlanForm& f) {
  const tw::journal::System* sys = tw::journal::find_system(app.journal, app.current_system);
  const double volume_l = sys ? sys->volume_l : 100.0;  // the bounds only; no system, no plan
  const PlanCache& c = app.ui.dosing.plan_cache;
  const auto& pumps = c.pumps;

  ui::card_begin(app);
  int alk = static_cast<int>(f.alkalinity);
  const char* const alks[] = {"Na\u2082CO\u2083 stock", "NaHCO\u2083 stock", "Limewater", "None"};
  if (ui::choice(app, "plan.alkalinity", "Alkalinity from", &alk, alks, 4)) f.alkalinity = static_cast<PlanAlkalinity>(alk);
  if (f.alkalinity == PlanAlkalinity::SodiumCarbonate || f.alkalinity == PlanAlkalinity::SodiumBicarbonate) {
    const add::CompoundId id = alkalinity_compound(f.alkalinity);
    draw_pump(app, 0, pumps[0], "plan.alk_pump", "Alkalinity pump", add::compound(id).name, false,
              [&] {
                double g = c.alkalinity_g_per_l;
                if (strength_field(app, "plan.alk_strength", "Alkalinity stock strength", id, 5, &g)) f.alkalinity_g_per_l = g;
              });
    if (c.alkalinity_strength_from_log) ui::dim_text("Stock strength: the one this system is dosed with in the log.");
  } else if (f.alkalinity == PlanAlkalinity::Limewater) {
    draw_pump(app, 0, pumps[0], "plan.alk_pump", "Alkalinity top-off", "limewater", true, [&] {
      ui::number_field(app, "plan.evaporation", {"Evaporation (top-off per day)", "L/day", 1, 0.5,
                                                 rg::kEvaporationFractionPerDay.lo * volume_l,
                                                 rg::kEvaporationFractionPerDay.hi * volume_l, false},
                       &f.evaporation_l_per_day);
    });
  }
  ui::card_end(app);

  ui::card_begin(app);
  int ca = static_cast<int>(f.calcium);
  const char* const cas[] = {"CaCl\u2082\u00b72H\u2082O stock", "None"};
  if (ui::choice(app, "plan.calcium", "Calcium from", &ca, cas, 2)) f.calcium = static_cast<PlanCalcium>(ca);
  if (f.calcium == PlanCalcium::CalciumChloride) {
    draw_pump(app, 1, pumps[1], "plan.ca_pump", "Calcium pump", add::compound(add::CompoundId::CalciumChlorideDihydrate).name, false, [&] {
      double g = c.calcium_g_per_l;
      if (strength_field(app, "plan.ca_strength", "Calcium stock strength", add::CompoundId::CalciumChlorideDihydrate, 10, &g)) {
        f.calcium_g_per_l = g;
      }
    });
    if (c.calcium_strength_from_log) ui::dim_text("Stock strength: the one this system is dosed with in the log.");
  }
  ui::card_end(app);

  ui::card_begin(app);
  int mg = static_cast<int>(c.magnesium);
  const char* const mgs[] = {"MgCl\u2082\u00b76H\u2082O stock", "MgSO\u2084\u00b77H\u2082O stock", "None"};
  if (ui::choice(app, "plan.magnesium", "Magnesium from", &mg, mgs, 3)) {
    f.magnesium = static_cast<PlanMagnesium>(mg);
    f.magnesium_g_per_l.reset();  // a new compound starts at its own strength
  }
  if (c.magnesium != PlanMagnesium::None) {
    const add::CompoundId id = magnesium_compound(c.magnesium);
    draw_pump(app, 2, pumps[2], "plan.mg_pump", "Magnesium pump", add::compound(id).name, false, [&] {
      double g = c.magnesium_g_per_l;
      if (strength_field(app, "plan.mg_strength", "Magnesium stock strength", id, 10, &g)) f.magnesium_g_per_l = g;
    });
    if (c.magnesium_from_log) ui::dim_text("Magnesium stock taken from what the log shows you dosing.");
    // The compound's own cautions (the core's catalog), e.g. sulfate building up from Epsom salt alone.
    std::string cautions;
    for (const std::string& s : add::compound(id).cautions) cautions += (cautions.empty() ? "" : "; ") + s;
    if (!cautions.empty()) ui::colored_wrapped(theme::kWarning, (cautions + ".").c_str());
    ui::record(app, "plan.mg_cautions");
  } else if (!f.magnesium) {
    ui::dim_text("No magnesium schedule or recent magnesium dose in the log.");
  }
  ui::card_end(app);
}

}  // namespace twapp
