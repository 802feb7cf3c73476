// The stocks a pump can give on the Plan screen and how a pump's settings start
// (plan_stocks.hpp), and the strongest stock a compound's solubility allows (additives.hpp).
#include <doctest/doctest.h>

#include "../journal_fixture.hpp"

#include <array>
#include <string>

#include "tidewright/additives/additives.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/plan/plan_stocks.hpp"

using namespace tw;
using namespace tw::plan;
namespace ad = tw::additives;

namespace {

constexpr std::int64_t kNow = 1785542400;  // 2026-08-01T00:00:00Z
constexpr std::array<ad::CompoundId, 2> kMagnesium = {ad::CompoundId::MagnesiumChlorideHexahydrate,
                                                      ad::CompoundId::MagnesiumSulfateHeptahydrate};

journal::Journal reef(journal::SystemId* id) {
  journal::Journal j;
  journal::System s;
  s.name = "reef";
  s.volume_l = 300;
  *id = *journal::add_system(j, s);
  return j;
}

using tw::test::add;

}  // namespace

TEST_CASE("stocks: the strongest stock of a compound is the edge of stock_strength's solubility check") {
  for (ad::CompoundId id : {ad::CompoundId::MagnesiumChlorideHexahydrate, ad::CompoundId::MagnesiumSulfateHeptahydrate,
                            ad::CompoundId::SodiumCarbonate, ad::CompoundId::CalciumChlorideDihydrate}) {
    for (double t : {10.0, 25.0}) {
      CAPTURE(ad::compound(id).key);
      CAPTURE(t);
      auto max = ad::max_stock_g_per_l(id, t);
      REQUIRE_MESSAGE(max.ok(), max.error().message);
      CHECK(*max > 0);
      CHECK(ad::stock_strength({"", {{id, *max}}, t}).ok());
      if (*max < ranges::kStockGPerL.hi) {
        auto over = ad::stock_strength({"", {{id, *max + 0.02}}, t});
        REQUIRE_FALSE(over.ok());
        CHECK(over.error().field == "ingredients[0].grams_per_l");
      }
    }
  }
  // Soda ash is far less soluble cold (the catalog's table: 12.2 g per 100 g water at 10 C,
  // 29.4 at 25 C): the limit falls with it.
  CHECK(*ad::max_stock_g_per_l(ad::CompoundId::SodiumCarbonate, 10) < *ad::max_stock_g_per_l(ad::CompoundId::SodiumCarbonate, 25));
  CHECK(ad::max_stock_g_per_l(ad::CompoundId::CalciumHydroxide, 25).error().field == "compound");
  CHECK(ad::max_stock_g_per_l(ad::CompoundId::SodiumCarbonate, 80).error().field == "temperature_c");
}

TEST_CASE("stocks: the magnesium stocks, chloride first, each starting well under saturation") {
  const auto stocks = magnesium_stocks();
  REQUIRE(stocks.size() == 2);
  CHECK(stocks[0].compound == ad::CompoundId::MagnesiumChlorideHexahydrate);
  CHECK(stocks[1].compound == ad::CompoundId::MagnesiumSulfateHeptahydrate);
  for (const PlanStock& s : stocks) {
    CAPTURE(ad::compound(s.compound).key);
    CHECK(ad::compound(s.compound).per_mole.magnesium_mol == 1);
    // Under two thirds of the strongest stock from a cool store room to a warm fish room.
    for (double t : {10.0, 25.0, 40.0}) CHECK(s.starter_g_per_l < 0.67 * *ad::max_stock_g_per_l(s.compound, t));
    // A stock of it makes an additive that raises magnesium only (and the plan carries the
    // compound's cautions: sulfate alone builds up sulfate).
    auto a = ad::additive_from_stock({"mg", {{s.compound, s.starter_g_per_l}}, 25});
    REQUIRE(a.ok());
    CHECK(a->per_unit.magnesium_mol > 0);
    CHECK(a->per_unit.calcium_mol == 0);
    CHECK(a->per_unit.alkalinity_eq == 0);
  }
  bool sulfate_caution = false;
  for (const auto& c : ad::cautions_for(*ad::additive_from_stock({"mg", {{stocks[1].compound, 150}}, 25}))) {
    sulfate_caution = sulfate_caution || c.find("sulfate") != std::string::npos;
  }
  CHECK(sulfate_caution);
}

