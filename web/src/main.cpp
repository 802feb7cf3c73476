// Tidewright app entry: one AppState, the platform window, the frame loop.
//   tidewright-app [--frames N] [--data DIR] [--script FILE]    (desktop; the browser build takes no options)
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <string>

#include "actions.hpp"
#include "app.hpp"
#include "app_state.hpp"
#include "imgui.h"
#include "platform.hpp"
#include "test_api.hpp"

namespace {

bool frame(void* user) { return twapp::app_frame(*static_cast<twapp::AppState*>(user)); }

}  // namespace

int main(int argc, char** argv) {
  twapp::platform::StartOptions options;
  for (int i = 1; i < argc; ++i) {
    if (std::strcmp(argv[i], "--frames") == 0 && i + 1 < argc) {
      options.exit_after_frames = std::atoi(argv[++i]);
    } else if (std::strcmp(argv[i], "--data") == 0 && i + 1 < argc) {
      options.data_dir = argv[++i];
    } else if (std::strcmp(argv[i], "--script") == 0 && i + 1 < argc) {
      options.script_path = argv[++i];
    } else if (std::strcmp(argv[i], "--help") == 0) {
      std::printf("usage: tidewright-app [--frames N] [--data DIR] [--script FILE]\n"
                  "  --frames N     draw N frames, then exit 0 (start-up check)\n"
                  "  --data DIR     where the app keeps its data (default ~/.local/share/tidewright)\n"
                  "  --script FILE  tap, type and check as FILE says (web/platform/native_script.hpp), then\n"
                  "                 exit 0, or 1 at the first failed check\n");
      return 0;
    } else {
      std::fprintf(stderr, "tidewright-app: unknown option %s (see --help)\n", argv[i]);
      return 2;
    }
  }
  IMGUI_CHECKVERSION();
  ImGui::CreateContext();
  ImGui::GetIO().ConfigFlags |= ImGuiConfigFlags_NavEnableKeyboard;
  std::string error;
  if (!twapp::platform::start(options, &error)) {
    std::fprintf(stderr, "tidewright-app: %s\n", error.c_str());
    return 1;
  }
  static twapp::AppState app;  // lives for the whole program (the browser loop never returns)
  twapp::test_api::attach(&app);
  twapp::start_app(app);
  twapp::platform::run_loop(frame, &app);
  twapp::platform::stop();
  ImGui::DestroyContext();
  return twapp::platform::exit_status();
}
