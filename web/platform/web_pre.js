// Browser glue for platform_web.cpp, included into tidewright.js with --pre-js (runs inside
// the Module scope). Map:
//   1. storage: in web_store.js (IndexedDB, record by record); here only the tests' wait
//   2. pointer: mouse, touch and pen as one queue (Emscripten 3.1.6's GLFW loses touch positions)
//   3. redraw flag: any input or resize asks for a frame
//   4. text entry overlay (a real <input>, so phones show their keyboard)
//   5. files: download and file picker
//   6. a lost display: the WebGL context taken away by the browser, and given back
// Functions called from C++ hang off Module.tw.

Module.tw = { dirty: true, events: [], x: -1, y: -1, down: false, touch: false, liftPending: false, wheel: 0 };

// ---------------------------------------------------------------- 1. storage
// The journal lives in IndexedDB record by record: web_store.js (Module.twStore). Tests wait
// for its writes and re-reads with flushing().
Module.tw.flushing = function () { return Module.twStore.pending > 0 || Module.twStore.rereading > 0; };

// ---------------------------------------------------------------- 2. pointer
(function () {
  var canvas = Module.canvas;
  var tw = Module.tw;
  function push(type, e) {
    var r = canvas.getBoundingClientRect();
    var sx = r.width > 0 ? canvas.width / r.width : 1, sy = r.height > 0 ? canvas.height / r.height : 1;
    tw.events.push({ type: type, x: (e.clientX - r.left) * sx, y: (e.clientY - r.top) * sy,
      touch: e.pointerType === 'touch' || e.pointerType === 'pen' });
    tw.dirty = true;
  }
  canvas.addEventListener('pointerdown', function (e) {
    if (e.button !== 0) return;
    try { canvas.setPointerCapture(e.pointerId); } catch (err) {}
    canvas.focus({ preventScroll: true });
    push('down', e); e.preventDefault();
  });
  canvas.addEventListener('pointermove', function (e) { push('move', e); });
  canvas.addEventListener('pointerup', function (e) { if (e.button === 0) push('up', e); });
  canvas.addEventListener('pointercancel', function (e) { push('up', e); });
  canvas.addEventListener('pointerleave', function (e) { if (e.pointerType === 'mouse' && !tw.down) push('leave', e); });
  canvas.addEventListener('contextmenu', function (e) { e.preventDefault(); });
  // The wheel, read here: Emscripten 3.1.6's GLFW hands ImGui the browser's deltaY (pixels,
  // positive = down) as GLFW notches (positive = up), so a turn down scrolled far up and the
  // page never moved from its top. Summed in CSS pixels (lines and pages converted).
  canvas.addEventListener('wheel', function (e) {
    tw.wheel += e.deltaY * (e.deltaMode === 1 ? 40 : e.deltaMode === 2 ? canvas.clientHeight : 1);
    tw.dirty = true;
    e.preventDefault();
  }, { passive: false });
})();

// Applies queued pointer events up to and including one button change (so a tap shorter than
// a frame is still seen as press then release). Writes x, y, down, touch, has_position.
Module.tw.poll = function (out) {
  var tw = Module.tw;
  var hasPos = tw.x >= 0;
  if (tw.liftPending && tw.events.length === 0) { tw.liftPending = false; tw.x = tw.y = -1; hasPos = false; }
  while (tw.events.length) {
    var e = tw.events.shift();
    tw.touch = e.touch;
    if (e.type === 'leave') { tw.x = tw.y = -1; hasPos = false; continue; }
    tw.x = e.x; tw.y = e.y; hasPos = true;
    if (e.type === 'down' && !tw.down) { tw.down = true; break; }
    if (e.type === 'up' && tw.down) { tw.down = false; tw.liftPending = tw.touch; break; }
  }
  if (tw.events.length || tw.liftPending) tw.dirty = true;
  HEAPF32[(out >> 2) + 0] = tw.x;
  HEAPF32[(out >> 2) + 1] = tw.y;
  HEAPF32[(out >> 2) + 2] = tw.down ? 1 : 0;
  HEAPF32[(out >> 2) + 3] = tw.touch ? 1 : 0;
  HEAPF32[(out >> 2) + 4] = hasPos ? 1 : 0;
  HEAPF32[(out >> 2) + 5] = tw.wheel;  // CSS pixels down since the last poll
  tw.wheel = 0;
};

// ---------------------------------------------------------------- 3. redraw flag
['keydown', 'keyup', 'wheel', 'resize', 'orientationchange', 'focus'].forEach(function (t) {
  window.addEventListener(t, function () { Module.tw.dirty = true; }, true);
});
if (window.visualViewport) window.visualViewport.addEventListener('resize', function () { Module.tw.dirty = true; });
Module.tw.takeDirty = function () { var d = Module.tw.dirty; Module.tw.dirty = false; return d; };

