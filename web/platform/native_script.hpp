// The desktop app driven by a script (`tidewright-app --script FILE`), so a test can use the
// native build's real code path (GLFW window, the ImGui text entry popup, the app's widgets) as
// the browser tests use the page: taps on named widgets, typed characters, keys, and checks of
// what is listed. Native only (platform_native.cpp calls it).
//
// One step a line; blank lines and lines starting with '#' are skipped:
//   tap NAME            press and release the mouse on the centre of the widget NAME
//   type TEXT           type TEXT, one character a frame, as a keyboard does ("TEXT" in double
//                       quotes keeps spaces at its ends: type " ")
//   key escape|enter    press and release a key
//   expect PREFIX N     exactly N widgets named PREFIX<digits> were drawn in the last frame
// A step that fails prints why and the script ends with exit status 1; all done, status 0.
#pragma once

#include <string>

namespace twapp::platform::native_script {

// Reads the script; false with a reason in *error.
bool load(const std::string& path, std::string* error);
bool active();  // a script is loaded and not finished
// Between the backend's new frame and ImGui::NewFrame: this frame's mouse, characters and keys.
void apply_input();
// After a frame is drawn: checks and moves on. Returns false when the script has ended.
bool after_frame();
int exit_status();  // 1 when a step failed
std::string finished_text();  // "script: 12 steps passed" or the failure

}  // namespace twapp::platform::native_script
