// The app's journal in the browser's own database, IndexedDB, record by record (included into
// tidewright.js with --pre-js; platform_web.cpp calls Module.twStore.*). Map:
//   1. the database: object stores, keys, indexes, schema version and upgrade
//   2. start: open, read every record into one store text; the one-time import of the older
//      store (one JSON text in Emscripten's IDBFS database "/persist")
//   3. a save: one readwrite transaction with only the records that changed
//   4. other tabs: a BroadcastChannel message names the records a tab wrote (and whether it
//      changed the app part); the others read just those again; a newer version in another
//      tab closes this one with a message
//   5. small named texts (the copy kept of a damaged store)
// Results for the app wait in S.updates until platform_web.cpp polls them (one per frame).

// ---------------------------------------------------------------- 1. the database
// "tidewright", version 1:
//   systems   key "id"; index "name_key" (the name in lower case, unique: two tabs cannot add
//             the same name). Value: a system as in the journal format (docs/journal-format.md)
//             plus name_key.
//   events    key "id"; index "system_time" on [system_id, time_s] and "time_s". Value: an event
//             as in the journal format (standing dose schedules are events of type "schedule")
//             plus time_s (seconds, for the indexes).
//   meta      keys "next_id" (shared id counter of systems and events), "description",
//             "record_version" (the journal format's schema_version of the records),
//             "legacy_import" (when and from where the older store was imported).
//   settings  key "app": the app's own part (store.hpp: units, text size, limits...).
//   files     key: a name; value: a text (e.g. tidewright-damaged-<time>.json).
// A later version adds to upgrade() below (one step per version; never drop a user's records).
var TW_DB_NAME = 'tidewright';
var TW_DB_VERSION = 1;
var TW_LEGACY_DB = '/persist';                      // Emscripten IDBFS: one database per mount
var TW_LEGACY_KEY = '/persist/tidewright.json';

