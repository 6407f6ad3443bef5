// The extension's background: it reads the page and runs the Go core
// (WebAssembly, core.js) under the extension's own CSP, so pages with
// strict CSPs are checked too. Nothing here is needed between events: if
// the browser stops the background (a service worker in Chromium, an
// event page in Firefox: platform.js), the next event finds the core in
// its offscreen document (Chromium, core-host.js) or loads it again. The
// only state kept between events is a screenshot waiting for its export
// page, for a few seconds.
import { captureTab, ext, hostsCore, keepsOptimisedCode } from './platform.js';
import { readMark, requests, startTraining, trainedAlready, writeMark } from './core.js';
import './patch.js';

// core asks the core for one of its requests (core.js: requests) and
// resolves to the answer: in Chromium from the offscreen document that
// runs it (core-host.js), in Firefox, and in Chromium until the first
// press has granted "offscreen", here. A worker keeps to one way for its
// lifetime, so that it never loads the core twice.
let coreWay = null;
function core(op, ...args) {
  coreWay ||= hostsCore() ? hosted : here;
  return coreWay(op, ...args);
}

async function here(op, ...args) {
  return requests[op](...args);
}

// The core trains in Chromium, where V8 keeps its optimised code for the
// next load (core.js: train).
if (keepsOptimisedCode) startTraining();

// The offscreen document that runs the core in Chromium, once found or
// made in this worker's lifetime; closing while closeHost closes it, and
// inFlight counts the requests awaiting its answers.
const HOST_URL = ext.runtime.getURL('core.html');
let host = null;
let closing = null;
let inFlight = 0;

// hostClient finds the document, or makes it (it outlives the worker).
async function hostClient() {
  if (closing) await closing;
  host ||= (async () => {
    for (let made = false, i = 0; i < 200; i++) {
      const c = (await clients.matchAll({ includeUncontrolled: true, type: 'window' })).find((c) => c.url === HOST_URL);
      if (c) return c.id;
      if (!made) {
        made = true;
        await ext.offscreen.createDocument({ url: 'core.html', reasons: ['WORKERS'], justification: 'Runs the WebAssembly core that checks charts in a worker that outlives the service worker.' });
      } else await new Promise((ok) => setTimeout(ok, 10));
    }
    throw new Error('the Standout core did not start');
  })().catch((e) => {
    host = null;
    throw e;
  });
  const id = await host;
  const c = await clients.get(id);
  if (c) return c;
  // Closed since (by the browser, or a closeHost of an earlier worker).
  host = null;
  return hostClient();
}

// hosted sends one request to the document and waits for its answer. A
// document that goes away meanwhile (closed by the browser, or its
// process lost) would never answer: the request fails once it is gone.
const HOST_WATCH_MS = 1000;

async function hosted(op, ...args) {
  inFlight++;
  let watch = 0;
  try {
    const c = await hostClient();
    return await new Promise((ok, fail) => {
      const ch = new MessageChannel();
      ch.port1.onmessage = ({ data }) => (data && 'error' in data ? fail(new Error(data.error)) : ok(data && data.value));
      watch = setInterval(() => {
        clients.get(c.id).then((there) => {
          if (there) return;
          host = null;
          fail(new Error('the Standout core stopped before it answered; press again'));
        }, fail);
      }, HOST_WATCH_MS);
      c.postMessage({ op, args }, [ch.port2]);
    });
  } finally {
    clearInterval(watch);
    inFlight--;
  }
}

// closeHost closes the document when it has been idle (its time in
// keep.js) and no request of this worker awaits it.
async function closeHost() {
  if (!hostsCore() || inFlight || closing) return;
  host = null;
  closing = ext.offscreen.closeDocument().catch((e) => console.warn('Standout could not close its core:', e)).finally(() => {
    closing = null;
  });
  await closing;
}

const SCRIPTS = ['constants.js', 'cvd-filters.js', 'reader.js', 'machine.js', 'patch.js', 'overlay.js'];

// The strings each tab last sent (the page's readings) and was sent (the
// core's answers to the overlay), so that the next of each crosses as a
// patch against one the other side holds (patch.js): two per tab, for
// the four tabs checked last.
const { Keeper, sent: sentChars } = globalThis.standoutPatch;
const readings = new Keeper(2, 4);
const answers = new Keeper(2, 4);

