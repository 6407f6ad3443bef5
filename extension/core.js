// The Go core (WebAssembly) and its training, in the context that runs
// them: in Chromium a dedicated worker of the offscreen document
// core.html (core-host.js, core-worker.js), which outlives the service
// worker, or the service worker itself until the
// reader's first press has granted "offscreen"; in Firefox the event page
// (background.js: core). The background asks for requests by name
// (requests, below), with strings, numbers and pixels. Nothing here
// touches a page.
import './wasm_exec.js';
import { restoreFindFuncTable } from './findfunc.js';

// packaged is the URL of a file of the extension: this module's
// neighbour (a dedicated worker has no extension API to ask).
const packaged = (file) => new URL(file, import.meta.url).href;

// The two builds of the Go core (extension/build.go): the overlay core
// answers every press and re-check; the report core, which adds the
// report's formats, is loaded for the first export only.
const CORES = {
  overlay: { file: 'standout.wasm', handle: 'standoutHandle', promise: null, memory: null },
  report: { file: 'standout-report.wasm', handle: 'standoutReport', promise: null, memory: null },
};

// loadCore instantiates a core once in the lifetime of the context that
// runs it and resolves to how long that took (0 when it was already running). When
// the Go program exits (it never should; a wasm memory that cannot grow
// ends it), its handle is dropped so that the next check loads a fresh
// core instead of failing in every tab.
function loadCore(core = CORES.overlay) {
  if (globalThis[core.handle]) return Promise.resolve(0);
  if (!core.promise) {
    const t0 = performance.now();
    core.promise = (async () => {
      const go = new Go();
      // The collector runs between requests only, or within one when the
      // heap reaches 256 MiB (wasm/main_js.go).
      go.env = { GOGC: 'off', GOMEMLIMIT: '256MiB' };
      const url = packaged(core.file);
      const [roomBytes, { module, instance }] = await Promise.all([
        core === CORES.overlay ? roomToReserve() : 0,
        WebAssembly.instantiateStreaming(fetch(url), go.importObject),
      ]);
      if (roomBytes > 0) go.env.STANDOUT_ROOM = String(roomBytes);
      restoreFindFuncTable(module, instance);
      core.memory = instance.exports.mem;
      go.run(instance).finally(() => dropCore(core)); // settles only when Go exits
      for (let i = 0; i < 200 && !globalThis[core.handle]; i++) {
        await new Promise((r) => setTimeout(r, 5));
      }
      if (!globalThis[core.handle]) throw new Error('the Standout core did not start');
      return performance.now() - t0;
    })().catch((e) => {
      core.promise = null;
      throw e;
    });
  }
  return core.promise;
}

// A page of memory new to the core's process costs a page fault at its
// first touch: about 2.7 ms per MB on this project's test machines
// (DEVELOPERS.md), and a fresh core's first request on a 5,000-mark
// chart meets some 15 MB of them. Between requests the core keeps the
// memory the next one needs touched (wasm/heap.go); a core loaded ahead
// of a press, as the browser starts or after the grant, has its start
// for that. So the most a request of the overlay core allocated in this
// context (its collector tells it, as standoutHandleAllocated) is kept
// in a mark for the next context's core, which touches that and a
// quarter more as it loads (wasm/heap.go: reserve). The mark counts up
// to ROOM_CAP, the project's choice: at most about 110 ms of faults at a
// load, and a document well under keep.js's large memory.
const ROOM_MARK = 'https://standout.invalid/room';
const ROOM_CAP = 32 << 20;
const ROOM_STEP = 1 << 20;
const ROOM_NOTE_MS = 100;
const room = { most: 0, written: -1 };

// roomToReserve is the bytes the mark holds, for a core loading now
// (0 without one).
async function roomToReserve() {
  try {
    const n = Number(await readMark(ROOM_MARK));
    return Number.isFinite(n) && n > 0 ? Math.min(ROOM_CAP, Math.round(n)) : 0;
  } catch {
    return 0;
  }
}

// noteRoom keeps the most a request of the overlay core has allocated in
// this context, and writes it to the mark when it moved by more than
// ROOM_STEP from what this context wrote (the first time, always).
function noteRoom() {
  const n = globalThis.standoutHandleAllocated;
  if (!Number.isFinite(n)) return;
  room.most = Math.max(room.most, n);
  if (Math.abs(room.most - room.written) > ROOM_STEP) {
    room.written = room.most;
    writeMark(ROOM_MARK, String(room.most), 'record its heap');
  }
}

function dropCore(core) {
  globalThis[core.handle] = undefined;
  core.promise = null;
  core.memory = null;
  if (core === CORES.overlay) trainer.handle = null;
}

// callCore runs one request in a core, the readings of frames of other
// origins after the page. A core that has exited is reloaded once and the
// request run again.
async function callCore(core, options, page, frames = []) {
  for (let attempt = 0; ; attempt++) {
    await loadCore(core);
    try {
      return globalThis[core.handle](options, page, ...frames);
    } catch (e) {
      if (attempt > 0 || !/exited|not a function|standoutHandle|standoutReport/i.test(String((e && e.message) || e))) throw e;
      dropCore(core);
    }
  }
}

