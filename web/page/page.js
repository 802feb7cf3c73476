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
// Over a slow link the WebGL2 context is made here, while the wasm is still downloading, and
// tidewright.js takes it (-sGL_PREINITIALIZED_CONTEXT): making it for a phone's 1170x2532 pixels
// takes over 100 ms, which otherwise sits between the wasm's arrival and the first frame. Only
// when the wasm has not arrived 0.3 s after this script: where it comes quickly, making the
// context early competed with its compilation and the first frame came about 0.2 s later
// (bench.mjs), so the app makes it itself, as before. The canvas gets the pixel size the app
// would give it (platform_web.cpp canvas_pixel_size: CSS size x devicePixelRatio, rounded), and
// the attributes the app's GLFW window asks for (platform_web.cpp start: no depth or stencil).
setTimeout(function () {
  if (Module.ctx || Module.calledRun) return;  // the app has started and made its own
  var arrived = performance.getEntriesByType('resource').some(function (e) { return /tidewright\.wasm$/.test(e.name); });
  if (arrived) return;
  var canvas = Module.canvas, rect = canvas.getBoundingClientRect(), ratio = window.devicePixelRatio || 1;
  canvas.width = Math.max(1, Math.round(rect.width * ratio));
  canvas.height = Math.max(1, Math.round(rect.height * ratio));
  var gl = null;
  try {
    gl = canvas.getContext('webgl2', { antialias: false, alpha: true, depth: false, stencil: false });
  } catch (e) { /* the app tries again and reports it */ }
  if (gl) Module.preinitializedWebGLContext = gl;
}, 300);
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
