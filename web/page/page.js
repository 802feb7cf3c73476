// Tidewright page script, run before tidewright.js (a file of its own: the content security
// policy allows no inline script). Module settings read by tidewright.js; storage, entry and
// file glue live in web/platform/web_pre.js.
// The look chosen in the app (platform::set_page_look) paints the loading screen and the entry
// sheet from the first paint on.
try {
  if (localStorage.getItem('tidewright.look') === 'light') {
    document.documentElement.classList.add('light');
    document.querySelector('meta[name="theme-color"]').setAttribute('content', '#f0f4f3');
  }
} catch (e) { /* storage refused (private mode): the dark default */ }
var Module = {
  canvas: document.getElementById('canvas'),
  print: function (t) { console.log(t); },
  printErr: function (t) { console.warn(t); },
  setStatus: function (t) {
    var m = /\((\d+(\.\d+)?)\/(\d+)\)/.exec(t || '');
    if (m) document.getElementById('loading-fill').style.width = (100 * m[1] / m[3]) + '%';
  },
  onAbort: function (what) {
    document.getElementById('loading').classList.remove('gone');
    document.getElementById('loading-msg').textContent = 'Tidewright stopped: ' + what + '. Reload the page to start again.';
  }
};
window.addEventListener('error', function (e) {
  document.getElementById('loading-msg').textContent = 'Error: ' + e.message;
});
if (typeof WebAssembly !== 'object') {
  document.getElementById('loading-msg').textContent = 'This browser has no WebAssembly; Tidewright cannot run here.';
}
// The service worker is registered once the first frame is drawn, not at 'load': 'load' comes
// as soon as tidewright.js has arrived, while the wasm is still downloading, and the worker's
// install fetches every file of the app, which on a slow phone link would share the line with
// the wasm the page is waiting for.
if ('serviceWorker' in navigator) {
  var registerWhenDrawn = function () {
    if (window.__twFirstFrameMs === undefined) { setTimeout(registerWhenDrawn, 250); return; }
    navigator.serviceWorker.register('sw.js').catch(function (e) { console.log('service worker not registered: ' + e); });
  };
  window.addEventListener('load', registerWhenDrawn);
}
// The entry form never submits anywhere: Enter confirms through web_pre.js's handlers.
document.getElementById('entry').addEventListener('submit', function (e) { e.preventDefault(); });
