// The one door between the app and where it runs (browser or desktop).
// Two implementations, chosen by web/CMakeLists.txt: platform_web.cpp (Emscripten, GLFW on a
// canvas, WebGL2, IndexedDB) and platform_native.cpp (GLFW window, OpenGL 3, files).
// Nothing outside web/platform/ may test __EMSCRIPTEN__.
//
// Map: 1. window and frame loop  2. storage  3. files (export/import)  4. text entry
//      5. clock  6. test hooks
#pragma once

#include <cstdint>
#include <functional>
#include <optional>
#include <string>

#include "tidewright/journal/journal.hpp"

namespace twapp::platform {

// ---------------------------------------------------------------- 1. Window and frame loop
struct StartOptions {
  int exit_after_frames = 0;  // native: render this many frames, then quit (0 = run until closed)
  std::string data_dir;       // native: where the store lives (default ~/.local/share/tidewright)
  std::string script_path;    // native: drive the app by this script (native_script.hpp), then quit
};

// Creates the window, the GL context and the ImGui platform/renderer backends (the ImGui
// context must exist). Returns false with a reason in *error.
bool start(const StartOptions& options, std::string* error);
void stop();

// Device pixels per logical pixel: window.devicePixelRatio in the browser, the monitor's
// content scale on the desktop. ImGui works in device pixels; the app scales fonts and sizes
// by this once.
float pixel_ratio();

// Runs frame() until it returns false or the window closes. Written as an ordinary loop and
// adapted to the browser's animation frames inside the web implementation.
using FrameFn = bool (*)(void* user);
void run_loop(FrameFn frame, void* user);
// What the process should exit with once the loop has ended: 1 when a native --script step
// failed, else 0.
int exit_status();

// Starts an ImGui frame (backend NewFrame + pointer/touch input). Call before ImGui::NewFrame.
void begin_frame();
// Renders ImGui's draw data and presents.
void end_frame(float r, float g, float b);
// Uploads the font atlas again after the app rebuilt it (text size or pixel ratio changed),
// then frees the atlas's CPU-side pixels.
void reload_fonts_texture();
// Whether anything happened since the last drawn frame (input, resize, results arriving).
// The loop skips idle frames; request_frames() keeps drawing for n more frames.
bool needs_frame();
void request_frames(int n);
// True when the last pointer input came from a touch screen (no hover, drag to scroll).
bool touch_input();

// ---------------------------------------------------------------- 2. Storage
// Small named text blobs that survive restarts (e.g. the copy kept of a damaged store): a file
// natively; in the browser a record of IndexedDB (web_store.js, store "files"), written
// asynchronously. write() returns false with a reason.
std::optional<std::string> storage_read(const std::string& name);  // nullopt in the browser
bool storage_write(const std::string& name, const std::string& text, std::string* error);
std::string storage_location();  // for messages: "this browser" or the directory

// The app's saved state: the journal and the app's own part (settings), written record by
// record: only what changed since the last save (journal_diff.hpp), in one transaction.
// Native: the journal database <data dir>/tidewright-journal.db (core/store, the same store
// as the command line); the app part is a setting in it. Browser: IndexedDB, one record per
// system and event (web_store.js); the transaction runs after store_save returns and its
// result arrives through poll_store_update().
struct StoreLoad {
  std::string text;                // the store text: journal JSON with an "app" member (store.hpp)
  bool first_save_needed = false;  // read from an older store: save everything once
  std::string notice;              // what happened, for the user (empty: nothing to say)
};
std::optional<StoreLoad> store_load(const std::string& name);  // nullopt: nothing saved yet
// saved: the journal as last saved; now: as it is. full_text() gives the whole store text;
// app_part is the app member's JSON text. *reload is set when another copy of the app wrote
// at the same moment and some new entries got other ids: read the store again.
bool store_save(const std::string& name, const tw::journal::Journal& saved, const tw::journal::Journal& now,
                const std::function<std::string()>& full_text, const std::string& app_part, bool* reload,
                std::string* error);

// What another copy of the app (another browser tab) stored, or what a save here turned out
// to be, since the last poll (browser only; natively always nullopt).
struct StoreUpdate {
  enum class Kind { Records, Everything, Message, AppPart };
  Kind kind = Kind::Message;
  // Records: changes_to_text's layout (store.hpp); Everything: a store text; AppPart: the app
  // part as stored (after another tab's settings change or this tab's own, merged in the write).
  std::string text;
  bool is_error = false;  // Message: a failed save or a closed database
};
std::optional<StoreUpdate> poll_store_update();

// ---------------------------------------------------------------- 3. Files
// Offers text to the user as a file (a download in the browser; a file in the data
// directory natively). *where says where it went, as a place ("saved to " + *where).
bool export_file(const std::string& file_name, const std::string& mime, const std::string& text,
                 std::string* where);
// Asks the user for a file to import (file picker in the browser; a path natively, asked
// through text entry). The text arrives later through poll_import().
void request_import();
std::optional<std::string> poll_import();

// ---------------------------------------------------------------- 4. Text entry
// Phones only show their keyboard for real input elements, so text and numbers are typed into
// a platform field (an HTML <input> over the canvas; an ImGui popup natively).
struct TextEntryRequest {
  std::string key;      // who asked (widget id); comes back with the result
  std::string label;    // shown above the field, e.g. "Alkalinity (dKH)"
  std::string initial;  // starting text
  std::string hint;     // one line under the field, e.g. "Accepted 0 to 25 dKH"
  bool numeric = false; // decimal keyboard on phones
  // A field that acts as the keeper types (a list's Find field): every change of the text comes
  // back at once as a result with `typing` set, the field staying open; Cancel comes back with
  // `initial`, so the widget returns to what it showed before.
  bool live = false;
};
struct TextEntryResult {
  std::string key;
  std::string text;
  bool accepted = false;  // false = cancelled
  bool typing = false;    // a live field's text so far; the field is still open
};
void open_text_entry(const TextEntryRequest& request);
bool text_entry_open();
std::optional<TextEntryResult> poll_text_entry();
// Draws platform-side overlays that are made of ImGui (native text entry); nothing on the web.
void draw_overlays(float em);
// Desktop: draws the open text entry now if the field `key` asked for it, inside the window
// being drawn, so a popup holding the field (the switcher's Find) stays open while the entry
// has the keyboard; draw_overlays then skips it this frame. The browser's entry is HTML: nothing.
void draw_text_entry_here(const std::string& key, float em);

// ---------------------------------------------------------------- 5. Clock
std::int64_t now_unix_seconds();
int utc_offset_minutes();  // the local time zone's offset now
// The local zone's offset at an instant, daylight saving included. Times shown and typed go
// through web/src/local_time.hpp, which uses it date by date (as the command line does).
int utc_offset_minutes_at(std::int64_t unix_s);
double now_ms();           // monotonic, for frame timing

// ---------------------------------------------------------------- 6. Screen readers
// The text of the current screen, as plain lines, for a screen reader (the canvas itself is
// invisible to one). The browser puts it in the page's #screen-text region; the desktop build
// has no such channel yet and drops it.
void set_screen_text(const std::string& text);

// ---------------------------------------------------------------- 6b. The page's address
// The screen shown, kept in the browser tab's address ("#plan") with history.replaceState, so a
// reload (or a bookmark) opens that screen again; each browser tab keeps its own. Nothing is
// written to the store. The desktop build keeps nothing and always opens on Systems.
void set_location_screen(const char* name);
std::string location_screen();  // the name after '#', or "" when there is none

// ---------------------------------------------------------------- 6c. The page's own colours
// The page's loading screen and the phone keyboard sheet are HTML, drawn before the app's store
// is read: the look chosen (light or dark) is also kept in the browser's localStorage so the
// next load paints them in it from the start (page.js reads it). No-op on the desktop.
void set_page_look(bool light);

// ---------------------------------------------------------------- 7. Test hooks
// Tells the page the first frame is on screen (benchmark: navigation to first frame).
void first_frame_drawn();

}  // namespace twapp::platform
