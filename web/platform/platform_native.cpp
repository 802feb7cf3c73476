// Desktop implementation of platform.hpp: a GLFW window with OpenGL 3, files in a data
// directory, and an ImGui popup for text entry (a desktop has a keyboard).
#include <GLFW/glfw3.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <deque>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "imgui.h"
#include "imgui_impl_glfw.h"
#include "imgui_impl_opengl3.h"
#include "platform.hpp"
#include "native_script.hpp"
#include "tidewright/journal/journal_diff.hpp"
#include "tidewright/store/journal_store.hpp"
#include <nlohmann/json.hpp>

namespace twapp::platform {
namespace {

namespace fs = std::filesystem;

GLFWwindow* g_window = nullptr;
StartOptions g_options;
fs::path g_data_dir;
int g_pending_frames = 3;
int g_frames_drawn = 0;
std::deque<TextEntryResult> g_entries;
std::deque<std::string> g_imports;
const char* kImportKey = "__import_path";

// Text entry popup state (platform-side, like the browser's <input> element).
struct Entry {
  bool open = false;
  bool focus = false;
  TextEntryRequest request;
  char buffer[1024] = {};
  int drawn_frame = -1;  // ImGui frame it was last drawn in (once a frame, in place or on top)
};
Entry g_entry;

fs::path default_data_dir() {
  if (const char* xdg = std::getenv("XDG_DATA_HOME"); xdg && *xdg) return fs::path(xdg) / "tidewright";
  if (const char* home = std::getenv("HOME"); home && *home) return fs::path(home) / ".local/share/tidewright";
  return fs::current_path() / "tidewright-data";
}

}  // namespace

bool start(const StartOptions& options, std::string* error) {
  g_options = options;
  g_data_dir = options.data_dir.empty() ? default_data_dir() : fs::path(options.data_dir);
  if (!options.script_path.empty() && !native_script::load(options.script_path, error)) return false;
  std::error_code ec;
  fs::create_directories(g_data_dir, ec);
  if (!glfwInit()) {
    *error = "GLFW could not start (is there a display?)";
    return false;
  }
  glfwWindowHint(GLFW_CONTEXT_VERSION_MAJOR, 3);
  glfwWindowHint(GLFW_CONTEXT_VERSION_MINOR, 0);
  // A window that fits the screen it opens on (a fixed 480x900 put the tab bar below the edge of
  // a 1280x800 laptop screen): 1100x820 at most, 90 % of the monitor's work area at least fits.
  int width = 1100, height = 820;
  if (GLFWmonitor* monitor = glfwGetPrimaryMonitor()) {
    int x = 0, y = 0, work_w = 0, work_h = 0;
    glfwGetMonitorWorkarea(monitor, &x, &y, &work_w, &work_h);
    if (work_w > 0 && work_h > 0) {
      width = std::min(width, work_w * 9 / 10);
      height = std::min(height, work_h * 9 / 10);
    }
  }
  g_window = glfwCreateWindow(width, height, "Tidewright", nullptr, nullptr);
  if (!g_window) {
    *error = "could not open an OpenGL 3.0 window";
    glfwTerminate();
    return false;
  }
  glfwMakeContextCurrent(g_window);
  glfwSwapInterval(1);
  ImGui_ImplGlfw_InitForOpenGL(g_window, true);
  ImGui_ImplOpenGL3_Init("#version 130");
  ImGui::GetIO().IniFilename = nullptr;
  return true;
}

void stop() {
  ImGui_ImplOpenGL3_Shutdown();
  ImGui_ImplGlfw_Shutdown();
  glfwDestroyWindow(g_window);
  glfwTerminate();
}

float pixel_ratio() {
  float sx = 1, sy = 1;
  glfwGetWindowContentScale(g_window, &sx, &sy);
  int ww = 1, fw = 1, h = 1;
  glfwGetWindowSize(g_window, &ww, &h);
  glfwGetFramebufferSize(g_window, &fw, &h);
  // ImGui's GLFW backend works in window coordinates; on screens where the framebuffer is
  // larger than the window (macOS-style), the backend scales and fonts should not be doubled.
  const float fb_scale = ww > 0 ? static_cast<float>(fw) / static_cast<float>(ww) : 1.0f;
  return std::max(1.0f, sx / fb_scale);
}

void run_loop(FrameFn frame, void* user) {
  while (!glfwWindowShouldClose(g_window)) {
    if (g_options.exit_after_frames > 0 && g_frames_drawn >= g_options.exit_after_frames) break;
    if (g_pending_frames > 0 || g_options.exit_after_frames > 0 || native_script::active()) {
      glfwPollEvents();
    } else {
      glfwWaitEventsTimeout(0.5);  // idle: wake on input, or twice a second
    }
    if (g_pending_frames > 0) --g_pending_frames;
    if (!frame(user)) break;
    ++g_frames_drawn;
    if (!g_options.script_path.empty() && !native_script::after_frame()) {
      std::printf("%s\n", native_script::finished_text().c_str());
      break;
    }
  }
}

int exit_status() { return native_script::exit_status(); }

void begin_frame() {
  ImGui_ImplOpenGL3_NewFrame();
  ImGui_ImplGlfw_NewFrame();
  native_script::apply_input();  // a --script's taps and typing, over the window's own input
}

void end_frame(float r, float g, float b) {
  ImGui::Render();
  int w = 0, h = 0;
  glfwGetFramebufferSize(g_window, &w, &h);
  glViewport(0, 0, w, h);
  glClearColor(r, g, b, 1.0f);
  glClear(GL_COLOR_BUFFER_BIT);
  ImGui_ImplOpenGL3_RenderDrawData(ImGui::GetDrawData());
  glfwSwapBuffers(g_window);
}

void reload_fonts_texture() {
  ImGui_ImplOpenGL3_DestroyFontsTexture();
  ImGui_ImplOpenGL3_CreateFontsTexture();
  ImGui::GetIO().Fonts->ClearTexData();
}

bool needs_frame() { return true; }  // the loop above already waited for input
void request_frames(int n) { g_pending_frames = std::max(g_pending_frames, n); }
bool touch_input() { return false; }

// ---------------------------------------------------------------- storage
std::optional<std::string> storage_read(const std::string& name) {
  std::ifstream in(g_data_dir / name, std::ios::binary);
  if (!in) return std::nullopt;
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

bool storage_write(const std::string& name, const std::string& text, std::string* error) {
  const fs::path path = g_data_dir / name;
  const fs::path tmp = g_data_dir / (name + ".tmp");
  {
    std::ofstream out(tmp, std::ios::binary | std::ios::trunc);
    out << text;
    out.flush();
    if (!out.good()) {
      if (error) *error = "could not write " + tmp.string();
      return false;
    }
  }
  std::error_code ec;
  fs::rename(tmp, path, ec);  // atomic replace: a crash leaves the old or the new file
  if (ec) {
    if (error) *error = "could not replace " + path.string() + ": " + ec.message();
    return false;
  }
  return true;
}

std::string storage_location() { return g_data_dir.string(); }

namespace {
std::unique_ptr<tw::store::JournalStore> g_store;
fs::path database_path() { return g_data_dir / "tidewright-journal.db"; }

tw::store::JournalStore* journal_store(std::string* error) {
  if (g_store) return g_store.get();
  auto opened = tw::store::JournalStore::open(database_path().string());
  if (!opened) {
    if (error) *error = opened.error().message;
    return nullptr;
  }
  g_store = std::move(opened).value();
  return g_store.get();
}
}  // namespace

std::optional<StoreLoad> store_load(const std::string& name) {
  std::error_code ec;
  if (!fs::exists(database_path(), ec)) {
    // An older app kept everything in one JSON text: read it; the first save copies it into
    // the database, and the old file is left as it was.
    auto text = storage_read(name);
    if (!text) return std::nullopt;
    return StoreLoad{std::move(*text), true,
                     "Your data now lives in " + database_path().string() + "; the older " +
                         (g_data_dir / name).string() + " is kept unchanged"};
  }
  std::string error;
  tw::store::JournalStore* st = journal_store(&error);
  if (!st) return StoreLoad{"", false, error};  // an empty text: the app reports it as damaged
  std::ostringstream journal;
  if (!st->export_json(journal)) return StoreLoad{"", false, "the journal database could not be read"};
  auto doc = nlohmann::json::parse(journal.str(), nullptr, false);
  if (auto app = st->setting("app")) {
    auto part = nlohmann::json::parse(*app, nullptr, false);
    if (!part.is_discarded()) doc["app"] = std::move(part);
  }
  return StoreLoad{doc.dump(), false, ""};
}

bool store_save(const std::string&, const tw::journal::Journal& saved, const tw::journal::Journal& now,
                const std::function<std::string()>&, const std::string& app_part, bool* reload, std::string* error) {
  if (reload) *reload = false;
  tw::store::JournalStore* st = journal_store(error);
  if (!st) return false;
  auto applied = st->apply(tw::journal::diff_journals(saved, now));
  if (!applied) {
    if (error) *error = applied.error().message;
    return false;
  }
  if (reload) *reload = !applied->moved_ids.empty();
  if (auto s = st->set_setting("app", app_part); !s) {
    if (error) *error = s.error().message;
    return false;
  }
  return true;
}

// Only this process writes through this store object; other processes' changes show on the
// next start (the command line and a second desktop window do not notify).
std::optional<StoreUpdate> poll_store_update() { return std::nullopt; }

// ---------------------------------------------------------------- files
bool export_file(const std::string& file_name, const std::string&, const std::string& text,
                 std::string* where) {
  std::string error;
  if (!storage_write(file_name, text, &error)) {
    if (where) *where = error;
    return false;
  }
  if (where) *where = "saved as " + (g_data_dir / file_name).string();
  return true;
}

void request_import() {
  open_text_entry({kImportKey, "File to import (path)", (g_data_dir / "tidewright-export.json").string(),
                   "A Tidewright export or journal JSON file", false});
}

std::optional<std::string> poll_import() {
  if (g_imports.empty()) return std::nullopt;
  std::string t = std::move(g_imports.front());
  g_imports.pop_front();
  return t;
}

// ---------------------------------------------------------------- text entry
void open_text_entry(const TextEntryRequest& request) {
  g_entry.open = true;
  g_entry.focus = true;
  g_entry.request = request;
  std::snprintf(g_entry.buffer, sizeof g_entry.buffer, "%s", request.initial.c_str());
  request_frames(3);
}

bool text_entry_open() { return g_entry.open; }

std::optional<TextEntryResult> poll_text_entry() {
  while (!g_entries.empty()) {
    TextEntryResult r = std::move(g_entries.front());
    g_entries.pop_front();
    if (r.key != kImportKey) return r;
    if (!r.accepted) continue;
    std::ifstream in(r.text, std::ios::binary);
    std::ostringstream s;
    if (in) s << in.rdbuf();
    // An unreadable path arrives as empty text; the import action reports it.
    g_imports.push_back(s.str());
  }
  return std::nullopt;
}

namespace {
// The entry window. Begun inside a popup's Begin stack (draw_text_entry_here), ImGui counts it
// as that popup's own, and focusing it does not close the popup (ClosePopupsOverWindow).
void draw_entry_window(float em) {
  g_entry.drawn_frame = ImGui::GetFrameCount();
  const ImGuiViewport* vp = ImGui::GetMainViewport();
  ImGui::SetNextWindowPos(vp->WorkPos);
  ImGui::SetNextWindowSize(ImVec2(vp->WorkSize.x, 0));
  ImGui::PushStyleVar(ImGuiStyleVar_WindowPadding, ImVec2(em, em));
  ImGui::Begin("##entry", nullptr, ImGuiWindowFlags_NoDecoration | ImGuiWindowFlags_NoMove |
                                       ImGuiWindowFlags_AlwaysAutoResize | ImGuiWindowFlags_NoSavedSettings);
  ImGui::TextUnformatted(g_entry.request.label.c_str());
  if (g_entry.focus) {
    ImGui::SetKeyboardFocusHere();
    g_entry.focus = false;
  }
  ImGui::SetNextItemWidth(-1);
  const ImGuiInputTextFlags flags = ImGuiInputTextFlags_EnterReturnsTrue |
      (g_entry.request.numeric ? ImGuiInputTextFlags_CharsScientific : 0);
  bool accept = ImGui::InputText("##entry_text", g_entry.buffer, sizeof g_entry.buffer, flags);
  // A live field hears of every change at once (TextEntryRequest::live).
  if (g_entry.request.live && ImGui::IsItemEdited()) {
    g_entries.push_back({g_entry.request.key, g_entry.buffer, false, true});
    request_frames(3);
  }
  if (!g_entry.request.hint.empty()) ImGui::TextDisabled("%s", g_entry.request.hint.c_str());
  const ImVec2 button(6 * em, 2.75f * em);
  bool cancel = ImGui::Button("Cancel", button) || ImGui::IsKeyPressed(ImGui::GetKeyIndex(ImGuiKey_Escape));
  ImGui::SameLine();
  accept = ImGui::Button("OK", button) || accept;
  ImGui::End();
  ImGui::PopStyleVar();
  if (accept || cancel) {
    // A cancelled live field goes back to the text it opened with.
    const bool restore = cancel && !accept && g_entry.request.live;
    g_entries.push_back({g_entry.request.key, restore ? g_entry.request.initial : std::string(g_entry.buffer), accept});
    g_entry.open = false;
    request_frames(3);
  }
}
}  // namespace

void draw_text_entry_here(const std::string& key, float em) {
  if (g_entry.open && g_entry.request.key == key && g_entry.drawn_frame != ImGui::GetFrameCount()) draw_entry_window(em);
}

void draw_overlays(float em) {
  if (g_entry.open && g_entry.drawn_frame != ImGui::GetFrameCount()) draw_entry_window(em);
}

// ---------------------------------------------------------------- clock
std::int64_t now_unix_seconds() { return static_cast<std::int64_t>(std::time(nullptr)); }
int utc_offset_minutes_at(std::int64_t unix_s) {
  const auto t = static_cast<std::time_t>(unix_s);
  std::tm local{};
  localtime_r(&t, &local);
  return static_cast<int>(local.tm_gmtoff / 60);
}
int utc_offset_minutes() { return utc_offset_minutes_at(now_unix_seconds()); }
double now_ms() {
  using namespace std::chrono;
  return duration<double, std::milli>(steady_clock::now().time_since_epoch()).count();
}

void first_frame_drawn() {}
void set_screen_text(const std::string&) {}
void set_location_screen(const char*) {}
void set_page_look(bool) {}
std::string location_screen() { return {}; }

}  // namespace twapp::platform
