// The overlay: outlines on the page's charts, a panel of findings, picking
// the intended emphasis, the CVD preview and export. It lives in a closed
// shadow root on one host element, builds its DOM with createElement and
// textContent only, and leaves the page exactly as it found it when it
// closes.
(() => {
  if (globalThis.standoutOverlay) return;

  const SVG_NS = 'http://www.w3.org/2000/svg';
  const XHTML_NS = 'http://www.w3.org/1999/xhtml';
  const VISIONS = ['normal', 'protan', 'deutan', 'tritan', 'achromat'];

  // The visual language, redundant for readers with CVD: each verdict
  // differs in line width and style and in a corner mark, not in colour
  // alone (internal/report/look.go, generated into constants.js; the
  // annotated PNGs of the command line draw the same).
  const STYLE = {};
  const WORDS = {};
  const VERDICT_OF = {};
  for (const v of globalThis.standoutConstants.VERDICTS) {
    STYLE[v.verdict] = v;
    WORDS[v.verdict] = v.words;
    VERDICT_OF[v.letter] = v.verdict;
  }

  const INK = globalThis.standoutConstants.INK;
  const CSS = `
  :host { all: initial; }
  .layer { position: absolute; overflow: visible; pointer-events: none; }
  .panel { position: fixed; top: 12px; right: 12px; width: 360px; max-height: calc(100vh - 24px); overflow: auto;
    background: ${INK.paper}; color: ${INK.ink}; font: 13px/1.45 system-ui, sans-serif; border: 2px solid ${INK.ink};
    border-radius: 6px; box-shadow: 0 4px 18px rgba(0,0,0,.25); pointer-events: auto; padding: 10px 12px; }
  .panel h1 { font-size: 15px; margin: 0 0 6px; }
  .panel h2 { font-size: 13px; margin: 10px 0 4px; }
  .panel p { margin: 4px 0; }
  .panel button, .panel select, .panel input { font: inherit; pointer-events: auto; }
  .panel button { border: 1px solid ${INK.ink}; background: ${INK.wash}; border-radius: 4px; padding: 2px 8px; cursor: pointer; }
  .panel button[aria-pressed="true"] { background: ${INK.ink}; color: ${INK.paper}; }
  .panel button:focus-visible, .panel select:focus-visible, .panel input:focus-visible, .finding:focus-visible { outline: 3px solid ${INK.focus}; outline-offset: 1px; }
  .row { display: flex; flex-wrap: wrap; gap: 6px; align-items: center; margin: 6px 0; }
  .findings { list-style: none; padding: 0; margin: 4px 0; }
  .finding { display: block; width: 100%; text-align: left; border: 1px solid ${INK.rule}; background: ${INK.paper}; border-radius: 4px;
    padding: 4px 6px; margin: 3px 0; cursor: default; }
  .finding .sev { font-weight: 700; text-transform: uppercase; font-size: 11px; margin-right: 4px; }
  .finding[data-sev="error"] { border-left: 5px solid ${INK.ink}; }
  .finding[data-sev="warning"] { border-left: 5px dashed ${INK.ink}; }
  .finding[data-sev="info"] { border-left: 5px dotted ${INK.ink}; }
  code { font: 12px ui-monospace, monospace; background: ${INK.wash}; padding: 1px 3px; border-radius: 3px; }
  .key svg { vertical-align: middle; }
  .evidence { display: block; font-size: 11px; color: ${INK.quiet}; margin-top: 2px; }
  .rule { font: 11px/1.4 ui-monospace, monospace; white-space: pre-wrap; overflow-wrap: anywhere; max-height: 8em; overflow: auto; background: ${INK.wash}; border: 1px solid ${INK.rule}; padding: 4px 6px; margin: 4px 0; user-select: all; }
  .glossary { font-size: 12px; margin-top: 8px; } .glossary dt { font-weight: 600; margin-top: 4px; } .glossary dd { margin: 0 0 0 8px; }
  .caution { font-size: 11px; color: ${INK.quiet}; border-top: 1px solid ${INK.rule}; margin-top: 8px; padding-top: 6px; }
  .catcher { position: fixed; inset: 0; pointer-events: auto; cursor: crosshair; background: transparent; }
  .error { border-color: ${INK.alert}; }
  @media (prefers-reduced-motion: reduce) { * { transition: none !important; animation: none !important; } }
  `;

  // The overlay's state. machine is the phase and the awaited check's seq
  // (machine.js decides every transition; dispatch applies them). view is
  // what the reader chose (preview vision, severity in tenths, scope); the
  // panel is drawn from it, never read back.
  const M = globalThis.standoutMachine;
  // The view model: what the reader chose (preview vision, severity in
  // tenths, scope; picking, and the picked marks as "chart path#snapshot
  // node"). Only teardown resets it.
  const initialView = () => ({ vision: 'off', tenths: 10, scope: 'charts', picking: false, picked: new Set(), phone: false });

  // PHONE_WIDTH is the phone the panel judges a chart on: a common narrow
  // viewport in CSS px (common practice).
  const PHONE_WIDTH = 360;
  // How long after the read a check still on its way shows the busy panel:
  // about 0.1 s still feels instantaneous, so quicker answers need no sign
  // of progress (Nielsen 1993, Usability Engineering, ch. 5; from memory).
  const BUSY_AFTER_MS = 100;
  // The strings this page last sent the background (its readings) and
  // received from it (the core's answers), so that the next of each
  // crosses as a patch against one the other side holds (patch.js). They
  // live as long as the page, across closes.
  const sentReadings = new globalThis.standoutPatch.Keeper(2, 1);
  const heldAnswers = new globalThis.standoutPatch.Keeper(2, 1);
  const state = {
    machine: M.initial(),
    view: initialView(),
    host: null,
    root: null,
    panel: null,
    layers: new Map(), // path → {svg, entry, readBox, chart, highlight, selection}
    catcher: null,
    observers: [],
    listeners: [],
    preview: null, // {svg, restored: [{el, attr, after, value, priority, url}]}
    container: null, // what ensureHost put on the page: the host, or its <foreignObject>
    emphasis: [], // the picks the shown check ran with
    rerunTimer: 0,
    frame: 0,
    pixels: null, // the press's judgements of the charts drawn as pixels
    pixelPick: null, // {name, x, y}: a point picked on one of them, in its px
  };

  const isOpen = () => M.isOpen(state.machine);

  // setView changes the view model and shows it.
  function setView(change) {
    const before = state.view;
    state.view = Object.assign({}, before, change);
    const v = state.view;
    renderView(v.vision !== before.vision || v.tenths !== before.tenths || v.scope !== before.scope);
  }

  // renderView is the one function that shows the view model: the panel's
  // controls, the picking layer, the picked marks and, when it changed
  // (or the charts were drawn anew), the CVD preview.
  function renderView(previewChanged) {
    const v = state.view;
    const control = (a) => state.panel && state.panel.querySelector(`[data-action="${a}"]`);
    const pick = control('pick');
    if (pick) pick.setAttribute('aria-pressed', String(v.picking));
    const cvd = control('cvd');
    if (cvd) cvd.value = v.vision;
    const sev = control('severity');
    if (sev) {
      sev.value = String(v.tenths);
      sev.setAttribute('aria-valuetext', (v.tenths / 10).toFixed(1));
    }
    const scope = control('scope');
    if (scope) scope.value = v.scope;
    showCatcher(v.picking);
    showSelection();
    if (previewChanged) setPreview();
  }

  // dispatch moves the machine on by one event and carries out the
  // effects it asks for; it returns the effects. payload is the answer to
  // render or the error to show.
  function dispatch(ev, payload) {
    const { machine, effects } = M.next(state.machine, ev);
    state.machine = machine;
    try {
      for (const e of effects) {
        if (e === 'teardown') teardown();
        else if (e === 'unwatch') stopObserving();
        else if (e === 'error') showError(payload);
        else if (e === 'render') renderAnswer(payload);
        else if (e === 'watch') observeCharts();
      }
    } finally {
      if (state.host) state.host.setAttribute('data-state', machine.phase === 'shown' ? 'ready' : machine.phase);
    }
    return effects;
  }

  // el makes an HTML element, in the XHTML namespace so that it is one in
  // a standalone SVG document too (createElement would make a plain XML
  // element there, without focus() or HTML styling).
  function el(tag, attrs, text) {
    const e = document.createElementNS(XHTML_NS, tag);
    for (const [k, v] of Object.entries(attrs || {})) e.setAttribute(k, v);
    if (text !== undefined) e.textContent = text;
    return e;
  }

  function svgEl(tag, attrs) {
    const e = document.createElementNS(SVG_NS, tag);
    for (const [k, v] of Object.entries(attrs || {})) e.setAttribute(k, String(v));
    return e;
  }

  // trusted wraps an event handler so that only events the browser made
  // from the reader's own input reach it: the page can dispatch synthetic
  // events (isTrusted false) but never make a trusted one.
  function trusted(fn) {
    return (ev) => {
      if (ev.isTrusted) fn(ev);
    };
  }

  // on listens on an element of the overlay, for trusted events only.
  function on(target, type, fn) {
    target.addEventListener(type, trusted(fn));
  }

  // listen listens on the page's window until teardown, for trusted
  // events only.
  function listen(target, type, fn, opts) {
    const f = trusted(fn);
    target.addEventListener(type, f, opts);
    state.listeners.push([target, type, f, opts]);
  }

  // r2 rounds to hundredths, so that path data stays short.
  function r2(v) {
    return Math.round(v * 100) / 100;
  }

  // rectPath outlines the marks at indices idx of a digest chart (digest
  // boxes are x y width height, flat), relative to (offX, offY), grown by
  // grow px on every side.
  function rectPath(chart, idx, offX, offY, grow) {
    const b = chart.boxes;
    let d = '';
    for (const i of idx) {
      const w = r2(b[4 * i + 2] + 2 * grow);
      d += `M${r2(b[4 * i] - offX - grow)},${r2(b[4 * i + 1] - offY - grow)}h${w}v${r2(b[4 * i + 3] + 2 * grow)}h${-w}Z`;
    }
    return d;
  }

  // cornerPath draws the verdict's corner mark at each mark's top right.
  function cornerPath(chart, idx, offX, offY, corner) {
    const b = chart.boxes;
    let d = '';
    for (const i of idx) {
      const x = r2(b[4 * i] + b[4 * i + 2] - offX + 1.5);
      const y = r2(b[4 * i + 1] - offY - 1.5);
      d += corner === 'notch' ? `M${x},${y}l7,0l-7,7Z` : `M${x + 3.5},${y}a3.5,3.5 0 1,0 -7,0a3.5,3.5 0 1,0 7,0Z`;
    }
    return d;
  }


  // bandAlong outlines a line or rule along its path (digest path: index,
  // stroke width, then x y pairs), as the command line's pictures do: a
  // band of the verdict's ink a little outside the line on both sides, on
  // a halo, cut out by a mask so that the line itself stays in view.
  function bandAlong(svg, path, readBox, st) {
    let d = '';
    for (let k = 2; k + 1 < path.length; k += 2) d += `${k === 2 ? 'M' : 'L'}${r2(path[k] - readBox[0])},${r2(path[k + 1] - readBox[1])}`;
    const inner = path[1] + 3; // the line and a 1.5 px gap on each side
    const outer = inner + 2 * st.width;
    const id = 'standout-band-' + Math.random().toString(36).slice(2);
    const line = (stroke, width) => svgEl('path', { d, fill: 'none', stroke, 'stroke-width': width, 'stroke-linejoin': 'round', 'stroke-linecap': 'round' });
    const mask = svgEl('mask', { id, maskUnits: 'userSpaceOnUse', x: -1e4, y: -1e4, width: 2e4, height: 2e4 });
    mask.append(line('white', outer + 2), line('black', inner)); // a mask's luminance: shown, cut
    svg.appendChild(mask);
    const halo = line(INK.paper, outer + 2);
    const ink = line(st.colour, outer);
    for (const p of [halo, ink]) p.setAttribute('mask', `url(#${id})`);
    ink.setAttribute('data-verdict', st.verdict);
    ink.setAttribute('data-along', '');
    if (st.dash) ink.setAttribute('stroke-dasharray', st.dash);
    svg.append(halo, ink);
  }

  // byVerdict lists a chart's mark indices per verdict.
  function byVerdict(chart) {
    const out = { pops: [], conjunction: [], blends: [] };
    const v = chart.verdicts;
    for (let i = 0; i < v.length; i++) out[VERDICT_OF[v[i]] || 'blends'].push(i);
    return out;
  }

  // ---------- layers ----------

  function chartEntries() {
    const problems = [];
    const map = new Map();
    for (const e of globalThis.standoutReader.findCharts(document, problems)) map.set(e.path, e);
    return map;
  }

  // boxOf is a chart's current box in page px: followed through the
  // document, or, for a chart in a frame of another origin, which the page
  // cannot measure, where it was read.
  function boxOf(entry) {
    return entry.fixed || globalThis.standoutReader.pageBox(entry);
  }

  function drawLayers(page) {
    for (const l of state.layers.values()) l.svg.remove();
    state.layers.clear();
    const entries = chartEntries();
    for (const c of page.charts) {
      if (!c.isChart) continue;
      // A chart of a frame the read pass could not enter was read by the
      // background: it stays where it was read.
      const entry = entries.get(c.path) || (/^frame\d+\//.test(c.path) ? { fixed: c.box } : null);
      if (!entry) continue;
      const svg = svgEl('svg', { class: 'layer', 'data-chart': c.path, 'aria-hidden': 'true' });
      const readBox = c.box;
      const groups = byVerdict(c);
      const paths = new Map((c.paths || []).map((p) => [p[0], p]));
      for (const v of ['blends', 'conjunction', 'pops']) {
        for (const i of groups[v]) if (paths.has(i)) bandAlong(svg, paths.get(i), readBox, STYLE[v]);
        groups[v] = groups[v].filter((i) => !paths.has(i));
        if (!groups[v].length) continue;
        const st = STYLE[v];
        const d = rectPath(c, groups[v], readBox[0], readBox[1], 1.5);
        if (st.halo) svg.appendChild(svgEl('path', { d, fill: 'none', stroke: INK.paper, 'stroke-width': st.width + 2.5, 'stroke-linejoin': 'round' }));
        const p = svgEl('path', { d, fill: 'none', stroke: st.colour, 'stroke-width': st.width, 'stroke-linejoin': 'round', 'data-verdict': v });
        if (st.dash) p.setAttribute('stroke-dasharray', st.dash);
        svg.appendChild(p);
        if (st.corner === 'notch') {
          svg.appendChild(svgEl('path', { d: cornerPath(c, groups[v], readBox[0], readBox[1], 'notch'), fill: st.colour, stroke: INK.paper, 'stroke-width': 1 }));
        } else if (st.corner === 'ring') {
          svg.appendChild(svgEl('path', { d: cornerPath(c, groups[v], readBox[0], readBox[1], 'ring'), fill: INK.paper, stroke: st.colour, 'stroke-width': 2 }));
        }
      }
      const highlight = svgEl('path', { 'data-role': 'highlight', d: '', fill: 'none', stroke: INK.highlight, 'stroke-width': 4, 'stroke-dasharray': '2 2' });
      const selection = svgEl('path', { 'data-role': 'selection', d: '', fill: 'none', stroke: INK.ink, 'stroke-width': 3, 'stroke-dasharray': '10 2 2 2' });
      svg.append(highlight, selection);
      state.root.insertBefore(svg, state.panel);
      state.layers.set(c.path, { svg, entry, readBox, chart: c, highlight, selection });
    }
    position();
  }

  // position keeps every layer on its chart after scroll, resize or zoom.
  function position() {
    state.frame = 0;
    for (const l of state.layers.values()) {
      let b;
      try {
        b = boxOf(l.entry);
      } catch {
        continue;
      }
      // Marks were measured relative to the chart's box at read time; the
      // layer follows the chart's current box.
      l.svg.style.left = `${b[0]}px`;
      l.svg.style.top = `${b[1]}px`;
      l.svg.setAttribute('width', String(Math.max(1, l.readBox[2] + 40)));
      l.svg.setAttribute('height', String(Math.max(1, l.readBox[3] + 40)));
      l.svg.style.width = `${Math.max(1, l.readBox[2] + 40)}px`;
      l.svg.style.height = `${Math.max(1, l.readBox[3] + 40)}px`;
    }
  }

  function schedulePosition() {
    if (!state.frame) state.frame = requestAnimationFrame(position);
  }

  // highlight outlines the marks at indices idx of the chart at path
  // (none when idx is empty).
  function highlight(path, idx) {
    for (const [p, l] of state.layers) {
      l.highlight.setAttribute('d', p === path ? rectPath(l.chart, idx, l.readBox[0], l.readBox[1], 5) : '');
    }
  }

  function showSelection() {
    const picked = state.view.picked;
    for (const [path, l] of state.layers) {
      const idx = [];
      // Every render calls this; most have nothing picked.
      if (picked.size) {
        l.chart.nodes.forEach((node, i) => {
          if (picked.has(path + '#' + node)) idx.push(i);
        });
      }
      l.selection.setAttribute('d', rectPath(l.chart, idx, l.readBox[0], l.readBox[1], 7));
    }
  }

  // ---------- panel ----------

  function keySample(v) {
    const st = STYLE[v];
    const s = svgEl('svg', { width: 28, height: 18, 'aria-hidden': 'true' });
    const r = svgEl('rect', { x: 4, y: 5, width: 16, height: 10, fill: 'none', stroke: st.colour, 'stroke-width': st.width });
    if (st.dash) r.setAttribute('stroke-dasharray', st.dash);
    s.appendChild(r);
    if (st.corner === 'notch') s.appendChild(svgEl('path', { d: 'M20,5l7,0l-7,7Z', fill: st.colour }));
    if (st.corner === 'ring') s.appendChild(svgEl('circle', { cx: 21, cy: 5, r: 3.5, fill: INK.paper, stroke: st.colour, 'stroke-width': 2 }));
    return s;
  }

  // panelHead is the top of the panel, the same for every answer: the
  // title, the outline key and the controls. While the check is on its way
  // (waiting) only Close works.
  function panelHead(waiting) {
    const out = [el('h1', { id: 'standout-title' }, 'Standout')];
    const key = el('div', { class: 'row key', 'aria-label': 'Outline key' });
    for (const v of ['pops', 'conjunction', 'blends']) {
      const item = el('span');
      item.append(keySample(v), document.createTextNode(' ' + WORDS[v]));
      key.appendChild(item);
    }
    out.push(key);

    const controls = el('div', { class: 'row' });
    const pick = el('button', { type: 'button', 'aria-pressed': String(state.view.picking), 'data-action': 'pick' }, 'Pick the point of the chart');
    on(pick, 'click', () => setView({ picking: !state.view.picking }));
    const apply = el('button', { type: 'button', 'data-action': 'check-emphasis' }, 'Check the picked marks');
    on(apply, 'click', () => rerun({ type: 'recheck' }));
    const close = el('button', { type: 'button', 'data-action': 'close' }, 'Close');
    on(close, 'click', () => dispatch({ type: 'close' }));
    controls.append(pick, apply, close);
    out.push(controls);

    const cvd = el('div', { class: 'row' });
    const lab = el('label', { for: 'standout-cvd' }, 'Preview as:');
    const sel = el('select', { id: 'standout-cvd', 'data-action': 'cvd' });
    for (const [v, t] of [['off', 'normal vision (off)'], ['protan', 'protan'], ['deutan', 'deutan'], ['tritan', 'tritan'], ['achromat', 'achromatic']]) {
      sel.appendChild(el('option', v === state.view.vision ? { value: v, selected: '' } : { value: v }, t));
    }
    const sevLab = el('label', { for: 'standout-sev' }, 'CVD strength');
    const sev = el('input', { id: 'standout-sev', type: 'range', min: '0', max: '10', step: '1', value: String(state.view.tenths), 'data-action': 'severity', 'aria-valuetext': (state.view.tenths / 10).toFixed(1) });
    const scopeLab = el('label', { for: 'standout-scope' }, 'on');
    const scope = el('select', { id: 'standout-scope', 'data-action': 'scope' });
    for (const [v, t] of [['charts', 'the charts'], ['page', 'the whole page']]) {
      scope.appendChild(el('option', v === state.view.scope ? { value: v, selected: '' } : { value: v }, t));
    }
    const update = () => setView({ vision: sel.value, tenths: Number(sev.value), scope: scope.value });
    on(sel, 'change', update);
    on(sev, 'input', update);
    on(scope, 'change', update);
    cvd.append(lab, sel, sevLab, sev, scopeLab, scope);
    out.push(cvd, screenView());

    const exp = el('div', { class: 'row' });
    const bJSON = el('button', { type: 'button', 'data-action': 'export-json' }, 'Export JSON');
    on(bJSON, 'click', () => exportReport('json'));
    const bMD = el('button', { type: 'button', 'data-action': 'export-md' }, 'Export Markdown');
    on(bMD, 'click', () => exportReport('md'));
    const bPNG = el('button', { type: 'button', 'data-action': 'export-png' }, 'Export PNG');
    on(bPNG, 'click', () => exportPNG());
    exp.append(bJSON, bMD, bPNG);
    out.push(exp);
    if (waiting) {
      for (const e of out) {
        for (const c of e.querySelectorAll('button, select, input')) if (c.getAttribute('data-action') !== 'close') c.disabled = true;
      }
    }
    return out;
  }

  function buildPanel(result) {
    const page = result.report.pages[0];
    const panel = el('div', { class: 'panel', role: 'dialog', 'aria-labelledby': 'standout-title', 'aria-modal': 'false' });
    panel.append(...panelHead(false));

    for (const pr of page.problems || []) panel.appendChild(el('p', {}, 'Note: ' + pr));
    let n = 0;
    for (const c of page.charts) {
      if (!c.isChart) continue;
      n++;
      const sec = el('section', { 'aria-label': c.title ? `${c.title} (${c.path})` : 'Chart ' + c.path });
      sec.appendChild(el('h2', {}, `${c.title ? `${c.title} (${c.path})` : `Chart ${c.path}`}: ${c.verdicts.length} marks`));
      const counts = { pops: 0, conjunction: 0, blends: 0 };
      for (const v of c.verdicts) counts[VERDICT_OF[v] || 'blends']++;
      sec.appendChild(el('p', {}, `${counts.pops} ${WORDS.pops}; ${counts.conjunction} only by a slow search; ${counts.blends} ${WORDS.blends}.`));
      if (c.emphasis && c.emphasis.marks.length) {
        const holds = VISIONS.map((v) => `${v}: ${c.emphasis.holds[v] ? 'yes' : 'no'}`).join(', ');
        sec.appendChild(el('p', { 'data-role': 'emphasis' }, `${c.emphasis.inferred ? 'Inferred' : 'Declared'} emphasis (${c.emphasis.marks.length} ${c.emphasis.marks.length === 1 ? 'mark' : 'marks'}) stands out for ${holds}.`));
        if (c.emphasis.marks.length > 0 && c.emphasis.searchMs > 0) sec.appendChild(searchPlotView(c.emphasis, c.verdicts.length));
      }
      const ul = el('ul', { class: 'findings' });
      for (const f of c.findings) {
        const li = el('li');
        const b = el('button', { type: 'button', class: 'finding', 'data-sev': f.severity, 'data-id': f.id });
        b.append(el('span', { class: 'sev' }, f.severity), document.createTextNode(f.message));
        if (f.evidence) b.append(el('span', { class: 'evidence' }, f.evidence));
        const show = () => highlight(c.path, f.marks);
        const hide = () => highlight(c.path, []);
        on(b, 'mouseenter', show);
        on(b, 'focus', show);
        on(b, 'mouseleave', hide);
        on(b, 'blur', hide);
        li.appendChild(b);
        if (f.fix) li.append(...fixView(f.fix));
        ul.appendChild(li);
      }
      sec.appendChild(ul);
      panel.appendChild(sec);
    }
    const pixels = result.pixels || state.pixels;
    if (pixels && pixels.length) panel.appendChild(pixelsView(pixels));
    if (result.frameOrigins.length) panel.appendChild(framesView(result.frameOrigins));
    if (n === 0) panel.appendChild(el('p', {}, 'No inline SVG charts were found on this page.'));
    panel.appendChild(glossaryView());
    panel.appendChild(el('p', { class: 'caution' }, result.report.caution));
    return panel;
  }

  // ---------- charts drawn as pixels ----------

  // drawPixels outlines, on each chart drawn as pixels that was judged, the
  // most salient region of its pixels for normal vision (where the eye is
  // predicted to go first) and, dashed, the next two.
  function drawPixels(pixels) {
    for (const l of state.root.querySelectorAll('svg.pixels')) l.remove();
    for (const p of pixels) {
      const rs = (p.regions && p.regions.normal) || [];
      if (!rs.length) continue;
      const svg = svgEl('svg', { class: 'layer pixels', 'data-raster': p.name, 'aria-hidden': 'true' });
      svg.style.left = `${p.box[0]}px`;
      svg.style.top = `${p.box[1]}px`;
      for (const a of ['width', 'height']) svg.setAttribute(a, String(Math.max(1, Math.round(a === 'width' ? p.box[2] : p.box[3]))));
      svg.style.width = `${Math.max(1, p.box[2])}px`;
      svg.style.height = `${Math.max(1, p.box[3])}px`;
      rs.slice(0, 3).forEach((r, k) => {
        const st = STYLE[k === 0 ? 'pops' : 'conjunction'];
        const b = r.box;
        const d = `M${r2(b[0])} ${r2(b[1])}h${r2(b[2])}v${r2(b[3])}h${r2(-b[2])}Z`;
        if (k === 0 && st.halo) svg.appendChild(svgEl('path', { d, fill: 'none', stroke: INK.paper, 'stroke-width': st.width + 2.5 }));
        const path = svgEl('path', { d, fill: 'none', stroke: st.colour, 'stroke-width': k === 0 ? st.width : 1.5, 'data-rank': String(k + 1) });
        if (k > 0) path.setAttribute('stroke-dasharray', '6 3');
        svg.appendChild(path);
      });
      state.root.insertBefore(svg, state.panel);
    }
  }

  // pickAnswer says, for a point picked on a chart drawn as pixels (in its
  // own px), whether its most salient region covers it for each vision
  // type: whether the eye goes there first.
  function pickAnswer(p, x, y) {
    const rs = p.regions || {};
    const answers = VISIONS.map((v) => {
      const t = (rs[v] || [])[0];
      const yes = t && x >= t.box[0] && x <= t.box[0] + t.box[2] && y >= t.box[1] && y <= t.box[1] + t.box[3];
      return `${v}: ${yes ? 'yes' : 'no'}`;
    });
    return `The point you picked in ${p.name} (${Math.round(x)}, ${Math.round(y)} px in it): does the eye go there first? ${answers.join(', ')}.`;
  }

  // pickPixels takes a pick (page px) on a chart drawn as pixels that was
  // judged, and answers it in the panel.
  function pickPixels(px, py) {
    const p = (state.pixels || []).find((q) => q.regions && px >= q.box[0] && px <= q.box[0] + q.box[2] && py >= q.box[1] && py <= q.box[1] + q.box[3]);
    if (!p) return;
    state.pixelPick = { name: p.name, x: px - p.box[0], y: py - p.box[1] };
    setView({ picking: false });
    const old = state.panel.querySelector('[data-role="pixels"]');
    if (old) old.replaceWith(pixelsView(state.pixels));
  }

  // overlap is the intersection over union of two boxes [x, y, w, h].
  function overlap(a, b) {
    const w = Math.min(a[0] + a[2], b[0] + b[2]) - Math.max(a[0], b[0]);
    const h = Math.min(a[1] + a[3], b[1] + b[3]) - Math.max(a[1], b[1]);
    if (w <= 0 || h <= 0) return 0;
    return (w * h) / (a[2] * a[3] + b[2] * b[3] - w * h);
  }

  // pixelsView is the panel's section on the charts drawn as pixels: where
  // the eye goes first for each vision type, or why a chart was not judged.
  function pixelsView(pixels) {
    const sec = el('section', { 'aria-label': 'Charts drawn as pixels', 'data-role': 'pixels' });
    sec.appendChild(el('h2', {}, 'Charts drawn as pixels'));
    for (const p of pixels) {
      if (p.unseen) {
        sec.appendChild(el('p', {}, p.large
          ? `${p.name} is larger than the window, so no reader sees it whole at a glance, and its pixels were not judged. Zoom the page out until it fits in the window, and press again.`
          : `${p.name} could not be captured in view: scroll it into view and press again to judge its pixels.`));
        continue;
      }
      const rs = p.regions || {};
      const top = (rs.normal || [])[0];
      if (!top) {
        sec.appendChild(el('p', {}, `${p.name}: no region of its pixels stands out.`));
        continue;
      }
      const cx = top.box[0] + top.box[2] / 2;
      const cy = top.box[1] + top.box[3] / 2;
      // As the reports word it (report.PixelLines): the same region when
      // the two overlap by half (intersection over union), wider when the
      // other covers this one's centre only, else elsewhere.
      const same = VISIONS.slice(1).map((v) => {
        const t = (rs[v] || [])[0];
        const here = t && cx >= t.box[0] && cx <= t.box[0] + t.box[2] && cy >= t.box[1] && cy <= t.box[1] + t.box[3];
        const where = !here ? 'elsewhere' : overlap(t.box, top.box) >= 0.5 ? 'the same' : 'spread wider';
        return `${v}: ${where}`;
      });
      sec.appendChild(el('p', {}, `${p.name}: the eye is predicted to go first to the outlined region (a saliency map of its pixels, Itti, Koch & Niebur 1998; a prediction). For other readers: ${same.join(', ')}.`));
      const pick = state.pixelPick;
      if (pick && pick.name === p.name) sec.appendChild(el('p', { 'data-role': 'pixel-pick' }, pickAnswer(p, pick.x, pick.y)));
    }
    return sec;
  }

  // framesView names the origins whose frames hold charts the check could
  // not read, and offers to read them: the button opens an extension page
  // that asks the reader for those origins.
  function framesView(origins) {
    const sec = el('section', { 'aria-label': 'Frames from other origins', 'data-role': 'frames' });
    sec.appendChild(el('h2', {}, 'Frames from other origins'));
    sec.appendChild(el('p', {}, `Frames from ${origins.join(', ')} were not read: Standout needs your leave to read them.`));
    const b = el('button', { type: 'button', 'data-action': 'ask-frames' }, 'Read these frames…');
    on(b, 'click', async () => {
      try {
        const r = await chrome.runtime.sendMessage({ type: 'standout/ask-frames', target: 'background', data: origins });
        if (!r || !r.ok) throw new Error((r && r.error) || 'no answer');
      } catch (e) {
        b.textContent = `Could not ask: ${String((e && e.message) || e)}`;
      }
    });
    sec.appendChild(b);
    return sec;
  }

  // ---------- picking ----------

  // showCatcher puts the layer that takes the picking clicks over the
  // page, or removes it.
  function showCatcher(picking) {
    if (picking && !state.catcher && state.root) {
      const c = el('div', { class: 'catcher', 'aria-hidden': 'true' });
      on(c, 'click', (ev) => {
        ev.preventDefault();
        ev.stopPropagation();
        pickAt(ev.clientX + window.scrollX, ev.clientY + window.scrollY);
      });
      state.root.insertBefore(c, state.panel);
      state.catcher = c;
    } else if (!picking && state.catcher) {
      state.catcher.remove();
      state.catcher = null;
    }
  }

  function pickAt(px, py) {
    let best = null;
    let bestArea = Infinity;
    for (const [path, l] of state.layers) {
      const pb = boxOf(l.entry);
      const dx = pb[0] - l.readBox[0];
      const dy = pb[1] - l.readBox[1];
      const b = l.chart.boxes;
      const pad = 3;
      for (let i = 0; i < l.chart.verdicts.length; i++) {
        const x = b[4 * i] + dx;
        const y = b[4 * i + 1] + dy;
        const w = b[4 * i + 2];
        const h = b[4 * i + 3];
        if (px >= x - pad && px <= x + w + pad && py >= y - pad && py <= y + h + pad && w * h < bestArea) {
          best = path + '#' + l.chart.nodes[i];
          bestArea = w * h;
        }
      }
    }
    if (best === null) {
      pickPixels(px, py);
      return;
    }
    const picked = new Set(state.view.picked);
    if (picked.has(best)) picked.delete(best);
    else picked.add(best);
    setView({ picked });
  }

  // ---------- re-running ----------

  // rerun checks the page again with the picked emphasis. An answer that
  // is no longer wanted (the overlay closed, or a newer check started) is
  // dropped; a worker that stops on the way is an error on the panel.
  async function rerun(ev = { type: 'recheck' }) {
    if (!dispatch(ev).includes('read')) return;
    setView({ picking: false });
    state.emphasis = [...state.view.picked];
    const seq = state.machine.seq;
    let resp;
    try {
      resp = await chrome.runtime.sendMessage({ type: 'standout/reanalyse', target: 'background', data: { emphasisNodes: state.emphasis, severity: state.view.tenths / 10, phoneWidth: state.view.phone ? PHONE_WIDTH : 0 } });
    } catch (e) {
      resp = { ok: false, error: `the extension stopped before the check finished (${(e && e.message) || e}); press the button again` };
    }
    if (!resp || !resp.ok) {
      dispatch({ type: 'fail', seq }, (resp && resp.error) || 'the check could not run again');
      return;
    }
    render(resp.data, seq);
  }

  function observeCharts() {
    stopObserving();
    for (const l of state.layers.values()) {
      const o = new MutationObserver(() => {
        clearTimeout(state.rerunTimer);
        state.rerunTimer = setTimeout(() => rerun({ type: 'change' }), 600);
      });
      if (!l.entry.svg) continue;
      o.observe(l.entry.svg, { subtree: true, childList: true, attributes: true, characterData: true });
      state.observers.push(o);
    }
  }

  function stopObserving() {
    for (const o of state.observers) o.disconnect();
    state.observers = [];
    clearTimeout(state.rerunTimer);
  }

  // screenView lets the reader judge the charts as on a phone, without
  // touching their window: each chart wider than PHONE_WIDTH is judged as
  // scaled down to it. A chart that re-lays out on phones, and the other
  // colour scheme, an extension cannot see; the row says so and names the
  // command that can.
  function screenView() {
    const row = el('div', { class: 'row' });
    const lab = el('label', { for: 'standout-screen' }, 'Judge as on:');
    const sel = el('select', { id: 'standout-screen', 'data-action': 'screen' });
    for (const [v, t] of [['this', 'this screen'], ['phone', `a ${PHONE_WIDTH} px phone`]]) {
      const phone = v === 'phone';
      sel.appendChild(el('option', phone === state.view.phone ? { value: v, selected: '' } : { value: v }, t));
    }
    on(sel, 'change', () => {
      setView({ phone: sel.value === 'phone' });
      rerun({ type: 'recheck' });
    });
    row.append(lab, sel);
    if (state.view.phone) {
      row.appendChild(el('p', { 'data-role': 'phone' }, `Judged as on a ${PHONE_WIDTH} px phone: each chart wider than that is scaled down to it, and its marks with it. A chart that re-lays out on phones needs: standout check --browser --widths ${PHONE_WIDTH}.`));
    }
    row.appendChild(el('p', { class: 'evidence' }, 'The other colour scheme: an extension cannot switch a page\u2019s light or dark scheme. Switch your system\u2019s scheme and check again, or run standout check --browser --scheme light,dark.'));
    return row;
  }

  // fixView is a finding's fix: what to do, the CSS rule to paste (its
  // selector reaching exactly the marks), whether the re-check confirmed
  // it, and the second cue to add where no colour works for every reader.
  function fixView(fix) {
    const p = el('p', {}, (fix.kind === 'mute-others' ? 'Fix: mute the other marks' : 'Fix: recolour the emphasis') +
      (fix.verified ? ' (re-checked: it then stands out for every vision type). Paste into the page\u2019s style sheet:' : ' (not enough on its own for every reader):'));
    const out = [p, el('pre', { class: 'rule' }, fix.rule || fix.css + ';')];
    if (fix.alternative) out.push(el('p', {}, fix.alternative));
    return out;
  }

  // searchPlotView draws how long finding the emphasis takes as the
  // number of marks grows, through this chart (marked): nearly flat when it
  // pops out, rising when only a slow search finds it. The geometry is
  // SearchPlotSVG's (internal/report/searchplot.go), which draws the same
  // plot for the Markdown report.
  function searchPlotView(em, n) {
    const W = 260, H = 110, left = 40, right = 24, top = 10, bottom = 28;
    const w = W - left - right, h = H - top - bottom;
    const at = (k) => (n < 2 ? em.searchMs : em.serial ? em.searchMs * k / n : em.searchMs * Math.log(k) / Math.log(n));
    const ymax = Math.max(1000, at(10000));
    const x = (k) => left + w * (Math.log10(k) - 1) / 3;
    const y = (ms) => top + h * (1 - Math.min(ms, ymax) / ymax);
    const svg = svgEl('svg', { width: W, height: H, viewBox: `0 0 ${W} ${H}`, role: 'img', class: 'search-plot',
      'aria-label': `Estimated time to find the emphasis: up to ${(at(Math.max(n, 1)) / 1000).toFixed(1)} s among these ${n} marks, ${(at(1000) / 1000).toFixed(1)} s among 1,000.` });
    const text = (tx, ty, s, anchor) => {
      const t = svgEl('text', { x: tx, y: ty, 'text-anchor': anchor, fill: INK.ink, 'font-size': 10 });
      t.textContent = s;
      svg.appendChild(t);
    };
    svg.appendChild(svgEl('path', { d: `M${left} ${top}V${top + h}H${left + w}`, fill: 'none', stroke: INK.quiet }));
    for (const [k, s] of [[10, '10'], [100, '100'], [1000, '1,000'], [10000, '10,000']]) text(x(k), top + h + 12, s, 'middle');
    text(left + w / 2, H - 3, 'marks in the chart', 'middle');
    text(left - 4, top + 4, `${+(ymax / 1000).toFixed(1)} s`, 'end');
    text(left - 4, top + h, '0', 'end');
    const pts = [];
    for (let i = 0; i <= 40; i++) {
      const k = 10 ** (1 + 3 * i / 40);
      pts.push(`${x(k).toFixed(1)} ${y(at(k)).toFixed(1)}`);
    }
    const colour = globalThis.standoutConstants.VERDICTS.find((v) => v.verdict === (em.serial ? 'conjunction' : 'pops')).colour;
    svg.appendChild(svgEl('path', { d: 'M' + pts.join('L'), fill: 'none', stroke: colour, 'stroke-width': 2 }));
    const k = Math.max(n, 10);
    if (k <= 10000) svg.appendChild(svgEl('circle', { cx: x(k), cy: y(at(k)), r: 3.5, fill: INK.alert }));
    return svg;
  }

  // glossaryView is the reports' vocabulary, folded away under the
  // findings: the same words as docs/glossary.md.
  function glossaryView() {
    const d = el('details', { class: 'glossary' });
    d.appendChild(el('summary', {}, 'What these words mean'));
    const dl = el('dl');
    for (const [term, means] of globalThis.standoutConstants.GLOSSARY) dl.append(el('dt', {}, term), el('dd', {}, means));
    d.appendChild(dl);
    return d;
  }

  // ---------- CVD preview ----------

  // setPreview applies the feColorMatrix of the view's CVD type at its
  // severity to the charts or the page, or removes it. The values come
  // from cvd-filters.js, generated from the Go matrices the analysis
  // uses. It changes only the filter property of each target, and
  // remembers how to undo exactly that.
  function setPreview() {
    clearPreview();
    const { vision, tenths, scope } = state.view;
    if (vision === 'off' || !globalThis.standoutCVDFilters[vision]) return;
    const entry = globalThis.standoutCVDFilters[vision][Math.max(0, Math.min(10, tenths))];
    const id = 'standout-cvd-' + Math.random().toString(36).slice(2);
    const svg = document.createElementNS(SVG_NS, 'svg');
    svg.setAttribute('width', '0');
    svg.setAttribute('height', '0');
    svg.setAttribute('aria-hidden', 'true');
    svg.style.position = 'absolute';
    const filter = document.createElementNS(SVG_NS, 'filter');
    filter.setAttribute('id', id);
    filter.setAttribute('color-interpolation-filters', 'linearRGB');
    filterPrimitives(filter, entry);
    svg.appendChild(filter);
    const targets = scope === 'page' ? [document.body || document.documentElement] : [...state.layers.values()].map((l) => l.entry.svg).filter((t) => t && t.ownerDocument === document);
    const watching = state.observers.length > 0;
    stopObserving();
    (document.body || document.documentElement).appendChild(svg);
    const restored = [];
    const url = `url(#${id})`;
    for (const t of targets) {
      const r = { el: t, attr: t.getAttribute('style'), value: t.style.getPropertyValue('filter'), priority: t.style.getPropertyPriority('filter'), url };
      t.style.setProperty('filter', url, 'important');
      r.url = t.style.getPropertyValue('filter'); // as the browser serialises it
      r.after = t.getAttribute('style');
      restored.push(r);
    }
    state.preview = { svg, restored };
    if (watching) observeCharts();
  }

  // filterPrimitives fills a filter with one feColorMatrix, or, for a
  // dichromat of two half-planes, with both wings' matrices and a mask
  // that keeps, per pixel, the wing on the colour's side of the plane
  // between them (the side matrix's alpha, thresholded at one half).
  function filterPrimitives(filter, entry) {
    const add = (tag, attrs, parent = filter) => {
      const el = document.createElementNS(SVG_NS, tag);
      for (const [k, v] of Object.entries(attrs)) el.setAttribute(k, v);
      parent.appendChild(el);
      return el;
    };
    if (typeof entry === 'string') {
      add('feColorMatrix', { type: 'matrix', values: entry });
      return;
    }
    add('feColorMatrix', { in: 'SourceGraphic', type: 'matrix', values: entry.wings[0], result: 'wing0' });
    add('feColorMatrix', { in: 'SourceGraphic', type: 'matrix', values: entry.wings[1], result: 'wing1' });
    add('feColorMatrix', { in: 'SourceGraphic', type: 'matrix', values: entry.side, result: 'side' });
    const step = add('feComponentTransfer', { in: 'side', result: 'mask' });
    add('feFuncA', { type: 'discrete', tableValues: '0 1' }, step);
    add('feComposite', { in: 'wing0', in2: 'mask', operator: 'in', result: 'kept0' });
    add('feComposite', { in: 'wing1', in2: 'mask', operator: 'out', result: 'kept1' });
    const merge = add('feMerge', {});
    add('feMergeNode', { in: 'kept0' }, merge);
    add('feMergeNode', { in: 'kept1' }, merge);
  }

  // clearPreview undoes what setPreview did: where the page has not
  // touched the style attribute since, it gets its exact text back;
  // otherwise only the filter Standout set is taken out, and the page's
  // own changes stay.
  function clearPreview() {
    if (!state.preview) return;
    const watching = state.observers.length > 0;
    stopObserving();
    for (const r of state.preview.restored) {
      const t = r.el;
      if (t.getAttribute('style') === r.after) {
        if (r.attr === null) t.removeAttribute('style');
        else t.setAttribute('style', r.attr);
      } else if (t.style.getPropertyValue('filter') === r.url) {
        if (r.value) t.style.setProperty('filter', r.value, r.priority);
        else t.style.removeProperty('filter');
      }
    }
    state.preview.svg.remove();
    state.preview = null;
    if (watching && isOpen()) observeCharts();
  }

  // ---------- export ----------

  function download(name, type, text) {
    const url = URL.createObjectURL(new Blob([text], { type }));
    const a = el('a', { href: url, download: name });
    state.root.appendChild(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 10000);
  }

  // exportReport asks for the whole report (the overlay holds a digest)
  // for the current emphasis and severity, and downloads it as JSON or
  // Markdown. The report holds only what the page and its same-origin
  // frames show, so a download from the page's origin reveals nothing new
  // to it.
  async function exportReport(kind) {
    let resp;
    try {
      // The press's judgements of the charts drawn as pixels, and a point
      // picked on one, go into the report as they were made.
      const pixels = (state.pixels || []).filter((p) => p.regions).map((p) => ({ name: p.name, regions: p.regions }));
      const data = { emphasisNodes: state.emphasis || [], severity: state.view.tenths / 10, phoneWidth: state.view.phone ? PHONE_WIDTH : 0, pixels };
      if (state.pixelPick) data.pick = state.pixelPick;
      resp = await chrome.runtime.sendMessage({ type: 'standout/full-report', target: 'background', data });
    } catch (e) {
      resp = { ok: false, error: String((e && e.message) || e) };
    }
    if (!isOpen()) return;
    if (!resp || !resp.ok) {
      dispatch({ type: 'fail' }, (resp && resp.error) || 'the report could not be made');
      return;
    }
    const r = JSON.parse(resp.data.response);
    if (!r.ok) {
      dispatch({ type: 'fail' }, r.error);
      return;
    }
    if (kind === 'md') download('standout-report.md', 'text/markdown', r.markdown);
    else download('standout-report.json', 'application/json', JSON.stringify(r.report, null, 1));
  }

  // exportPNG asks the background to capture the tab and crop it to the
  // charts. The capture never enters the page: a screenshot can show
  // frames of other origins, which the page must not read, so it is cut
  // and offered for download in an extension page of its own.
  async function exportPNG() {
    // Let the outlines reach the screen before the tab is captured.
    await new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)));
    const charts = [];
    for (const [path, l] of state.layers) {
      const b = boxOf(l.entry);
      const x = Math.max(0, b[0] - window.scrollX - 10);
      const y = Math.max(0, b[1] - window.scrollY - 10);
      const w = Math.min(window.innerWidth - x, b[2] + 20);
      const h = Math.min(window.innerHeight - y, b[3] + 20);
      if (w > 0 && h > 0) charts.push({ name: `standout-${path.replace(/[^A-Za-z0-9]+/g, '-')}.png`, box: [x, y, w, h] });
    }
    let resp;
    try {
      resp = await chrome.runtime.sendMessage({ type: 'standout/capture', target: 'background', data: { charts, viewport: [window.innerWidth, window.innerHeight] } });
    } catch (e) {
      resp = { ok: false, error: String((e && e.message) || e) };
    }
    if (isOpen() && (!resp || !resp.ok)) dispatch({ type: 'fail' }, (resp && resp.error) || 'the screenshot failed');
  }

  // ---------- lifecycle ----------


  // ensureHost puts the overlay's host on the page: a plain <div> (a
  // built-in element, so no custom element the page defines can reach
  // its closed shadow root through attachInternals), on the root element,
  // so that a whole-page preview (a filter on <body>) leaves the
  // overlay's own colours alone. In a standalone SVG document the host
  // sits in a <foreignObject> that covers the window.
  function ensureHost() {
    if (state.host) return;
    const host = document.createElementNS(XHTML_NS, 'div');
    host.setAttribute('data-standout', '');
    const hs = host.style;
    hs.setProperty('position', 'absolute', 'important');
    hs.setProperty('left', '0px', 'important');
    hs.setProperty('top', '0px', 'important');
    hs.setProperty('width', '0px', 'important');
    hs.setProperty('height', '0px', 'important');
    hs.setProperty('z-index', '2147483647', 'important');
    hs.setProperty('pointer-events', 'none', 'important');
    hs.setProperty('display', 'block', 'important');
    state.root = host.attachShadow({ mode: 'closed' });
    const style = document.createElementNS(XHTML_NS, 'style');
    style.textContent = CSS;
    state.root.appendChild(style);
    state.panel = el('div');
    state.root.appendChild(state.panel);
    const de = document.documentElement;
    if (de.namespaceURI === SVG_NS) {
      const fo = document.createElementNS(SVG_NS, 'foreignObject');
      fo.setAttribute('x', '0');
      fo.setAttribute('y', '0');
      fo.setAttribute('width', '100%');
      fo.setAttribute('height', '100%');
      fo.setAttribute('overflow', 'visible');
      fo.setAttribute('data-standout', '');
      // Undo the root's viewBox: the overlay draws in CSS px.
      const m = de.getScreenCTM && de.getScreenCTM();
      const inv = m && m.inverse();
      if (inv) fo.setAttribute('transform', `matrix(${inv.a},${inv.b},${inv.c},${inv.d},${inv.e},${inv.f})`);
      fo.appendChild(host);
      de.appendChild(fo);
      state.container = fo;
    } else {
      de.appendChild(host);
      state.container = host;
    }
    state.host = host;
    listen(window, 'scroll', schedulePosition, { capture: true, passive: true });
    listen(window, 'resize', schedulePosition, { passive: true });
    listen(window, 'keydown', (ev) => {
      // Escape closes a check that is shown, or one on its way.
      if (ev.key === 'Escape' && state.machine.phase !== 'closed') {
        ev.preventDefault();
        dispatch({ type: 'close' });
      }
    }, { capture: true });
  }

  // unpack turns the background's {response or answer, timing} into
  // {report, timing}, or throws the core's error.
  function unpack(data) {
    const r = JSON.parse(answerText(data));
    if (!r.ok) throw new Error(r.error);
    for (const page of r.overlay.pages) {
      for (const c of page.charts) {
        expandLater(c, 'nodes');
        for (const f of c.findings) expandLater(f, 'marks');
        if (c.emphasis) expandLater(c.emphasis, 'marks');
      }
    }
    // The core sends the overlay's digest of the report; the whole report
    // is made when it is exported.
    return { report: r.overlay, pixels: data.pixels, frameOrigins: data.frameOrigins || [], timing: Object.assign({}, data.timing, { core: r.timing }) };
  }

  // answerText is the core's answer in data: whole (response: the whole
  // report, or from an earlier version's background), or as a message of
  // the answers' line, kept for the next answer to patch against.
  function answerText(data) {
    if (typeof data.response === 'string') return data.response;
    const text = heldAnswers.take('answer', data.answer);
    if (text === null) throw new Error('the answer came as a patch of one this page no longer holds; press Standout again');
    return text;
  }

  // indices expands one of the digest's lists of indices, written in
  // runs: a negative entry −w after v stands for v+1 through w
  // (report.Digest).
  function indices(list) {
    const out = [];
    for (const v of list) {
      if (v >= 0) out.push(v);
      else for (let k = out[out.length - 1] + 1; k <= -v; k++) out.push(k);
    }
    return out;
  }

  // expandLater makes obj[key], a list of indices in runs, the expanded
  // list at its first use. An answer's lists name some 16,000 marks at
  // 5,000 (the chart's nodes, and every mark of a category a finding is
  // about), and a finding's list is used only when it is shown. Expanded
  // at once, by a page's first answer, whose script runs unoptimised,
  // they made most of the 10-11 ms that unpacking the first answer in a
  // new profile took in the browser benchmark (1.6-8.8 ms since).
  function expandLater(obj, key) {
    const runs = obj[key];
    let list = null;
    Object.defineProperty(obj, key, { enumerable: true, configurable: true, get: () => list || (list = indices(runs)) });
  }

  // render shows a check's answer, if it is the one awaited (seq): a
  // core's error becomes the error panel.
  function render(data, seq) {
    const arrived = performance.timeOrigin + performance.now();
    let result;
    try {
      result = unpack(data);
      if (result.timing.sentAt) result.timing.deliveryMs = arrived - result.timing.sentAt;
      result.timing.unpackMs = performance.timeOrigin + performance.now() - arrived;
    } catch (e) {
      return dispatch({ type: 'fail', seq }, String((e && e.message) || e)).length > 0;
    }
    return dispatch({ type: 'answer', seq }, result).length > 0;
  }

  // renderAnswer draws an unpacked answer: the panel from the view model,
  // the outlines, the picks and the preview.
  function renderAnswer(result) {
    const t0 = performance.now();
    ensureHost();
    // A press judges the charts drawn as pixels; a re-check keeps that.
    if (result.pixels) {
      state.pixels = result.pixels;
      state.pixelPick = null;
    }
    // The outlines first: placing them reads the charts' boxes, which
    // forces a layout, and the panel already shown, if any (the busy one,
    // or a re-check's last answer), is laid out by now; the new panel is
    // laid out once, with the frame.
    drawLayers(result.report.pages[0]);
    drawPixels(state.pixels || []);
    const panel = buildPanel(result);
    state.panel.replaceWith(panel);
    state.panel = panel;
    // The view, the preview included, over the charts as they now are.
    renderView(true);
    result.timing.renderMs = performance.now() - t0;
    state.host.setAttribute('data-timing', JSON.stringify(result.timing));
    panel.setAttribute('tabindex', '-1');
    panel.focus({ preventScroll: true });
  }

  // showError shows msg on the error panel (the machine has dropped any
  // check in flight and stopped watching the charts).
  function showError(msg) {
    ensureHost();
    const panel = el('div', { class: 'panel error', role: 'alert' });
    panel.appendChild(el('h1', {}, 'Standout could not check this page'));
    panel.appendChild(el('p', {}, msg));
    const close = el('button', { type: 'button', 'data-action': 'close' }, 'Close');
    on(close, 'click', () => dispatch({ type: 'close' }));
    panel.appendChild(close);
    state.panel.replaceWith(panel);
    state.panel = panel;
  }

  // teardown removes the overlay and leaves the page as it was (the
  // machine drops any answer still on its way).
  function teardown() {
    clearPreview();
    stopObserving();
    if (state.frame) cancelAnimationFrame(state.frame);
    state.frame = 0;
    for (const [t, type, fn, opts] of state.listeners) t.removeEventListener(type, fn, opts);
    state.listeners = [];
    if (state.container) state.container.remove();
    state.container = null;
    state.host = null;
    state.root = null;
    state.panel = null;
    state.layers.clear();
    state.emphasis = [];
    state.catcher = null;
    state.pixels = null;
    state.pixelPick = null;
    state.view = initialView();
  }

  // read reads the page for the core: the read pass's result as one JSON
  // string (it crosses the messaging layer far faster than a large object,
  // and goes to the core as it is), sent as a patch against the newest
  // reading the background holds (theirs: their ids) when this page holds
  // it too, with the ids of the answers this page holds, its timings and
  // the check's seq.
  async function read(seq, theirs) {
    const page = await globalThis.standoutReader.readPage(document);
    const t1 = performance.now();
    // The read's own time stays out of what goes to the core, so that an
    // unchanged page reads as the same string (the background then reuses
    // its last answer).
    const { readMs, ...content } = page;
    const json = JSON.stringify(content);
    // The charts drawn as pixels and the viewport, for the background to
    // cut them from a capture of the visible tab.
    const de = document.documentElement;
    const view = { x: window.scrollX, y: window.scrollY, w: de.clientWidth || window.innerWidth, h: de.clientHeight || window.innerHeight };
    const stringifyMs = performance.now() - t1;
    const sent = sentReadings.give('page', json, Array.isArray(theirs) ? theirs : []);
    const patchMs = performance.now() - t1 - stringifyMs;
    if (state.machine.phase === 'reading' && !state.host) {
      // Only for a check that takes a while: a quick one (a warm core)
      // answers before, and neither flashes the busy panel nor pays for it.
      const hidden = page.rasters.length > 0;
      setTimeout(() => {
        if (state.machine.phase === 'reading' && state.machine.seq === seq && !state.host) busy(hidden);
      }, BUSY_AFTER_MS);
    }
    return { sent, holds: heldAnswers.held('answer'), seq, readMs, stringifyMs, patchMs, rasters: page.rasters, frames: page.unreadFrames, view };
  }

  // busy shows, when a press's check is still on its way a moment after the
  // read, that it is coming: the panel's head, whose controls wait for the
  // answer, and a status line. The reader sees that the press was taken, and the
  // page lays out the overlay (its style sheet, fonts, form controls)
  // while the core works in the background, rather than after it. When
  // charts drawn as pixels wait to be captured the panel is laid out but
  // not shown, so that no capture holds it.
  function busy(hidden) {
    ensureHost();
    const panel = el('div', { class: 'panel busy', role: 'dialog', 'aria-labelledby': 'standout-title', 'aria-modal': 'false', 'aria-busy': 'true' });
    panel.append(...panelHead(true));
    panel.appendChild(el('p', { role: 'status' }, 'Checking the page\u2019s charts\u2026'));
    if (hidden) panel.style.setProperty('visibility', 'hidden');
    state.panel.replaceWith(panel);
    state.panel = panel;
    state.host.setAttribute('data-state', 'reading');
  }

  // press is the toolbar action: it closes an open check (or one being
  // read), or reads the page for a new one (theirs: read).
  function press(theirs) {
    if (!dispatch({ type: 'press' }).includes('read')) return { closed: true };
    return read(state.machine.seq, theirs);
  }

  // recheck reads the page again for the background (a re-check the
  // overlay asked for), under the current seq.
  function recheck(theirs) {
    return read(state.machine.seq, theirs);
  }

  // show and fail are the background's answers to a press.
  function show(result) {
    return render(result, result && result.seq);
  }

  // fail shows an error of the press or check seq; without seq (the
  // press itself failed before a read began) it always shows.
  function fail(msg, seq) {
    return dispatch({ type: 'fail', seq }, msg).length > 0;
  }

  // The background calls these through chrome.scripting (press through
  // press.js). They live in the extension's isolated world, out of the
  // page's reach.
  globalThis.standoutOverlay = Object.freeze({ press, read: recheck, show, showError: fail });
})();
