// `tidewright mix`: stock solution recipes both ways.
//   tidewright mix --compound sodium_carbonate --grams-per-l 100            -> strength per mL
//   tidewright mix --compound CaCl2.2H2O --grams-per-l 150 --compound MgCl2.6H2O --grams-per-l 100
//                                                       (several compounds in one stock, paired in order)
//   tidewright mix --compound sodium_carbonate --raise 0.1 --per-ml 1 --in-l 100 [--parameter alkalinity]
//                                                                           -> grams per litre
#include <cstdio>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "commands.hpp"
#include "option_rules.hpp"
#include "tidewright/additives/additives.hpp"

namespace tw::shell {
namespace {

struct MixOptions {
  std::vector<std::string> compounds;  // --compound, repeatable
  std::vector<double> grams_per_l;     // --grams-per-l, one per --compound, in the same order
  std::optional<double> raise;  // --raise: a recipe for an effect (then no --grams-per-l)
  double per_ml = 1, in_l = 100;
  std::string parameter = "alkalinity";
  double temperature_c = 25;
};

void print_strength(const additives::StockStrength& s) {
  std::printf("per mL: %.4f meq alkalinity, %.4f mmol DIC, %.3f mg calcium, %.3f mg magnesium\n",
              s.alkalinity_meq_per_ml, s.dic_mmol_per_ml, s.calcium_mg_per_ml, s.magnesium_mg_per_ml);
  std::printf("saturation: %.0f %% of solubility\n", 100 * s.saturation_fraction);
  for (const auto& n : s.notes) std::printf("note: %s\n", n.c_str());
}

std::vector<const additives::Compound*> find_all(const std::vector<std::string>& keys) {
  std::vector<const additives::Compound*> out;
  for (const auto& k : keys) {
    auto c = additives::find_compound(k);
    if (!c) throw CommandError("--compound: " + c.error().message);
    out.push_back(*c);
  }
  return out;
}

// Strength of a stock of one or more compounds, each at its --grams-per-l.
void run_strength(const MixOptions& o, const std::vector<const additives::Compound*>& compounds) {
  if (o.grams_per_l.size() != compounds.size()) {
    throw CommandError(fmt::format("--grams-per-l: give one per --compound, in the same order ({} compound{}, {} "
                                   "amount{}), or --raise for a recipe",
                                   compounds.size(), compounds.size() == 1 ? "" : "s", o.grams_per_l.size(),
                                   o.grams_per_l.size() == 1 ? "" : "s"));
  }
  additives::StockRecipe recipe;
  recipe.temperature_c = o.temperature_c;
  std::string described;
  for (size_t i = 0; i < compounds.size(); ++i) {
    if (!(o.grams_per_l[i] > 0)) {
      throw CommandError(fmt::format("--grams-per-l: {:g} for {} must be above 0 g/L", o.grams_per_l[i],
                                     compounds[i]->key));
    }
    recipe.ingredients.push_back({compounds[i]->id, o.grams_per_l[i]});
    recipe.name += (i ? " + " : "") + compounds[i]->key;
    described += fmt::format("{}{} {:g} g", i ? ", " : "", compounds[i]->name, o.grams_per_l[i]);
  }
  auto s = additives::stock_strength(recipe);
  if (!s) throw CommandError(s.error().field + ": " + s.error().message);
  std::printf("%s per litre of finished solution at %g C\n", described.c_str(), o.temperature_c);
  print_strength(*s);
  auto a = additives::additive_from_stock(recipe);
  if (a) for (const auto& line : additives::cautions_for(*a)) std::printf("caution: %s\n", line.c_str());
}

void run(const MixOptions& o) {
  const auto compounds = find_all(o.compounds);
  if (!o.raise) {
    run_strength(o, compounds);
    return;
  }
  // Two questions at once would leave one unanswered: refuse the pair instead of dropping one.
  if (!o.grams_per_l.empty()) {
    throw CommandError("give --grams-per-l (the strength of a recipe) or --raise (a recipe for an effect), not both");
  }
  if (compounds.size() != 1) throw CommandError("--raise: a recipe for an effect takes exactly one --compound");
  const additives::Compound* c = compounds.front();
  auto p = tw::dosed_parameter_from_name(o.parameter);
  if (!p) throw CommandError(p.error().message);
  auto r = additives::recipe_for_effect(c->id, {*p, *o.raise, o.per_ml, o.in_l}, o.temperature_c);
  if (!r) fail(r.error(), {{"rise", "--raise"},
                           {"dose_ml", "--per-ml"}, {"tank_volume_l", "--in-l"}, {"temperature_c", "--temperature-c"}});
  std::printf("%s: dissolve %.2f g per litre of finished solution (%s), so that %g mL raises %g L by %g %s\n",
              c->name.c_str(), r->grams_per_l, c->formula.c_str(), o.per_ml, o.in_l, *o.raise,
              tw::parameter_unit(*p));
  print_strength(r->strength);
  additives::Additive a = additives::additive_from_compound(c->id);
  for (const auto& line : additives::cautions_for(a)) std::printf("caution: %s\n", line.c_str());
}

}  // namespace

void register_mix(CLI::App& app) {
  auto o = std::make_shared<MixOptions>();
  CLI::App* sub = app.add_subcommand("mix", "Stock solution recipes: strength from a recipe, or a recipe for an effect");
  sub->add_option("--compound", o->compounds,
                  "catalog key or formula, e.g. sodium_carbonate, CaCl2.2H2O; repeat for a stock of several")
      ->required();
  sub->add_option("--grams-per-l", o->grams_per_l,
                  "grams of the compound per litre of finished solution; one per --compound, same order");
  sub->add_option("--raise", o->raise, "wanted rise per dose (dKH or mg/L)");
  sub->add_option("--per-ml", o->per_ml, "dose in mL for that rise (default 1)");
  sub->add_option("--in-l", o->in_l, "tank volume in L for that rise (default 100)");
  sub->add_option("--parameter", o->parameter, "alkalinity, calcium or magnesium (default alkalinity)");
  sub->add_option("--temperature-c", o->temperature_c, "temperature of the stock, C (default 25)");
  sub->callback([o] { run(*o); });
}

}  // namespace tw::shell