// run executes one injection in the tab and returns its result. The tab's
// activeTab grant can land a moment after the action's click event (seen
// when the action is pressed through the DevTools protocol under load):
// a refused first access is retried briefly.
async function run(tabId, injection) {
  for (let attempt = 0; ; attempt++) {
    try {
      const [res] = await ext.scripting.executeScript({ target: { tabId }, ...injection });
      return res && res.result;
    } catch (e) {
      if (attempt >= 4 || !/Cannot access|permission/i.test(String(e && e.message))) throw e;
      await new Promise((ok) => setTimeout(ok, 25 << attempt));
    }
  }
}

// readPage reads the page, or with toggle closes an open check. A press
// asks the overlay to press (pressInPage), in one round trip when the
// scripts are in the page from an earlier press; otherwise it injects
// them and press.js, whose value is the press's outcome. The scripts stay
// in the extension's isolated world until the page goes, so a page's
// presses after its first pay neither the scripts' transfer nor their
// compiling and running again (2–3 ms a press at 5,000 marks, from the
// browser benchmark's steps). A re-check asks the overlay, which is
// there, to read again.
//
// The reading crosses as a patch against one this background holds
// (readings); one against a reading it no longer holds (two reads of the
// tab crossed) is read again, whole.
async function readPage(tabId, toggle) {
  let r;
  const theirs = readings.held(tabId);
  try {
    if (toggle) {
      r = await run(tabId, { func: pressInPage, args: [theirs] });
      if (r === null) r = await run(tabId, { files: [...SCRIPTS, 'press.js'] });
    } else {
      r = await run(tabId, { func: readInPage, args: [theirs] });
    }
    if (r && !r.closed) {
      r.json = pageJSON(tabId, r);
      if (r.json === null) {
        r = await run(tabId, { func: readInPage, args: [[]] });
        r.json = pageJSON(tabId, r);
      }
    }
  } catch (e) {
    throw new Error(`reading the page: ${(e && e.message) || e}`, { cause: e });
  }
  if (!r || (!r.closed && typeof r.json !== 'string')) throw new Error('reading the page: the read pass returned nothing');
  return r;
}

// pageJSON is the reading's JSON: from its message (null when that
// patches a reading no longer held), or as an overlay of an earlier
// version, still in the page, sends it.
function pageJSON(tabId, r) {
  if (r.sent === undefined) return r.json;
  return readings.take(tabId, r.sent);
}

// pressInPage runs in the page: the press's outcome when the overlay is
// there, and null when its scripts are still to be injected.
function pressInPage(theirs) {
  return globalThis.standoutOverlay ? globalThis.standoutOverlay.press(theirs) : null;
}

// readInPage runs in the page: a reading for a re-check.
function readInPage(theirs) {
  return globalThis.standoutOverlay.read(theirs);
}

// lastCheck is the last request the core answered well, and its answer.
// The core is a function of its request alone, so a press on a page that
// has not changed since (the same read, options and frames, for the same
// core) is answered with it again: pressing to close the panel and
// pressing again costs the read, not the analysis. An answer that is an
// error is never kept.
let lastCheck = null;

const INSTALL_TRAIN_AFTER_MS = 10000;

// trainAtInstall trains the core after an install or an update (core.js),
// unless the mark says this build was trained already: then it was
// installed again as the browser started, and the core loads as at any
// start.
async function trainAtInstall() {
  try {
    if (await trainedAlready()) return loadAtStart();
    await core('trainAtInstall');
  } catch (e) {
    console.warn('Standout could not train its core:', e);
  }
}

ext.runtime.onInstalled.addListener(({ reason }) => {
  if (keepsOptimisedCode) setTimeout(trainAtInstall, reason === 'install' ? 0 : INSTALL_TRAIN_AFTER_MS);
});