// ---------------------------------------------------------------- 4. text entry
(function () {
  var form = document.getElementById('entry');
  var input = document.getElementById('entry-input');
  var key = '';
  var live = false;    // the field asked for its text as it is typed (a list's Find field)
  var initial = '';    // what a live field goes back to on Cancel
  function close(accepted) {
    if (!form.classList.contains('open')) return;
    form.classList.remove('open');
    input.blur();
    var text = accepted || !live ? input.value : initial;
    Module.ccall('tw_text_entered', null, ['string', 'string', 'number'], [key, text, accepted ? 1 : 0]);
    Module.tw.dirty = true;
    Module.canvas.focus({ preventScroll: true });
  }
  // Registered before GLFW's own window listeners (this file runs first), so keys typed in the
  // field never reach the app as shortcuts and Backspace keeps working.
  ['keydown', 'keypress', 'keyup'].forEach(function (t) {
    window.addEventListener(t, function (e) {
      if (e.target !== input) return;
      e.stopImmediatePropagation();
      if (t === 'keydown' && e.key === 'Enter') { e.preventDefault(); close(true); }
      if (t === 'keydown' && e.key === 'Escape') { e.preventDefault(); close(false); }
    }, true);
  });
  // A live field gets each change at once (a phone's keyboard gives no key events to count on,
  // only 'input'), without closing.
  input.addEventListener('input', function () {
    if (!live || !form.classList.contains('open')) return;
    Module.ccall('tw_text_typed', null, ['string', 'string'], [key, input.value]);
    Module.tw.dirty = true;
  });
  document.getElementById('entry-ok').addEventListener('click', function () { close(true); });
  document.getElementById('entry-cancel').addEventListener('click', function () { close(false); });
  Module.tw.openEntry = function (k, label, text, hint, numeric, isLive) {
    key = k;
    live = isLive;
    initial = text;
    document.getElementById('entry-label').textContent = label;
    document.getElementById('entry-hint').textContent = hint;
    input.setAttribute('inputmode', numeric ? 'decimal' : 'text');
    input.setAttribute('aria-label', label);
    input.value = text;
    form.classList.add('open');
    input.focus();
    input.select();
  };
  Module.tw.entryOpen = function () { return form.classList.contains('open'); };
})();

// ---------------------------------------------------------------- 5. files
Module.tw.download = function (name, mime, text) {
  var url = URL.createObjectURL(new Blob([text], { type: mime }));
  var a = document.createElement('a');
  a.href = url; a.download = name; a.style.display = 'none';
  document.body.appendChild(a); a.click(); document.body.removeChild(a);
  setTimeout(function () { URL.revokeObjectURL(url); }, 10000);
};
(function () {
  var picker = document.getElementById('import-file');
  picker.addEventListener('change', function () {
    var f = picker.files && picker.files[0];
    if (!f) return;
    var reader = new FileReader();
    reader.onload = function () {
      // Heap copy, not ccall's stack copy: a journal can be larger than the stack.
      var text = String(reader.result);
      var n = lengthBytesUTF8(text) + 1;
      var ptr = Module._malloc(n);
      stringToUTF8(text, ptr, n);
      Module._tw_import_text(ptr);
      Module._free(ptr);
      Module.tw.dirty = true;
    };
    reader.readAsText(f);
  });
  Module.tw.pickFile = function () { picker.value = ''; picker.click(); };
})();

Module.tw.firstFrame = function () {
  window.__twFirstFrameMs = performance.now();
  var l = document.getElementById('loading');
  if (l) l.classList.add('gone');
};

// ---------------------------------------------------------------- 6. a lost display
// A browser may take the WebGL context away (a phone's tab long in the background, a GPU
// reset, too many contexts open) and give it back later. Until then nothing can be drawn: the
// page says so over the blank canvas, and the app goes on taking taps underneath (the notice
// lets them through), so nothing typed or tapped is lost. When the context comes back,
// platform_web.cpp remakes the GL objects (shaders, buffers, the font texture) and draws on.
(function () {
  var loading = document.getElementById('loading');
  Module.canvas.addEventListener('webglcontextlost', function (e) {
    e.preventDefault();  // without it the browser never gives the context back
    if (!loading) return;
    loading.classList.remove('gone');
    loading.classList.add('lost');
    document.getElementById('loading-msg').textContent =
      'The browser took the display away (its WebGL context was lost). Your data is saved, and ' +
      'Tidewright comes back by itself when the browser gives the display back; reloading the page also brings it back.';
  });
  Module.canvas.addEventListener('webglcontextrestored', function () {
    Module.tw.contextRestored = true;
    Module.tw.dirty = true;
    if (!loading) return;
    loading.classList.remove('lost');
    // Lost while still loading: the loading notice stays until the first frame (firstFrame).
    if (window.__twFirstFrameMs !== undefined) loading.classList.add('gone');
    document.getElementById('loading-msg').textContent = '';
  });
  Module.tw.takeContextRestored = function () {
    var r = Module.tw.contextRestored;
    Module.tw.contextRestored = false;
    return r;
  };
})();