// The overlay core is trained after a slow check. Chromium keeps a
// module's optimised code for its next load, in the service worker too,
// but only once V8 has optimised about a megabyte of its code, and V8
// optimises a function only after it has run a good while: without
// training, a check after the core's context was stopped (a worker after
// half a minute idle, an offscreen document after keep.js's time) or after the
// browser restarts runs unoptimised until eight or so checks of
// a 5,000-mark chart have run in one context (DEVELOPERS.md). So after a
// check that took the core TRAIN_MIN_MS or more, its request runs again,
// fresh (nothing recalled or kept: wasm/charts.go), a task at a time
// while the reader reads the answer, until TRAIN_BUDGET_MS of core time
// is spent in this context (and as much again for a slow check after the
// training at the install, trainAtInstall). A press stops it (begin), and
// it takes up again after the press's answer (end), on that check's
// request when it was slow too, else on the one it ran before. The first
// run tells whether the core was optimised already (loaded from
// Chromium's cache): when it is not twice as fast as the slow check,
// training ends there. Only Chromium trains (startTraining). The tests
// and the benchmark read its state in standoutTraining, on the global
// object of the context that runs the core.
const TRAIN_MIN_MS = 100;
const TRAIN_DELAY_MS = 500;
const TRAIN_GAP_MS = 20;
const TRAIN_BUDGET_MS = 2000;
const TRAIN_MAX_REQUESTS = 400;
// trainer is this context's training so far. slowMs is the first slow
// check's core time (Infinity for the install's page), 0 until there is
// one, and work the last slow check's request, which training runs
// (its pages in turn: the install's training has two).
// handle is the core's handle as the first run found it, kept until the
// core is dropped: training runs the core it was loaded for, whatever a
// test puts in the global afterwards.
const trainer = { done: true, slowMs: 0, work: null, handle: null, requests: 0, spentMs: 0, stops: 0, run: null };
// serving counts the presses between their start and their answer
// (begin and end): training waits for none to be left.
let serving = 0;

function train(checkMs, options, pages, frames, delayMs = TRAIN_DELAY_MS) {
  const t = trainer;
  if (checkMs >= TRAIN_MIN_MS) {
    // A slow check after the training at the install has a budget of its
    // own: that training's requests, many of them run unoptimised, would
    // otherwise spend most of it before the check's paths get any.
    if (t.work && t.work.atInstall && checkMs !== Infinity) t.spentMs = t.requests = 0;
    t.slowMs ||= checkMs;
    t.work = { opts: JSON.stringify({ ...JSON.parse(options), fresh: true }), pages, next: 0, frames, atInstall: checkMs === Infinity };
  }
  const handle = (t.handle ||= globalThis[CORES.overlay.handle]);
  if (serving || t.done || !t.work || (t.run && !t.run.stopped) || typeof handle !== 'function') return;
  const run = { stopped: false };
  t.run = run;
  const w = t.work;
  const report = () => {
    globalThis.standoutTraining = { requests: t.requests, spentMs: t.spentMs, stops: t.stops, running: t.run !== null, finished: t.done };
    if (reporter) reporter();
  };
  // ended says the training is over in this worker; trained, that it ran
  // to its end, which the mark records (an error answer ends it too, and
  // leaves the mark alone).
  const end = (ended, trained = ended) => {
    if (t.run === run) t.run = null;
    if (run.stopped) t.stops++;
    if (trained && !t.done) markTrained();
    t.done = t.done || ended;
    report();
  };
  const step = () => {
    if (run.stopped) return end(false);
    const t0 = performance.now();
    try {
      const page = w.pages[w.next++ % w.pages.length];
      if (!handle(w.opts, page, ...w.frames).startsWith('{"ok":true')) return end(true, false);
    } catch {
      return end(false);
    }
    const ms = performance.now() - t0;
    t.requests++;
    t.spentMs += ms;
    const optimisedAlready = t.requests === 1 && 2 * ms > t.slowMs;
    if (optimisedAlready || t.spentMs >= TRAIN_BUDGET_MS || t.requests >= TRAIN_MAX_REQUESTS) return end(true);
    report();
    setTimeout(step, TRAIN_GAP_MS);
  };
  setTimeout(step, delayMs);
}

// After an install or an update, the first press would run an untrained
// core. So the core is trained the same way on a page that ships with the
// extension (train.json, an invented scatter and bar chart, and
// train-fix.json, the same with an emphasis that needs a fix, in turn:
// extension/training.go): at once after an install, since a reader who
// has just installed Standout is likely to try it soon, and
// a while after an update (background.js), when the browser may be busy
// starting. A press stops it as it stops any training; one that comes
// first needs none (checked). The page is small, so that a press made
// while the untrained core runs it waits briefly. There is no first run
// to tell whether the core came optimised: a module new to the profile
// has no optimised code kept, and a browser update drops what was kept,
// so train is told the check was infinitely slow.
let checked = false;

