// How precise the keeper's measurements are, when they do not say: one table of default
// standard uncertainties per kind of kit or meter, used by `chem`, the Water screen and the
// hatchery so they all start from the same numbers. The typical value of each is the
// journal's typical precision (tw::info_of(p).typical_precision, the same numbers the consumption
// estimate uses); the coarse one is the worse end commonly met.
//
// Sources: hobby kits and meters have no single published precision. The ranges below are
// common practice (issue 13, design.md "a hobby alkalinity kit is good to about
// +/-0.2-0.5 dKH"): alkalinity kit 0.2-0.5 dKH, hobby pH meter 0.05-0.1 on the NBS scale,
// calcium kit 10-20 mg/L, magnesium kit 25-50 mg/L. The NBS-to-total conversion of a meter reading in seawater is good
// to a few hundredths of a pH unit (facts.md, "from memory: unverified magnitude"): 0.03 here.
#pragma once

#include <optional>

#include "tidewright/carbonate/uncertainty.hpp"
#include "tidewright/journal/journal.hpp"

namespace tw::carbonate {

struct PrecisionDefault {
  double typical = 0;          // default standard uncertainty (1 sd), in `unit`
  double coarse = 0;           // the worse end commonly met, in `unit`
  double maximum = 0;          // the largest a user may enter, in `unit`
  const char* unit = "";       // the journal's canonical unit: dKH, mg/L, pH, (salinity), C
  const char* instrument = ""; // what measures it, for the user: "hobby alkalinity test kit"
  const char* basis = "";      // "common practice"
};

// Defaults for the parameters the chemistry takes from a keeper: alkalinity (dKH), calcium
// and magnesium (mg/L), pH (NBS meter), salinity, temperature (C). Unset for the others.
std::optional<PrecisionDefault> default_precision(journal::Parameter parameter);

// Standard uncertainty of converting an NBS-calibrated meter's reading in seawater to the
// total scale (pH units): "a few hundredths" (facts.md, from memory).
inline constexpr double kPhNbsToTotalUncertainty = 0.03;

// Standard uncertainty of a measured total boron, relative to its value. Boron is not a kit
// test: a salt mix's maker or a laboratory (ICP-OES) gives it. Such reports are commonly
// quoted to a few per cent (from memory, no single source); 5 % (1 sd) is our judgement,
// above the 2 % Orr et al. (2018) give the seawater boron-to-salinity ratio.
inline constexpr double kMeasuredBoronRelativeUncertainty = 0.05;

// Checks a user's precision for a parameter: 0 up to the table's maximum, finite. The
// Error's field is `field` (the front end's name, e.g. "--ph-precision") and its message
// names the accepted range in the canonical unit.
Status check_precision(journal::Parameter parameter, double precision, const std::string& field);

// The default uncertainties of a keeper's measurements of this water, in the solver's units:
// the typical value of the table for alkalinity (dKH -> umol/kg at the water's density),
// pH (the meter's; plus kPhNbsToTotalUncertainty when the pH is on the NBS scale), calcium
// (if measured), magnesium (if the Mg/Ca correction reads it), a measured total boron
// (kMeasuredBoronRelativeUncertainty), salinity and temperature. DIC, pCO2, fCO2 and carbonate ion have no kit
// default (laboratory measurements): 0 unless the caller sets them. No constants' uncertainty.
InputUncertainties default_input_uncertainties(const Conditions& conditions, const InputPair& inputs);

}  // namespace tw::carbonate