// A press soon after the browser starts would wait for the core to load
// while the page is read (at 5,000 marks the reading reached the worker
// 300-430 ms into a 570-737 ms press: DEVELOPERS.md). So the core loads
// as the browser starts, from the optimised code Chromium kept of it,
// when Standout was used in the last LATELY_MS: the load costs about a
// fifth of a second of one thread and as much of V8's compile threads,
// and holds the core's memory until its document closes (its time in
// keep.js), which a browser whose reader has not checked a chart lately
// need not pay at every start. A press's worker records the time in the
// extension's Cache Storage, once in its lifetime (markPressed).
const LATELY_MS = 7 * 24 * 3600 * 1000;
const PRESSED_MARK = 'https://standout.invalid/pressed';
let pressMarked = false;

function markPressed() {
  if (pressMarked || !keepsOptimisedCode) return;
  pressMarked = true;
  writeMark(PRESSED_MARK, String(Date.now()), 'record its use');
}

async function loadAtStart() {
  if (!keepsOptimisedCode) return;
  try {
    const at = await readMark(PRESSED_MARK);
    if (at === undefined || !(Date.now() - Number(at) < LATELY_MS)) return;
    await core('load', 'overlay');
  } catch (e) {
    console.warn('Standout could not load its core:', e);
  }
}

ext.runtime.onStartup.addListener(loadAtStart);

// analyse reads the page and runs the core. It returns the core's
// response (a JSON string: {ok, overlay} or {ok, report, markdown}, or
// {ok: false, error}) with the timings of the steps and the check's
// sequence number, or {closed: true} when toggle closed an open check.
// A request for the whole report passes on the press's judgements of the
// charts drawn as pixels (judged) and a point picked on one (pick), which
// the overlay keeps, so that the report holds them.
//
// The core's training stops, and does not start, from a press to its
// answer (core.js: begin and end): its requests would hold the core when
// the read comes back, and take the processor from the page while it
// reads. Then it takes up again, on the check's request when that was
// slow, else on what it ran.
async function analyse(tabId, opts) {
  const name = opts.full ? 'report' : 'overlay';
  const loaded = core('begin', name);
  try {
    return await analyseNow(tabId, opts, name, loaded);
  } finally {
    core('end').catch((e) => console.warn('Standout could not reach its core:', e));
  }
}

async function analyseNow(tabId, { toggle = false, emphasisNodes = [], severity, full = false, phoneWidth = 0, judged, pick }, name, loaded) {
  const t0 = performance.now();
  const [read, loadMs] = await Promise.all([readPage(tabId, toggle), loaded]);
  if (read.closed) return read;
  markPressed();
  const t1 = performance.now();
  // The options and the page go to the core as two strings: the page as
  // the read pass wrote it, for the core's fast snapshot decoder.
  const frames = await readFrames(tabId, read.frames);
  const options = { type: 'analyse', emphasisNodes, full, frames: frames.places };
  if (typeof severity === 'number') options.severity = severity;
  if (phoneWidth) options.phoneWidth = phoneWidth;
  if (full && judged) options.pixels = judged;
  if (full && pick) options.pick = pick;
  const request = [name, JSON.stringify(options), read.json, ...frames.pages];
  const reused = lastCheck && lastCheck.request.length === request.length && lastCheck.request.every((s, i) => s === request[i]);
  const response = reused ? lastCheck.response : await core('check', name, request[1], read.json, frames.pages);
  const t2 = performance.now();
  if (!reused && response.startsWith('{"ok":true')) lastCheck = { request, response };
  // A press judges the charts drawn as pixels; a re-check would capture
  // the overlay's own outlines over them.
  const pixels = toggle ? await judgePixels(tabId, read, severity) : undefined;
  // The overlay's answer crosses as a patch against one the page holds;
  // the whole report goes to the export whole, and an answer to an
  // overlay of an earlier version (no holds) as that overlay reads it.
  const answer = full || !Array.isArray(read.holds) ? undefined : answers.give(tabId, response, read.holds);
  return {
    response: answer ? undefined : response,
    answer,
    pixels,
    frameOrigins: frames.missing,
    seq: read.seq,
    timing: {
      readMs: read.readMs,
      stringifyMs: read.stringifyMs,
      readTripMs: t1 - t0,
      coreLoadMs: loadMs,
      coreMs: t2 - t1,
      reused: !!reused,
      patchMs: read.patchMs,
      pageBytes: read.json.length,
      responseBytes: response.length,
      // What crossed: the reading and the answer, whole or as patches.
      readSent: read.sent ? sentChars(read.sent) : read.json.length,
      answerSent: answer ? sentChars(answer) : response.length,
    },
  };
}