// A finished training leaves a mark in the extension's Cache Storage: the
// build and the browser it was for. Chromium installs an extension loaded
// from the command line (a developer's build, and the tests' and
// benchmarks') again at every start, and keeps the optimised code across;
// the mark spares such a start a second training. An update or a browser
// update changes the stamp.
const TRAINED_MARK = 'https://standout.invalid/trained';
async function trainedStamp() {
  const m = await (await fetch(packaged('manifest.json'))).json();
  return `${m.version} ${navigator.userAgent}`;
}

// readMark resolves to the text of a mark in the extension's Cache
// Storage, or undefined when there is none.
export async function readMark(url) {
  const r = await (await caches.open('standout')).match(url);
  return r === undefined ? undefined : r.text();
}

// writeMark writes a mark. A mark only spares work, so a failure is
// reported on the console and nothing more; doing names what failed.
export function writeMark(url, text, doing) {
  caches.open('standout')
    .then((c) => c.put(url, new Response(text)))
    .catch((e) => console.warn(`Standout could not ${doing}:`, e));
}

export async function trainedAlready() {
  return (await readMark(TRAINED_MARK)) === (await trainedStamp());
}

function markTrained() {
  trainedStamp().then(
    (stamp) => writeMark(TRAINED_MARK, stamp, 'mark its core trained'),
    (e) => console.warn('Standout could not mark its core trained:', e),
  );
}

async function trainAtInstall() {
  if (checked || trainer.done) return;
  try {
    await loadCore(CORES.overlay);
    const pages = await Promise.all(['train.json', 'train-fix.json'].map(async (f) => (await fetch(packaged(f))).text()));
    if (!checked) train(Infinity, JSON.stringify({ type: 'analyse' }), pages, [], 0);
  } catch (e) {
    console.warn('Standout could not train its core:', e);
  }
}

// stopTraining stops the training between two of its requests.
function stopTraining() {
  if (trainer.run) trainer.run.stopped = true;
}

// reporter, when set (onReport), is called whenever the training's state
// changes.
let reporter = null;

// onReport asks for fn to be called whenever the training's state
// (standoutTraining) changes.
export function onReport(fn) {
  reporter = fn;
}

// state is what the context that runs the core tells of it: the
// WebAssembly memory the loaded cores hold, whether the overlay core is
// loaded, and the training's state (null before any).
export function state() {
  return { held: heldBytes(), loaded: typeof globalThis[CORES.overlay.handle] === 'function', training: globalThis.standoutTraining || null };
}

// heldBytes is the WebAssembly memory the loaded cores hold.
export function heldBytes() {
  let n = 0;
  for (const c of Object.values(CORES)) if (c.memory) n += c.memory.buffer.byteLength;
  return n;
}

// named is the core of that name.
function named(name) {
  if (!Object.hasOwn(CORES, name)) throw new Error(`no core named ${name}`);
  return CORES[name];
}

// startTraining lets the core train, in Chromium, where V8 keeps the
// optimised code for the next load: in the offscreen document
// (core-host.js), and in the worker that runs the core until the grant
// (background.js). Firefox's event page is not trained: that was not
// measured there.
export function startTraining() {
  trainer.done = false;
}

// requests are what the background asks of the core, by name, with
// strings, numbers and pixels for arguments (background.js: core).
export const requests = Object.freeze({
  // load loads a core ahead of the presses, resolving to how long that
  // took (0 when it was running).
  load: (name) => loadCore(named(name)),
  // begin marks a press's start, stopping the training until its end,
  // and loads the core it needs, resolving to how long that took (0 when
  // it was running).
  begin(name) {
    serving++;
    stopTraining();
    return loadCore(named(name));
  },
  // end marks a press's end: the training takes up again (train).
  end() {
    serving = Math.max(0, serving - 1);
    train(0);
  },
  // check runs one request in a core (the options and the page's
  // reading as the read pass wrote them, and the readings of frames of
  // other origins): its answer, a JSON string. A slow check trains the
  // overlay core.
  async check(name, options, page, frames) {
    checked = true;
    const core = named(name);
    const t0 = performance.now();
    const response = await callCore(core, options, page, frames);
    if (core === CORES.overlay && response.startsWith('{"ok":true')) {
      train(performance.now() - t0, options, [page], frames);
      // The core collects, and tells what the request allocated, a
      // moment after it answered (wasm/main_js.go: collector).
      setTimeout(noteRoom, ROOM_NOTE_MS);
    }
    return response;
  },
  // saliency judges a chart drawn as pixels (RGBA, w × h) for every
  // vision type: where the eye goes first (a JSON string).
  async saliency(pixels, w, h, severity) {
    await loadCore(CORES.overlay);
    return globalThis.standoutSaliency(pixels, w, h, severity);
  },
  // trainAtInstall trains the core after an install or an update.
  trainAtInstall,
});
