// A script of taps, typing, keys and checks for the desktop app (native_script.hpp).
#include "native_script.hpp"

#include <GLFW/glfw3.h>
#include <imgui.h>

#include <cstdio>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>
#include <vector>

#include "test_api.hpp"

namespace twapp::platform::native_script {

namespace {

struct Step {
  int line = 0;
  std::string verb, arg;
};

std::vector<Step> g_steps;  // NOLINT: the one script of this process
std::size_t g_step = 0;
int g_frame_in_step = 0;  // frames since the step began
int g_warm_up = 10;       // frames drawn before the first step: the store loaded, widgets placed
bool g_loaded = false;
int g_status = 0;
std::string g_result;

// Frames a step takes: input on the first, then frames for the app to answer (a text entry's
// result arrives a frame after it is typed, a list narrows the frame after that).
constexpr int kSettleFrames = 4;

void fail(const Step& s, const std::string& why) {
  g_status = 1;
  g_result = "script line " + std::to_string(s.line) + " (" + s.verb + " " + s.arg + "): " + why;
  g_step = g_steps.size();
}

nlohmann::json widgets() { return nlohmann::json::parse(test_api::widgets_json(1.0f)); }

int count_named(const std::string& prefix) {
  int n = 0;
  for (const auto& [name, rect] : widgets().items()) {
    if (name.size() <= prefix.size() || name.compare(0, prefix.size(), prefix) != 0) continue;
    if (name.find_first_not_of("0123456789", prefix.size()) == std::string::npos) ++n;
  }
  return n;
}

int key_of(const std::string& name) {
  if (name == "escape") return GLFW_KEY_ESCAPE;
  if (name == "enter") return GLFW_KEY_ENTER;
  return -1;
}

}  // namespace

bool load(const std::string& path, std::string* error) {
  std::ifstream in(path);
  if (!in) {
    *error = "cannot read the script " + path;
    return false;
  }
  std::string text;
  for (int line = 1; std::getline(in, text); ++line) {
    const std::size_t b = text.find_first_not_of(" \t");
    if (b == std::string::npos || text[b] == '#') continue;
    Step s;
    s.line = line;
    const std::size_t sp = text.find(' ', b);
    s.verb = text.substr(b, sp == std::string::npos ? std::string::npos : sp - b);
    s.arg = sp == std::string::npos ? "" : text.substr(sp + 1);
    // A quoted argument keeps its spaces: type " " types one space.
    if (s.arg.size() >= 2 && s.arg.front() == '"' && s.arg.back() == '"') s.arg = s.arg.substr(1, s.arg.size() - 2);
    const bool known = s.verb == "tap" || s.verb == "type" || s.verb == "expect" ||
                       (s.verb == "key" && key_of(s.arg) >= 0);
    if (!known || s.arg.empty()) {
      *error = path + " line " + std::to_string(line) + ": not a step: " + text;
      return false;
    }
    g_steps.push_back(s);
  }
  g_loaded = true;
  return true;
}

bool active() { return g_loaded && g_step < g_steps.size(); }

void apply_input() {
  if (!active() || g_warm_up > 0) return;
  ImGuiIO& io = ImGui::GetIO();
  const Step& s = g_steps[g_step];
  if (s.verb == "tap" && g_frame_in_step < 2) {
    const auto w = nlohmann::json::parse(test_api::widget_json(s.arg, 1.0f));
    if (!w.value("found", false) || !w.value("visible", false)) return fail(s, "the widget is not on screen");
    io.MousePos = ImVec2(w["x"].get<float>() + w["w"].get<float>() / 2, w["y"].get<float>() + w["h"].get<float>() / 2);
    io.MouseDown[0] = g_frame_in_step == 0;  // pressed on the first frame, released on the second
  } else if (s.verb == "type" && g_frame_in_step < static_cast<int>(s.arg.size())) {
    io.AddInputCharacter(static_cast<unsigned char>(s.arg[static_cast<std::size_t>(g_frame_in_step)]));
  } else if (s.verb == "key") {
    io.KeysDown[key_of(s.arg)] = g_frame_in_step == 0;
  }
}

bool after_frame() {
  if (!g_loaded) return true;
  if (g_step >= g_steps.size()) return false;
  if (g_warm_up > 0) {
    --g_warm_up;
    return true;
  }
  const Step& s = g_steps[g_step];
  if (s.verb == "expect") {
    const std::size_t sp = s.arg.rfind(' ');
    const std::string prefix = s.arg.substr(0, sp);
    const int want = sp == std::string::npos ? -1 : std::atoi(s.arg.c_str() + sp + 1);
    const int got = count_named(prefix);
    std::printf("script line %d: %d widgets named %s<n>\n", s.line, got, prefix.c_str());
    if (got != want) fail(s, "found " + std::to_string(got) + ", expected " + std::to_string(want));
    else ++g_step;
    g_frame_in_step = 0;
  } else {
    const int frames = (s.verb == "type" ? static_cast<int>(s.arg.size()) : 1) + kSettleFrames;
    if (++g_frame_in_step >= frames) {
      ++g_step;
      g_frame_in_step = 0;
    }
  }
  if (g_step >= g_steps.size() && g_status == 0) g_result = "script: " + std::to_string(g_steps.size()) + " steps passed";
  return g_step < g_steps.size();
}

int exit_status() { return g_status; }
std::string finished_text() { return g_result; }

}  // namespace twapp::platform::native_script