// readFrames reads the frames of other origins that the read pass could
// not enter (unread: {name, url, origin, box}) from the origins the reader
// has allowed the extension (optional_host_permissions): the read pass is
// injected into the tab's frames and read where a frame's origin is one of
// those. It returns each reading with its place in the page (the frame's
// name and content box), and the origins still to be allowed.
async function readFrames(tabId, unread) {
  const list = Array.isArray(unread) ? unread.slice(0, 16) : [];
  const out = { places: [], pages: [], missing: [] };
  if (!list.length) return out;
  const origins = [...new Set(list.map((f) => f.origin).filter((o) => typeof o === 'string' && /^https?:\/\/[^/]+$/.test(o)))];
  const granted = [];
  for (const o of origins) {
    if (await ext.permissions.contains({ origins: [o + '/*'] })) granted.push(o);
    else out.missing.push(o);
  }
  if (!granted.length) return out;
  let results;
  try {
    await ext.scripting.executeScript({ target: { tabId, allFrames: true }, files: ['constants.js', 'reader.js'] });
    results = await ext.scripting.executeScript({ target: { tabId, allFrames: true }, func: readThisFrame, args: [granted] });
  } catch (e) {
    console.warn('Standout could not read the frames of other origins:', e);
    return out;
  }
  for (const f of list) {
    const r = results.find((x) => x && x.result && x.result.url === f.url);
    if (!r) continue;
    out.places.push({ prefix: f.name + '/', dx: f.box[0], dy: f.box[1] });
    out.pages.push(r.result.json);
  }
  return out;
}

// readThisFrame runs in each frame of the tab: a frame (not the top
// document) of one of the allowed origins reads itself.
function readThisFrame(origins) {
  if (window === window.top || !origins.includes(location.origin) || !globalThis.standoutReader) return null;
  return globalThis.standoutReader.readPage(document).then((p) => ({ url: location.href, json: JSON.stringify(p) }));
}

// At most this many charts drawn as pixels are scrolled into view for a
// capture in one press (each capture waits CAPTURE_GAP_MS after the last:
// Chromium allows two captures a second).
const MAX_SCROLLED = 4;
const CAPTURE_GAP_MS = 550;
// A capture right after a scroll can show a frame from before it, even
// after two animation frames (seen under load): a scrolled capture waits
// this long after the scroll too.
const SCROLL_SETTLE_MS = 200;

// judgePixels captures the visible tab (granted by activeTab) and asks the
// core where the eye goes first in each chart drawn as pixels, for every
// vision type. A chart wholly in view is judged from one capture; one
// that would fit in the window is scrolled into view for a capture of its
// own (up to MAX_SCROLLED), and the page is scrolled back to where the
// reader had it; the others are named as unseen. Captures never leave the
// extension.
async function judgePixels(tabId, read, severity) {
  const rasters = Array.isArray(read.rasters) ? read.rasters.slice(0, 16) : [];
  const v = read.view;
  if (!rasters.length || !v || !(v.w > 0 && v.h > 0)) return [];
  const sev = typeof severity === 'number' ? severity : -1;
  // Unseen until judged; large when it cannot fit in the window.
  const out = rasters.map((r) => ({ name: r.name, box: r.box, unseen: true, large: r.box[2] > v.w + 0.5 || r.box[3] > v.h + 0.5 }));
  let shots;
  try {
    shots = new TabShots(tabId, (await ext.tabs.get(tabId)).windowId);
    let shot = null;
    const later = [];
    for (const [i, r] of rasters.entries()) {
      const w = Math.round(r.box[2]);
      const h = Math.round(r.box[3]);
      if (w < 32 || h < 32 || w * h > 4 << 20 || out[i].large) continue;
      if (!inView(r.box, v)) {
        later.push(i);
        continue;
      }
      shot = shot || (await shots.take(v));
      out[i] = await judgeRaster(shot, r, sev);
    }
    for (const i of later.slice(0, MAX_SCROLLED)) {
      const r = rasters[i];
      const at = await shots.scrollTo(r.box[0] - (v.w - r.box[2]) / 2, r.box[1] - (v.h - r.box[3]) / 2, v);
      if (inView(r.box, at)) out[i] = await judgeRaster(await shots.take(at), r, sev);
    }
  } catch (e) {
    console.warn('Standout could not capture the tab for its charts drawn as pixels:', e);
  } finally {
    if (shots) await shots.scrollBack(v);
  }
  return out;
}

