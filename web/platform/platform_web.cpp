// Browser implementation of platform.hpp: Emscripten's GLFW on the page's canvas, WebGL2,
// IndexedDB for storage (web_store.js, Module.twStore.*), and the JavaScript glue in
// web_pre.js (Module.tw.*). Also the exported
// C functions that the page and the browser tests call (tw_*).
#include <emscripten.h>
#include <emscripten/heap.h>
#include <emscripten/html5.h>
#include <GLFW/glfw3.h>
#include <GLES3/gl3.h>

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <ctime>
#include <deque>

#include <nlohmann/json.hpp>

#include "imgui.h"
#include "imgui_impl_glfw.h"
#include "imgui_impl_opengl3.h"
#include "platform.hpp"
#include "store.hpp"
#include "test_api.hpp"
#include "tidewright/journal/journal_diff.hpp"

namespace twapp::platform {
namespace {

GLFWwindow* g_window = nullptr;
int g_pending_frames = 3;
bool g_touch = false;
float g_ratio = 1.0f;
std::deque<TextEntryResult> g_entries;
std::deque<std::string> g_imports;
FrameFn g_frame = nullptr;
void* g_user = nullptr;

// clang-format off
EM_JS(void, js_poll_pointer, (float* out), { Module.tw.poll(out); });
EM_JS(int, js_take_dirty, (), { return Module.tw.takeDirty() ? 1 : 0; });
EM_JS(int, js_take_context_restored, (), { return Module.tw.takeContextRestored() ? 1 : 0; });
// Storage (web_store.js). Texts handed to C++ are malloc'd copies; the caller frees them.
EM_JS(char*, js_take_loaded, (int* legacy), {
  var l = Module.twStore.loaded; Module.twStore.loaded = null;
  HEAP32[legacy >> 2] = 0;
  if (!l) return 0;
  var n = lengthBytesUTF8(l.text) + 1, p = _malloc(n);
  stringToUTF8(l.text, p, n);
  HEAP32[legacy >> 2] = l.legacy ? 1 : 0;
  return p;
});
EM_JS(char*, js_take_loaded_app, (), {
  var a = Module.twStore.loadedApp; Module.twStore.loadedApp = null;
  if (!a) return 0;
  var n = lengthBytesUTF8(a) + 1, p = _malloc(n);
  stringToUTF8(a, p, n);
  return p;
});
EM_JS(int, js_store_had_records, (), { return Module.twStore.hadRecords ? 1 : 0; });
EM_JS(int, js_store_write, (const char* text, char* reason, int size), {
  var S = Module.twStore;
  if (!S.db) { stringToUTF8(S.closed || "this browser's database is not open", reason, size); return 0; }
  S.write(UTF8ToString(text)); return 1;
});
EM_JS(int, js_keep_text, (const char* name, const char* text), {
  return Module.twStore.keepText(UTF8ToString(name), UTF8ToString(text)) ? 1 : 0;
});
EM_JS(char*, js_take_update, (int* kind, int* is_error), {
  var u = Module.twStore.takeUpdate();
  if (!u) return 0;
  HEAP32[kind >> 2] = u.kind === 'records' ? 1 : u.kind === 'all' ? 2 : u.kind === 'app' ? 4 : 3;
  HEAP32[is_error >> 2] = u.error ? 1 : 0;
  var n = lengthBytesUTF8(u.text) + 1, p = _malloc(n);
  stringToUTF8(u.text, p, n);
  return p;
});
EM_JS(void, js_open_entry, (const char* key, const char* label, const char* initial, const char* hint, int numeric,
                           int live), {
  Module.tw.openEntry(UTF8ToString(key), UTF8ToString(label), UTF8ToString(initial), UTF8ToString(hint), numeric !== 0,
                      live !== 0);
});
EM_JS(int, js_entry_open, (), { return Module.tw.entryOpen() ? 1 : 0; });
EM_JS(void, js_download, (const char* name, const char* mime, const char* text), {
  Module.tw.download(UTF8ToString(name), UTF8ToString(mime), UTF8ToString(text));
});
EM_JS(void, js_pick_file, (), { Module.tw.pickFile(); });
EM_JS(void, js_first_frame, (), { Module.tw.firstFrame(); });
// (The JavaScript's empty string is written "": '' is an empty character constant to the C
// preprocessor, which reads EM_JS bodies first.)
EM_JS(void, js_set_location_screen, (const char* name), {
  var hash = '#' + UTF8ToString(name);
  if (location.hash !== hash) history.replaceState(history.state, "", hash);
});
EM_JS(void, js_location_screen, (char* out, int size), {
  stringToUTF8(decodeURIComponent(location.hash.slice(1)).slice(0, 40), out, size);
});
EM_JS(void, js_set_page_look, (int light), {
  document.documentElement.classList.toggle('light', !!light);
  var meta = document.querySelector('meta[name="theme-color"]');
  if (meta) meta.setAttribute('content', light ? '#f0f4f3' : '#0b1418');
  try { localStorage.setItem('tidewright.look', light ? 'light' : 'dark'); } catch (e) {}
});
EM_JS(void, js_set_screen_text, (const char* text), {
  var el = document.getElementById('screen-text');
  if (el) el.textContent = UTF8ToString(text);
});
// Sets the canvas's pixel size and tells Emscripten's GLFW, without glfwSetWindowSize (which
// asks for fullscreen when the size equals the screen's).
EM_JS(void, js_set_canvas_size, (int w, int h), {
  var c = Module.canvas;
  if (c.width != w) c.width = w;
  if (c.height != h) c.height = h;
  if (GLFW.active) { GLFW.active.width = w; GLFW.active.height = h; }
});
EM_JS(int, js_utc_offset_minutes, (), { return -new Date().getTimezoneOffset(); });
EM_JS(int, js_utc_offset_minutes_at, (double unix_s), { return -new Date(unix_s * 1000).getTimezoneOffset(); });
// clang-format on

// Canvas pixel size = CSS size x devicePixelRatio, checked every frame (resize, rotation,
// browser zoom and moving between screens all change one of them).
struct PixelSize {
  int w = 1, h = 1;
};
PixelSize canvas_pixel_size() {
  double css_w = 0, css_h = 0;
  emscripten_get_element_css_size("#canvas", &css_w, &css_h);
  g_ratio = static_cast<float>(emscripten_get_device_pixel_ratio());
  if (g_ratio <= 0) g_ratio = 1;
  return {std::max(1, static_cast<int>(std::lround(css_w * g_ratio))), std::max(1, static_cast<int>(std::lround(css_h * g_ratio)))};
}

void track_canvas_size() {
  const auto [w, h] = canvas_pixel_size();
  int cur_w = 0, cur_h = 0;
  glfwGetWindowSize(g_window, &cur_w, &cur_h);
  if (cur_w != w || cur_h != h) {
    js_set_canvas_size(w, h);
    g_pending_frames = std::max(g_pending_frames, 3);
  }
}

void browser_frame(void*) {
  if (!needs_frame()) return;
  if (g_pending_frames > 0) --g_pending_frames;
  g_frame(g_user);
}

}  // namespace

bool start(const StartOptions&, std::string* error) {
  if (!glfwInit()) {
    *error = "GLFW could not start";
    return false;
  }
  glfwWindowHint(GLFW_CLIENT_API, GLFW_OPENGL_ES_API);
  glfwWindowHint(GLFW_CONTEXT_VERSION_MAJOR, 3);
  glfwWindowHint(GLFW_CONTEXT_VERSION_MINOR, 0);
  // No depth or stencil buffer: ImGui draws with neither, and a phone's 1170x2532 pixels of
  // them is 12 MB. page.js asks for the same when it makes the context early (slow links).
  glfwWindowHint(GLFW_DEPTH_BITS, 0);
  glfwWindowHint(GLFW_STENCIL_BITS, 0);
  // The window (the canvas) is created at its final pixel size: WebGL allocates the drawing
  // buffer with the context, and resizing it right after costs a second allocation of a
  // phone's 1170x2532 pixels (measured about 170 ms of the start on this machine, busy).
  const PixelSize size = canvas_pixel_size();
  g_window = glfwCreateWindow(size.w, size.h, "Tidewright", nullptr, nullptr);
  if (!g_window) {
    *error = "this browser could not create a WebGL2 context";
    return false;
  }
  glfwMakeContextCurrent(g_window);
  track_canvas_size();
  ImGui_ImplGlfw_InitForOpenGL(g_window, true);
  glfwSetScrollCallback(g_window, nullptr);  // the wheel comes from web_pre.js (begin_frame)
  ImGui_ImplOpenGL3_Init("#version 300 es");
  ImGui::GetIO().IniFilename = nullptr;  // layout comes from code, not a file
  return true;
}

void stop() {
  ImGui_ImplOpenGL3_Shutdown();
  ImGui_ImplGlfw_Shutdown();
  glfwTerminate();
}

float pixel_ratio() { return g_ratio; }

void run_loop(FrameFn frame, void* user) {
  g_frame = frame;
  g_user = user;
  // 0 = the browser's animation-frame rate; idle frames return at once (browser_frame).
  emscripten_set_main_loop_arg(browser_frame, nullptr, 0, 1);
}

void begin_frame() {
  track_canvas_size();
  // The browser gave a lost WebGL context back (web_pre.js, 6): everything made on the old one
  // is gone. The OpenGL backend starts again (its NewFrame below remakes the shaders, buffers
  // and font texture): remaking only its device objects is not enough, as it keeps the sizes
  // of the old buffers and writes into the new, empty ones as if they had them. The font
  // atlas's pixels were freed after the last upload; ImGui builds them again from its fonts.
  const bool restored = js_take_context_restored() != 0;
  if (restored) {
    ImGui_ImplOpenGL3_Shutdown();
    ImGui_ImplOpenGL3_Init("#version 300 es");
    g_pending_frames = std::max(g_pending_frames, 3);
  }
  ImGui_ImplOpenGL3_NewFrame();
  if (restored) ImGui::GetIO().Fonts->ClearTexData();  // uploaded: free the CPU copy, as reload_fonts_texture does
  ImGui_ImplGlfw_NewFrame();
  float p[6] = {0, 0, 0, 0, 0, 0};
  js_poll_pointer(p);
  ImGuiIO& io = ImGui::GetIO();
  // The wheel from web_pre.js in pixels; ImGui scrolls 5 lines per notch, a browser's notch is
  // about 100 CSS pixels.
  io.MouseWheel -= p[5] / 100.0f;
  io.MousePos = p[4] > 0 ? ImVec2(p[0], p[1]) : ImVec2(-FLT_MAX, -FLT_MAX);
  io.MouseDown[0] = p[2] > 0;
  g_touch = p[3] > 0;
}

void end_frame(float r, float g, float b) {
  ImGui::Render();
  int w = 0, h = 0;
  glfwGetFramebufferSize(g_window, &w, &h);
  glViewport(0, 0, w, h);
  glClearColor(r, g, b, 1.0f);
  glClear(GL_COLOR_BUFFER_BIT);
  ImGui_ImplOpenGL3_RenderDrawData(ImGui::GetDrawData());
}

void reload_fonts_texture() {
  ImGui_ImplOpenGL3_DestroyFontsTexture();
  ImGui_ImplOpenGL3_CreateFontsTexture();
  ImGui::GetIO().Fonts->ClearTexData();
}

bool needs_frame() {
  const bool dirty = js_take_dirty() != 0;
  if (dirty) g_pending_frames = std::max(g_pending_frames, 3);
  return g_pending_frames > 0;
}
void request_frames(int n) { g_pending_frames = std::max(g_pending_frames, n); }
bool touch_input() { return g_touch; }

// ---------------------------------------------------------------- storage
// The journal in IndexedDB record by record: web_store.js. The records were read into one
// store text before main() ran (a run dependency), so loading is synchronous here; each save
// hands one change (store.hpp changes_to_text) to a readwrite transaction.
namespace {
bool g_legacy_import_pending = false;  // the first save copies the older IDBFS store in
// The database held records when the app started and nothing was saved since: a first save
// from an empty journal means the app could not read them (and kept a copy): replace them.
bool g_store_had_records = false;
// The app part as this tab last wrote or read it: a save sends only what changed since
// (store.hpp app_part_patch). Empty: the database holds none from this tab yet; send it all.
std::string g_saved_app_part;
}  // namespace

std::optional<std::string> storage_read(const std::string&) { return std::nullopt; }

bool storage_write(const std::string& name, const std::string& text, std::string* error) {
  if (js_keep_text(name.c_str(), text.c_str()) != 0) return true;
  if (error) *error = "this browser's database is not open";
  return false;
}

std::string storage_location() { return "this browser's storage (IndexedDB)"; }

std::optional<StoreLoad> store_load(const std::string&) {
  int legacy = 0;
  char* text = js_take_loaded(&legacy);
  if (!text) return std::nullopt;
  g_store_had_records = js_store_had_records() != 0;
  StoreLoad out{text, false, ""};
  std::free(text);
  // The database's app part, what the first save's patch starts from. An older store's is not
  // in the database yet (none given): the first save writes it whole.
  if (char* app = js_take_loaded_app()) {
    g_saved_app_part = app;
    std::free(app);
  }
  if (legacy) {
    g_legacy_import_pending = true;
    out.first_save_needed = true;
    out.notice = "Your data now lives in this browser's database record by record; the older copy is kept unchanged";
  }
  return out;
}

bool store_save(const std::string&, const tw::journal::Journal& saved, const tw::journal::Journal& now,
                const std::function<std::string()>&, const std::string& app_part, bool* reload, std::string* error) {
  if (reload) *reload = false;  // ids another tab took are moved in the transaction (web_store.js)
  const tw::journal::JournalChanges changes = tw::journal::diff_journals(saved, now);
  const std::string app_patch = app_part_patch(g_saved_app_part, app_part);
  const bool app_changed = !app_patch.empty();
  const bool replace_all = saved.systems.empty() && saved.events.empty() && g_store_had_records && !g_legacy_import_pending;
  if (changes.empty() && !app_changed && !g_legacy_import_pending && !replace_all) return true;
  auto doc = nlohmann::json::parse(changes_to_text(changes));
  if (app_changed) doc["app_patch"] = nlohmann::json::parse(app_patch);
  if (g_legacy_import_pending) doc["legacy_import"] = true;
  // The app started empty over records it could not read (a copy was kept): they go.
  if (replace_all) doc["replace_all"] = true;
  char reason[512];
  if (js_store_write(doc.dump().c_str(), reason, sizeof reason) == 0) {
    if (error) *error = reason;
    return false;
  }
  g_saved_app_part = app_part;
  g_legacy_import_pending = false;
  g_store_had_records = false;
  return true;
}

std::optional<StoreUpdate> poll_store_update() {
  int kind = 0, is_error = 0;
  char* text = js_take_update(&kind, &is_error);
  if (!text) return std::nullopt;
  StoreUpdate u;
  u.kind = kind == 1   ? StoreUpdate::Kind::Records
           : kind == 2 ? StoreUpdate::Kind::Everything
           : kind == 4 ? StoreUpdate::Kind::AppPart
                       : StoreUpdate::Kind::Message;
  if (u.kind == StoreUpdate::Kind::AppPart) g_saved_app_part = text;  // what the database holds now
  u.text = text;
  u.is_error = is_error != 0;
  std::free(text);
  request_frames(3);
  return u;
}

// ---------------------------------------------------------------- files
bool export_file(const std::string& file_name, const std::string& mime, const std::string& text,
                 std::string* where) {
  js_download(file_name.c_str(), mime.c_str(), text.c_str());
  if (where) *where = "your downloads, as " + file_name;  // read after "saved to"
  return true;
}
void request_import() { js_pick_file(); }
std::optional<std::string> poll_import() {
  if (g_imports.empty()) return std::nullopt;
  std::string t = std::move(g_imports.front());
  g_imports.pop_front();
  return t;
}

int exit_status() { return 0; }  // the page's loop never ends

// ---------------------------------------------------------------- text entry
void open_text_entry(const TextEntryRequest& r) {
  js_open_entry(r.key.c_str(), r.label.c_str(), r.initial.c_str(), r.hint.c_str(), r.numeric ? 1 : 0, r.live ? 1 : 0);
}
bool text_entry_open() { return js_entry_open() != 0; }
std::optional<TextEntryResult> poll_text_entry() {
  if (g_entries.empty()) return std::nullopt;
  TextEntryResult r = std::move(g_entries.front());
  g_entries.pop_front();
  return r;
}
void draw_overlays(float) {}  // the entry field is HTML (index.html #entry)
void draw_text_entry_here(const std::string&, float) {}

// ---------------------------------------------------------------- clock
std::int64_t now_unix_seconds() { return static_cast<std::int64_t>(std::time(nullptr)); }
int utc_offset_minutes() { return js_utc_offset_minutes(); }
int utc_offset_minutes_at(std::int64_t unix_s) { return js_utc_offset_minutes_at(static_cast<double>(unix_s)); }
double now_ms() { return emscripten_get_now(); }

void first_frame_drawn() { js_first_frame(); }
void set_screen_text(const std::string& text) { js_set_screen_text(text.c_str()); }
void set_location_screen(const char* name) { js_set_location_screen(name); }
void set_page_look(bool light) { js_set_page_look(light ? 1 : 0); }
std::string location_screen() {
  char name[64] = {};
  js_location_screen(name, sizeof name);
  return name;
}

// Called by the exported functions below.
void push_entry(TextEntryResult r) {
  g_entries.push_back(std::move(r));
  request_frames(3);
}
void push_import(std::string text) {
  g_imports.push_back(std::move(text));
  request_frames(3);
}

}  // namespace twapp::platform