TEST_CASE("stocks: a pump's program starts from its schedule, else the defaults") {
  const PumpProgram none = pump_program_from(std::nullopt);
  CHECK(none.doses_per_day == kDefaultDosesPerDay);
  CHECK(none.max_dose == kDefaultMaxDoseMl);
  const PumpProgram slow = pump_program_from(ScheduledPump{"pump 1", 1.0, 2, 47.5, 80.0});
  CHECK(slow.doses_per_day == 2);
  CHECK(slow.max_dose == kDefaultMaxDoseMl);  // never below the default
  const PumpProgram big = pump_program_from(ScheduledPump{"pump 1", 1.0, 6, 80.0, 80.0});
  CHECK(big.doses_per_day == 6);
  CHECK(big.max_dose == 80.0);  // never below what the pump sets now
}

TEST_CASE("stocks: the magnesium the keeper doses, from a schedule, else a recent dose, else none") {
  journal::SystemId id = 0;
  journal::Journal j = reef(&id);
  CHECK_FALSE(dosed_stock_for(j, id, kMagnesium, kNow).has_value());
  // A dose by hand of magnesium chloride, ten days ago: the compound, weighed (no strength).
  journal::Dose hand;
  hand.additive_id = "magnesium_chloride_hexahydrate";
  hand.amount = 30;
  hand.unit = journal::DoseUnit::Grams;
  add(j, id, kNow - 10 * 86400, hand);
  auto d = dosed_stock_for(j, id, kMagnesium, kNow);
  REQUIRE(d.has_value());
  CHECK(d->compound == ad::CompoundId::MagnesiumChlorideHexahydrate);
  CHECK_FALSE(d->stock_g_per_l.has_value());
  CHECK_FALSE(d->pump.has_value());
  // Older than the weeks the starter looks back: forgotten.
  CHECK_FALSE(dosed_stock_for(j, id, kMagnesium, kNow + 60 * 86400).has_value());
  // A running schedule of Epsom salt on a pump wins over the dose.
  journal::DoseSchedule s;
  s.device = "mg doser";
  s.additive_id = "magnesium_sulfate_heptahydrate";
  s.amount = 6.5;
  s.unit = journal::DoseUnit::Millilitres;
  s.stock_g_per_l = 140;
  s.doses_per_day = 3;
  s.calibration = 0.95;
  s.stop_time_s = kNow + 5 * 86400;
  add(j, id, kNow - 86400, s);
  d = dosed_stock_for(j, id, kMagnesium, kNow);
  REQUIRE(d.has_value());
  CHECK(d->compound == ad::CompoundId::MagnesiumSulfateHeptahydrate);
  CHECK(d->stock_g_per_l == 140.0);
  REQUIRE(d->pump.has_value());
  CHECK(d->pump->device == "mg doser");
  CHECK(d->pump->calibration == 0.95);
  CHECK(d->pump->doses_per_day == 3);
  CHECK(d->pump->amount == 6.5);
  // Stopped: the dose is newest again (within the weeks), with no pump.
  d = dosed_stock_for(j, id, kMagnesium, kNow + 6 * 86400);
  REQUIRE(d.has_value());
  CHECK(d->compound == ad::CompoundId::MagnesiumChlorideHexahydrate);
  CHECK_FALSE(d->pump.has_value());
  // Only the compounds asked for: calcium chloride asks find no magnesium.
  const std::array<ad::CompoundId, 1> calcium = {ad::CompoundId::CalciumChlorideDihydrate};
  CHECK_FALSE(dosed_stock_for(j, id, calcium, kNow).has_value());
}