function inView(box, v) {
  const x = box[0] - v.x;
  const y = box[1] - v.y;
  return x >= -0.5 && y >= -0.5 && x + Math.round(box[2]) <= v.w + 0.5 && y + Math.round(box[3]) <= v.h + 0.5;
}

// TabShots captures one tab, spacing its captures, and scrolls it.
class TabShots {
  constructor(tabId, windowId) {
    this.tabId = tabId;
    this.windowId = windowId;
    this.last = 0;
    this.scrolls = 0;
    this.settled = 0;
  }

  // take captures what the tab shows, with the view it shows.
  async take(view) {
    const wait = Math.max(this.last ? this.last + CAPTURE_GAP_MS : 0, this.settled) - performance.now();
    if (wait > 0) await new Promise((ok) => setTimeout(ok, wait));
    const url = await captureTab(this.windowId);
    this.last = performance.now();
    return { bitmap: await createImageBitmap(await (await fetch(url)).blob()), view };
  }

  // scrollTo scrolls the page (instantly, after two frames are drawn)
  // and returns the view it then shows.
  async scrollTo(x, y, v) {
    this.scrolls++;
    const [sx, sy] = await run(this.tabId, { func: scrollPage, args: [Math.max(0, x), Math.max(0, y)] });
    this.settled = performance.now() + SCROLL_SETTLE_MS;
    return { x: sx, y: sy, w: v.w, h: v.h };
  }

  // scrollBack returns the page to the reader's view, if it was moved.
  async scrollBack(v) {
    if (!this.scrolls) return;
    try {
      await run(this.tabId, { func: scrollPage, args: [v.x, v.y] });
    } catch (e) {
      console.warn('Standout could not scroll the page back:', e);
    }
  }
}

// scrollPage runs in the page.
function scrollPage(x, y) {
  return new Promise((done) => {
    window.scrollTo({ left: x, top: y, behavior: 'instant' });
    requestAnimationFrame(() => requestAnimationFrame(() => done([window.scrollX, window.scrollY])));
  });
}

// judgeRaster cuts one chart out of a capture and asks the core where the
// eye goes first, for every vision type.
async function judgeRaster(shot, r, sev) {
  const v = shot.view;
  const k = shot.bitmap.width / v.w;
  const w = Math.round(r.box[2]);
  const h = Math.round(r.box[3]);
  const c = new OffscreenCanvas(w, h);
  const g = c.getContext('2d');
  g.drawImage(shot.bitmap, (r.box[0] - v.x) * k, (r.box[1] - v.y) * k, w * k, h * k, 0, 0, w, h);
  const res = JSON.parse(await core('saliency', g.getImageData(0, 0, w, h).data, w, h, sev));
  return res.ok ? { name: r.name, box: r.box, regions: res.regions } : { name: r.name, box: r.box, unseen: true };
}

// show hands the result to the overlay in the page.
async function show(tabId, result) {
  try {
    await ext.scripting.executeScript({
      target: { tabId },
      func: (r) => globalThis.standoutOverlay.show(r),
      args: [result],
    });
  } catch (e) {
    throw new Error(`showing the result: ${(e && e.message) || e}`, { cause: e });
  }
}

// toggle closes an open check, or runs one: the toolbar action's handler.
async function toggle(tab) {
  if (!tab || tab.id === undefined) return;
  // The press's steps outside the read, the core and the render, on the
  // clock the page shares (timeOrigin plus now): when the press reached
  // the background, and when its answer left for the page (the overlay
  // times the crossing; the benchmark's steps).
  const startedAt = performance.timeOrigin + performance.now();
  // The press is the gesture a permission must be asked in; "offscreen"
  // comes without a prompt, and serves from the next worker on.
  if (keepsOptimisedCode && !hostsCore()) {
    ext.permissions.request({ permissions: ['offscreen'] })
      .then((granted) => granted && setTimeout(prepareHost, HOST_AFTER_GRANT_MS))
      .catch((e) => console.warn('Standout could not ask to keep its core:', e));
  }
  let seq;
  try {
    const r = await analyse(tab.id, { toggle: true });
    seq = r.seq;
    if (!r.closed) {
      r.timing.startedAt = startedAt;
      r.timing.sentAt = performance.timeOrigin + performance.now();
      await show(tab.id, r);
    }
  } catch (e) {
    await showError(tab.id, e, seq);
  }
}