Module.twStore = (function () {
  var S = { db: null, loaded: null, updates: [], pending: 0, rereading: 0, closed: '', writes: 0,
    lastWriteMs: 0, lastCommitAt: 0, hadRecords: false, appWanted: false, tabId: Math.random().toString(36).slice(2) };
  var channel = typeof BroadcastChannel === 'function' ? new BroadcastChannel('tidewright-journal') : null;
  S.channel = channel;

  function upgrade(db, oldVersion) {
    if (oldVersion < 1) {
      var systems = db.createObjectStore('systems', { keyPath: 'id' });
      systems.createIndex('name_key', 'name_key', { unique: true });
      var events = db.createObjectStore('events', { keyPath: 'id' });
      events.createIndex('system_time', ['system_id', 'time_s']);
      events.createIndex('time_s', 'time_s');
      db.createObjectStore('meta');
      db.createObjectStore('settings');
      db.createObjectStore('files');
    }
  }

  function say(text, isError) {
    S.updates.push({ kind: 'message', text: text, error: !!isError });
    Module.tw.dirty = true;
  }

  function open() {
    return new Promise(function (resolve, reject) {
      var req = indexedDB.open(TW_DB_NAME, TW_DB_VERSION);
      req.onupgradeneeded = function (e) { upgrade(req.result, e.oldVersion); };
      req.onblocked = function () {
        var m = document.getElementById('loading-msg');
        if (m) m.textContent = 'Tidewright was updated: close or reload the other Tidewright tabs to finish.';
      };
      req.onerror = function () { reject(req.error); };
      req.onsuccess = function () {
        var db = req.result;
        // A newer Tidewright opened in another tab: let it upgrade, and stop saving here.
        db.onversionchange = function () {
          db.close();
          S.db = null;
          S.closed = 'Tidewright was updated in another tab: reload this tab to go on saving.';
          say(S.closed, true);
        };
        resolve(db);
      };
    });
  }

  // ---------------------------------------------------------------- 2. start
  function request(r) {
    return new Promise(function (resolve, reject) { r.onsuccess = function () { resolve(r.result); }; r.onerror = function () { reject(r.error); }; });
  }

  // Every record as one store text: a journal document with the "app" member (store.hpp).
  function readAll(db) {
    var tx = db.transaction(['systems', 'events', 'meta', 'settings'], 'readonly');
    var meta = tx.objectStore('meta');
    return Promise.all([request(tx.objectStore('systems').getAll()), request(tx.objectStore('events').getAll()),
      request(meta.get('next_id')), request(meta.get('description')), request(meta.get('record_version')),
      request(tx.objectStore('settings').get('app')), request(meta.get('legacy_import'))]).then(function (r) {
      if (r[2] === undefined) return { text: null, legacyDone: r[6] !== undefined };
      var doc = { format: 'tidewright-journal', schema_version: r[4] || 3, next_id: r[2], systems: r[0], events: r[1] };
      if (r[3] !== undefined) doc.description = r[3];
      if (r[5] !== undefined) doc.app = r[5];
      return { text: JSON.stringify(doc), legacyDone: true, app: r[5] !== undefined ? JSON.stringify(r[5]) : null };
    });
  }

  // The older store's text, read straight from IDBFS's database (kept as it is); null if none.
  function readLegacy() {
    return new Promise(function (resolve) {
      var req;
      try { req = indexedDB.open(TW_LEGACY_DB); } catch (e) { resolve(null); return; }
      req.onupgradeneeded = function () { req.transaction.abort(); };  // it did not exist: create nothing
      req.onerror = function (e) { if (e.preventDefault) e.preventDefault(); resolve(null); };
      req.onsuccess = function () {
        var db = req.result;
        if (!db.objectStoreNames.contains('FILE_DATA')) { db.close(); resolve(null); return; }
        var get = db.transaction('FILE_DATA', 'readonly').objectStore('FILE_DATA').get(TW_LEGACY_KEY);
        get.onsuccess = function () {
          db.close();
          var v = get.result;
          resolve(v && v.contents ? new TextDecoder().decode(v.contents) : null);
        };
        get.onerror = function () { db.close(); resolve(null); };
      };
    });
  }

  S.start = function () {
    return open().then(function (db) {
      S.db = db;
      return readAll(db);
    }).then(function (r) {
      S.hadRecords = r.text !== null;
      if (r.text !== null || r.legacyDone) {
        S.loaded = r.text === null ? null : { text: r.text, legacy: false };
        S.loadedApp = r.app || null;  // the app part alone: what the first save's patch starts from
        return;
      }
      return readLegacy().then(function (t) { S.loaded = t ? { text: t, legacy: true } : null; });
    }).catch(function (e) {
      S.loaded = null;
      S.closed = 'This browser would not open its database (' + e + '): nothing can be saved. ' +
        'A private window or full storage can cause this.';
      say(S.closed, true);
    });
  };

  // ---------------------------------------------------------------- 3. a save
  // c: {schema_version, first_new_id, next_id, systems_put, systems_removed, events_put,
  //     events_removed, description?, app_patch?, legacy_import?, replace_all?} (platform_web.cpp).
  // app_patch: what changed in the app part since this tab last wrote or read it (store.hpp
  // app_part_patch), applied to the stored part inside this transaction, so two tabs changing
  // different settings at once both keep theirs.
  // Ids the app handed out itself (>= first_new_id) that another tab took meanwhile (below the
  // stored counter) are moved to fresh ones; the app then reads those records again.
  S.write = function (text) {
    if (!S.db) { say('Not saved: ' + (S.closed || 'the database is not open'), true); return; }
    var c = JSON.parse(text);
    var t0 = performance.now();
    var tx = S.db.transaction(['systems', 'events', 'meta', 'settings'], 'readwrite');
    var systems = tx.objectStore('systems'), events = tx.objectStore('events'), meta = tx.objectStore('meta');
    var why = '', touched = { systems: [], events: [] }, moved = false;
    function fail(reason) { if (!why) why = reason; try { tx.abort(); } catch (e) {} }
    S.pending++;
    if (c.replace_all) { systems.clear(); events.clear(); meta.clear(); }
    meta.get('legacy_import').onsuccess = function (e) {
      if (c.legacy_import && e.target.result !== undefined) fail('another tab imported the older data first');
    };
    meta.get('next_id').onsuccess = function (e) {
      var stored = c.replace_all ? 1 : (e.target.result || 1);
      var next = Math.max(stored, c.next_id), systemIds = {}, eventIds = {};
      function fresh(id, map) {
        if (id < c.first_new_id || id >= stored) return id;
        map[id] = next++;
        moved = true;
        touched[map === systemIds ? 'systems' : 'events'].push(id);  // read again: now another tab's
        return map[id];
      }
      c.systems_put.forEach(function (s) { s.id = fresh(s.id, systemIds); });
      c.events_put.forEach(function (ev) { ev.id = fresh(ev.id, eventIds); });
      c.events_removed.forEach(function (id) { events.delete(id); touched.events.push(id); });
      var putSystems = {};
      c.systems_removed.forEach(function (id) {
        systems.delete(id);
        touched.systems.push(id);
        events.index('system_time').count(IDBKeyRange.bound([id, -Infinity], [id, Infinity])).onsuccess = function (r) {
          if (r.target.result > 0) fail('the system has entries another tab added; they are shown again');
        };
      });
      c.systems_put.forEach(function (s) {
        s.name_key = s.name.toLowerCase();
        putSystems[s.id] = true;
        systems.put(s);
        touched.systems.push(s.id);
      });
      var checked = {};
      c.events_put.forEach(function (ev) {
        if (systemIds[ev.system_id]) ev.system_id = systemIds[ev.system_id];
        if (ev.schedule_id !== undefined && eventIds[ev.schedule_id]) ev.schedule_id = eventIds[ev.schedule_id];
        ev.time_s = Date.parse(ev.time) / 1000;
        if (!putSystems[ev.system_id] && !checked[ev.system_id]) {
          checked[ev.system_id] = true;
          systems.getKey(ev.system_id).onsuccess = function (r) {
            if (r.target.result === undefined) fail('the system of a new entry was removed in another tab');
          };
        }
        events.put(ev);
        touched.events.push(ev.id);
      });
      meta.put(next, 'next_id');
      meta.put(c.schema_version, 'record_version');
      if (c.description !== undefined) meta.put(c.description, 'description');
      if (c.app_patch) {
        var settings = tx.objectStore('settings');
        settings.get('app').onsuccess = function (e) { settings.put(applyAppPatch(e.target.result, c.app_patch), 'app'); };
      }
      if (c.legacy_import) meta.put({ from: TW_LEGACY_KEY + ' (IDBFS)', at: new Date().toISOString() }, 'legacy_import');
    };
    tx.oncomplete = function () {
      S.pending--;
      S.writes++;
      S.lastWriteMs = performance.now() - t0;
      S.lastCommitAt = performance.now();
      if (channel) channel.postMessage({ from: S.tabId, systems: touched.systems, events: touched.events, app: !!c.app_patch });
      if (moved) reread(touched);  // our own records under their new ids, and what took the old ones
      if (c.app_patch) S.appWanted = true;  // the stored part may hold another tab's changes too
      rereadApp();
    };
    tx.onabort = function () {
      S.pending--;
      var e = tx.error;
      if (!why && e && e.name === 'ConstraintError') why = 'another tab added a system of the same name';
      if (!why && e && e.name === 'QuotaExceededError') why = "this browser's storage is full";
      say('Not saved: ' + (why || (e ? e.message : 'the browser refused the change')) + '. The saved data is shown again.', true);
      reloadAll();
      if (c.app_patch) S.appWanted = true;
      rereadApp();
    };
  };

  // ---------------------------------------------------------------- 4. other tabs
  // Reads the named records again: each is either put (it exists) or removed (it does not).
  function reread(ids) {
    if (!S.db) return;
    S.rereading++;
    var tx = S.db.transaction(['systems', 'events', 'meta'], 'readonly');
    var out = { systems_put: [], systems_removed: [], events_put: [], events_removed: [] };
    function each(store, list, put, removed) {
      var seen = {};
      list.forEach(function (id) {
        if (seen[id]) return;
        seen[id] = true;
        tx.objectStore(store).get(id).onsuccess = function (e) {
          if (e.target.result === undefined) out[removed].push(id); else out[put].push(e.target.result);
        };
      });
    }
    each('systems', ids.systems || [], 'systems_put', 'systems_removed');
    each('events', ids.events || [], 'events_put', 'events_removed');
    tx.objectStore('meta').get('next_id').onsuccess = function (e) { out.next_id = e.target.result || 1; };
    tx.objectStore('meta').get('description').onsuccess = function (e) { if (e.target.result !== undefined) out.description = e.target.result; };
    tx.oncomplete = function () {
      S.rereading--;
      S.updates.push({ kind: 'records', text: JSON.stringify(out) });
      Module.tw.dirty = true;
    };
    tx.onabort = function () { S.rereading--; reloadAll(); };
  }

  // RFC 6902 "add" and "remove" on objects, the only operations app_part_patch writes. A parent
  // object the stored part lacks is made (it may be older than this tab's); removing a member
  // already gone does nothing.
  function applyAppPatch(stored, ops) {
    var root = stored && typeof stored === 'object' && !Array.isArray(stored) ? stored : {};
    ops.forEach(function (op) {
      var keys = op.path.split('/').slice(1).map(function (k) { return k.replace(/~1/g, '/').replace(/~0/g, '~'); });
      var at = root;
      for (var i = 0; i < keys.length - 1; i++) {
        var next = at[keys[i]];
        if (!next || typeof next !== 'object' || Array.isArray(next)) {
          if (op.op === 'remove') return;
          next = at[keys[i]] = {};
        }
        at = next;
      }
      if (op.op === 'remove') delete at[keys[keys.length - 1]]; else at[keys[keys.length - 1]] = op.value;
    });
    return root;
  }

  // Reads the stored app part for the app once no write of this tab is in flight (a write
  // still to come would make it stale; its completion asks again).
  function rereadApp() {
    if (!S.appWanted || !S.db || S.pending > 0) return;
    S.appWanted = false;
    var tx = S.db.transaction('settings', 'readonly'), part;
    tx.objectStore('settings').get('app').onsuccess = function (e) { part = e.target.result; };
    tx.oncomplete = function () {
      if (S.pending > 0) { S.appWanted = true; return; }
      if (part === undefined) return;
      S.updates.push({ kind: 'app', text: JSON.stringify(part) });
      Module.tw.dirty = true;
    };
  }

  function reloadAll() {
    if (!S.db) return;
    S.rereading++;
    readAll(S.db).then(function (r) {
      S.rereading--;
      if (r.text !== null) S.updates.push({ kind: 'all', text: r.text });
      Module.tw.dirty = true;
    }, function () { S.rereading--; });
  }

  if (channel) {
    channel.onmessage = function (e) {
      if (!e.data || e.data.from === S.tabId) return;
      reread(e.data);
      if (e.data.app) { S.appWanted = true; rereadApp(); }
    };
  }

  // ---------------------------------------------------------------- 5. small named texts
  S.keepText = function (name, text) {
    if (!S.db) return false;
    S.pending++;
    var tx = S.db.transaction('files', 'readwrite');
    tx.objectStore('files').put(text, name);
    tx.oncomplete = function () { S.pending--; rereadApp(); };
    tx.onabort = function () { S.pending--; rereadApp(); say('Could not keep ' + name + ' in this browser: ' + tx.error, true); };
    return true;
  };

  S.takeUpdate = function () { return S.updates.length ? S.updates.shift() : null; };
  return S;
})();

// The database is opened and read as soon as this script runs, while the wasm is still on its
// way: Emscripten runs preRun only once the wasm is instantiated, and reading there kept main
// waiting for IndexedDB after the download instead of during it.
Module.twStore.started = Module.twStore.start();
Module.preRun = Module.preRun || [];
Module.preRun.push(function () {
  addRunDependency('tw-store');
  Module.twStore.started.then(function () { removeRunDependency('tw-store'); });
});