// ---------------------------------------------------------------- exported to JavaScript
// Returned strings stay valid until the next call of the same function.
extern "C" {

EMSCRIPTEN_KEEPALIVE void tw_text_entered(const char* key, const char* text, int accepted) {
  twapp::platform::push_entry({key ? key : "", text ? text : "", accepted != 0});
}
// A live field's text so far (TextEntryRequest::live); the field stays open.
EMSCRIPTEN_KEEPALIVE void tw_text_typed(const char* key, const char* text) {
  twapp::platform::push_entry({key ? key : "", text ? text : "", false, true});
}
EMSCRIPTEN_KEEPALIVE void tw_text_cancelled(const char* key) {
  twapp::platform::push_entry({key ? key : "", "", false});
}
EMSCRIPTEN_KEEPALIVE void tw_import_text(const char* text) {
  twapp::platform::push_import(text ? text : "");
}

// Test interface (tests/browser): app state as JSON, widget rectangles by name in CSS pixels.
EMSCRIPTEN_KEEPALIVE const char* tw_test_state() {
  static std::string s;
  s = twapp::test_api::state_json();
  return s.c_str();
}
EMSCRIPTEN_KEEPALIVE const char* tw_test_journal() {
  static std::string s;
  s = twapp::test_api::journal_json();
  return s.c_str();
}
EMSCRIPTEN_KEEPALIVE const char* tw_test_widget(const char* name) {
  static std::string s;
  s = twapp::test_api::widget_json(name ? name : "", twapp::platform::pixel_ratio());
  return s.c_str();
}
EMSCRIPTEN_KEEPALIVE const char* tw_test_widgets() {
  static std::string s;
  s = twapp::test_api::widgets_json(twapp::platform::pixel_ratio());
  return s.c_str();
}
EMSCRIPTEN_KEEPALIVE void tw_test_reveal(const char* name) {
  twapp::test_api::reveal(name ? name : "");
  twapp::platform::request_frames(4);
}
EMSCRIPTEN_KEEPALIVE const char* tw_test_frame_stats() {
  static std::string s;
  s = twapp::test_api::frame_stats_json();
  return s.c_str();
}
EMSCRIPTEN_KEEPALIVE void tw_test_reset_stats() { twapp::test_api::reset_frame_stats(); }
EMSCRIPTEN_KEEPALIVE void tw_test_animate(int frames) { twapp::platform::request_frames(frames); }
EMSCRIPTEN_KEEPALIVE double tw_test_heap_bytes() { return static_cast<double>(emscripten_get_heap_size()); }

}  // extern "C"