// A press that granted "offscreen" ran the core in this worker, which
// keeps to it (core); prepareHost loads the core in its document a moment
// after, while the reader reads the answer, so that the worker after this
// one finds it loaded.
const HOST_AFTER_GRANT_MS = 3000;

function prepareHost() {
  hosted('load', 'overlay').catch((e) => console.warn('Standout could not load its core:', e));
}

async function showError(tabId, e, seq) {
  const msg = String((e && e.message) || e);
  try {
    await ext.scripting.executeScript({ target: { tabId }, files: SCRIPTS });
    await ext.scripting.executeScript({ target: { tabId }, func: (m, s) => globalThis.standoutOverlay.showError(m, s === null ? undefined : s), args: [msg, seq === undefined ? null : seq] });
  } catch (e2) {
    console.warn('Standout could not run on this page:', msg, e2);
  }
}

// ---------- the PNG export ----------

// Screenshots wait here, by a random key, until their export page takes
// them (or for at most a minute).
const pendingExports = new Map();

// exportPNG captures the visible tab and opens the export page, which
// cuts the capture to the charts and offers the files. The capture stays
// in extension pages: the tab may show frames of other origins.
async function exportPNG(tab, data) {
  const url = await captureTab(tab.windowId);
  const key = crypto.randomUUID();
  pendingExports.set(key, { url, charts: data.charts, viewport: data.viewport });
  setTimeout(() => pendingExports.delete(key), 60000);
  await ext.tabs.create({ url: ext.runtime.getURL('export.html#' + key), index: tab.index + 1, openerTabId: tab.id });
}

// ---------- frames of other origins ----------

// Requests to read frames of other origins wait here, by a random key,
// until the page that asks the reader for the permission takes them.
const pendingGrants = new Map();

// askFrames opens the page that asks for the origins: a permission can be
// requested only in a click in an extension page, not in the checked page.
async function askFrames(tab, origins) {
  const key = crypto.randomUUID();
  pendingGrants.set(key, { tabId: tab.id, origins });
  setTimeout(() => pendingGrants.delete(key), 300000);
  await ext.tabs.create({ url: ext.runtime.getURL('grant.html#' + key), index: tab.index + 1, openerTabId: tab.id });
}

// recheckWithFrames runs the check again in the tab once its frames'
// origins are allowed, and brings the tab back.
async function recheckWithFrames(key) {
  const g = pendingGrants.get(key);
  pendingGrants.delete(key);
  if (!g) throw new Error('this request has expired; press Standout again on the page');
  await ext.tabs.update(g.tabId, { active: true });
  let seq;
  try {
    const r = await analyse(g.tabId, {});
    seq = r.seq;
    await show(g.tabId, r);
  } catch (e) {
    await showError(g.tabId, e, seq);
  }
}

// ---------- messages ----------

const MAX_PICKS = 100000;

const VISION_KEYS = ['normal', 'protan', 'deutan', 'tritan', 'achromat'];

// validPixels checks the press's judgements of the charts drawn as pixels
// that the overlay sends back with a request for the whole report: at
// most 16 charts, each with a few regions per vision type.
function validPixels(ps) {
  if (ps === undefined) return true;
  const region = (r) => r && typeof r === 'object' && Array.isArray(r.box) && r.box.length === 4 && r.box.every(Number.isFinite) && Number.isFinite(r.salience);
  return Array.isArray(ps) && ps.length <= 16 && ps.every((p) => p && typeof p === 'object' && typeof p.name === 'string' && p.name.length <= 200 &&
    p.regions && typeof p.regions === 'object' && !Array.isArray(p.regions) &&
    Object.entries(p.regions).every(([k, rs]) => VISION_KEYS.includes(k) && Array.isArray(rs) && rs.length <= 16 && rs.every(region)));
}

