// `tidewright mix`: stock solution recipes both ways.
//   tidewright mix --compound sodium_carbonate --grams-per-l 100            -> strength per mL
//   tidewright mix --compound sodium_carbonate --raise 0.1 --per-ml 1 --in-l 100 [--parameter alkalinity]
//                                                                           -> grams per litre
#include <cstdio>
#include <memory>

#include <fmt/format.h>

#include "commands.hpp"
#include "tidewright/additives.hpp"

namespace tw::shell {
namespace {

struct MixOptions {
  std::string compound;
  double grams_per_l = 0;
  double raise = 0, per_ml = 1, in_l = 100;
  std::string parameter = "alkalinity";
  double temperature_c = 25;
};

void print_strength(const additives::StockStrength& s) {
  std::printf("per mL: %.4f meq alkalinity, %.4f mmol DIC, %.3f mg calcium, %.3f mg magnesium\n",
              s.alkalinity_meq_per_ml, s.dic_mmol_per_ml, s.calcium_mg_per_ml, s.magnesium_mg_per_ml);
  std::printf("saturation: %.0f %% of solubility\n", 100 * s.saturation_fraction);
  for (const auto& n : s.notes) std::printf("note: %s\n", n.c_str());
}

void run(const MixOptions& o) {
  auto c = additives::find_compound(o.compound);
  if (!c) throw CommandError(c.error().message);
  const auto id = (*c)->id;
  if (o.raise > 0) {
    auto p = additives::parameter_from_string(o.parameter);
    if (!p) throw CommandError(p.error().message);
    auto r = additives::recipe_for_effect(id, {*p, o.raise, o.per_ml, o.in_l}, o.temperature_c);
    if (!r) throw CommandError(r.error().message);
    std::printf("%s: dissolve %.2f g per litre of finished solution (%s), so that %g mL raises %g L by %g %s\n",
                (*c)->name.c_str(), r->grams_per_l, (*c)->formula.c_str(), o.per_ml, o.in_l, o.raise,
                additives::unit_of(*p));
    print_strength(r->strength);
  } else {
    if (!(o.grams_per_l > 0)) throw CommandError("grams-per-l: give --grams-per-l (> 0) or --raise");
    auto s = additives::stock_strength({(*c)->key, {{id, o.grams_per_l}}, o.temperature_c});
    if (!s) throw CommandError(s.error().message);
    std::printf("%s, %g g per litre of finished solution at %g C\n", (*c)->name.c_str(), o.grams_per_l,
                o.temperature_c);
    print_strength(*s);
  }
  additives::Additive a = additives::additive_from_compound(id);
  for (const auto& line : additives::cautions_for(a)) std::printf("caution: %s\n", line.c_str());
}

}  // namespace

void register_mix(CLI::App& app) {
  auto o = std::make_shared<MixOptions>();
  CLI::App* sub = app.add_subcommand("mix", "Stock solution recipes: strength from a recipe, or a recipe for an effect");
  sub->add_option("--compound", o->compound, "catalog key or formula, e.g. sodium_carbonate, CaCl2.2H2O")->required();
  sub->add_option("--grams-per-l", o->grams_per_l, "grams of the compound per litre of finished solution");
  sub->add_option("--raise", o->raise, "wanted rise per dose (dKH or mg/L)");
  sub->add_option("--per-ml", o->per_ml, "dose in mL for that rise (default 1)");
  sub->add_option("--in-l", o->in_l, "tank volume in L for that rise (default 100)");
  sub->add_option("--parameter", o->parameter, "alkalinity, calcium or magnesium (default alkalinity)");
  sub->add_option("--temperature-c", o->temperature_c, "temperature of the stock, C (default 25)");
  sub->callback([o] { run(*o); });
}

}  // namespace tw::shell
