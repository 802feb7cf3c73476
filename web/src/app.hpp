// One frame of the app: platform results in, recompute what is stale, draw, present.
#pragma once

#include "app_state.hpp"

namespace twapp {

bool app_frame(AppState& app);  // returns false to quit (never, for now)

}  // namespace twapp