// validPick checks a point picked on a chart drawn as pixels.
function validPick(p) {
  return p === undefined || (p && typeof p === 'object' && typeof p.name === 'string' && p.name.length <= 200 && Number.isFinite(p.x) && Number.isFinite(p.y));
}

// validMessage checks a message's shape: it comes from this extension's
// own scripts in a tab (or, for the export page, from an extension page),
// and its data are what that type carries. Anything else is refused.
function validMessage(msg, sender) {
  if (!msg || typeof msg !== 'object' || sender.id !== ext.runtime.id) return false;
  const d = msg.data;
  switch (msg.type) {
    case 'standout/reanalyse':
    case 'standout/full-report':
      return !!sender.tab && d && typeof d === 'object' && Array.isArray(d.emphasisNodes) && d.emphasisNodes.length <= MAX_PICKS &&
        d.emphasisNodes.every((n) => typeof n === 'string' && n.length <= 4096 && /#\d+$/.test(n)) &&
        typeof d.severity === 'number' && d.severity >= 0 && d.severity <= 1 &&
        (d.phoneWidth === undefined || d.phoneWidth === 0 || (Number.isInteger(d.phoneWidth) && d.phoneWidth >= 200 && d.phoneWidth <= 1000)) &&
        validPixels(d.pixels) && validPick(d.pick);
    case 'standout/capture':
      return !!sender.tab && d && typeof d === 'object' && Array.isArray(d.charts) && d.charts.length <= 1000 &&
        d.charts.every((c) => c && typeof c.name === 'string' && c.name.length <= 200 && Array.isArray(c.box) && c.box.length === 4 && c.box.every(Number.isFinite)) &&
        Array.isArray(d.viewport) && d.viewport.length === 2 && d.viewport.every((v) => Number.isFinite(v) && v > 0);
    case 'standout/take-export':
      return typeof d === 'string' && d.length <= 64 && typeof sender.url === 'string' && sender.url.startsWith(ext.runtime.getURL('export.html'));
    case 'standout/ask-frames':
      return !!sender.tab && Array.isArray(d) && d.length >= 1 && d.length <= 16 && d.every((o) => typeof o === 'string' && o.length <= 300 && /^https?:\/\/[^/]+$/.test(o));
    case 'standout/take-grant':
    case 'standout/granted':
      return typeof d === 'string' && d.length <= 64 && typeof sender.url === 'string' && sender.url.startsWith(ext.runtime.getURL('grant.html'));
    case 'standout/host-idle':
      return d === undefined && sender.url === HOST_URL;
  }
  return false;
}

ext.action.onClicked.addListener((tab) => {
  toggle(tab);
});

ext.runtime.onMessage.addListener((msg, sender, sendResponse) => {
  if (!validMessage(msg, sender)) {
    console.warn('Standout: refused a message', msg && msg.type);
    return false;
  }
  const reply = (p) => {
    p.then((data) => sendResponse({ ok: true, data })).catch((e) => sendResponse({ ok: false, error: String((e && e.message) || e) }));
    return true;
  };
  switch (msg.type) {
    case 'standout/reanalyse':
    case 'standout/full-report':
      return reply(analyse(sender.tab.id, { emphasisNodes: msg.data.emphasisNodes, severity: msg.data.severity, phoneWidth: msg.data.phoneWidth || 0, full: msg.type === 'standout/full-report', judged: msg.data.pixels, pick: msg.data.pick }));
    case 'standout/capture':
      return reply(exportPNG(sender.tab, msg.data));
    case 'standout/take-export': {
      const e = pendingExports.get(msg.data);
      pendingExports.delete(msg.data);
      return reply(e ? Promise.resolve(e) : Promise.reject(new Error('this export has expired; export again from the panel')));
    }
    case 'standout/ask-frames':
      return reply(askFrames(sender.tab, msg.data));
    case 'standout/take-grant': {
      const g = pendingGrants.get(msg.data);
      return reply(g ? Promise.resolve(g.origins) : Promise.reject(new Error('this request has expired; press Standout again on the page')));
    }
    case 'standout/granted':
      return reply(recheckWithFrames(msg.data));
    case 'standout/host-idle':
      return reply(closeHost());
  }
  return false;
});
