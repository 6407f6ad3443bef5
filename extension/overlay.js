// The overlay: outlines on the page's charts, a panel of findings, picking
// the intended emphasis, the CVD preview and export. It lives in a closed
// shadow root on one host element, builds its DOM with createElement and
// textContent only, and leaves the page exactly as it found it when it
// closes.
(() => {
  if (globalThis.standoutOverlay) return;

  const SVG_NS = 'http://www.w3.org/2000/svg';
  const VISIONS = ['normal', 'protan', 'deutan', 'tritan', 'achromat'];

  // The visual language, our own, redundant for readers with CVD: each
  // verdict differs in line width and style and in a corner mark, not in
  // colour alone. The marks that blend in, usually nearly all of them,
  // get a plain thin line with no white halo: dashes and halos on
  // thousands of outlines cost the browser's software rasteriser hundreds
  // of milliseconds a frame.
  const STYLE = {
    pops: { colour: '#0f766e', width: 2.5, dash: '', corner: 'notch', halo: true },
    conjunction: { colour: '#b45309', width: 2, dash: '7 3', corner: 'ring', halo: true },
    blends: { colour: '#52525b', width: 1, dash: '', corner: '', halo: false },
  };
  const WORDS = {
    pops: 'stands out at a glance',
    conjunction: 'found only by a slow search (a conjunction of features)',
    blends: 'blends in',
  };

  const CSS = `
  :host { all: initial; }
  .layer { position: absolute; overflow: visible; pointer-events: none; }
  .panel { position: fixed; top: 12px; right: 12px; width: 360px; max-height: calc(100vh - 24px); overflow: auto;
    background: #ffffff; color: #18181b; font: 13px/1.45 system-ui, sans-serif; border: 2px solid #18181b;
    border-radius: 6px; box-shadow: 0 4px 18px rgba(0,0,0,.25); pointer-events: auto; padding: 10px 12px; }
  .panel h1 { font-size: 15px; margin: 0 0 6px; }
  .panel h2 { font-size: 13px; margin: 10px 0 4px; }
  .panel p { margin: 4px 0; }
  .panel button, .panel select, .panel input { font: inherit; pointer-events: auto; }
  .panel button { border: 1px solid #18181b; background: #f4f4f5; border-radius: 4px; padding: 2px 8px; cursor: pointer; }
  .panel button[aria-pressed="true"] { background: #18181b; color: #fff; }
  .panel button:focus-visible, .panel select:focus-visible, .panel input:focus-visible, .finding:focus-visible { outline: 3px solid #2563eb; outline-offset: 1px; }
  .row { display: flex; flex-wrap: wrap; gap: 6px; align-items: center; margin: 6px 0; }
  .findings { list-style: none; padding: 0; margin: 4px 0; }
  .finding { display: block; width: 100%; text-align: left; border: 1px solid #d4d4d8; background: #fff; border-radius: 4px;
    padding: 4px 6px; margin: 3px 0; cursor: default; }
  .finding .sev { font-weight: 700; text-transform: uppercase; font-size: 11px; margin-right: 4px; }
  .finding[data-sev="error"] { border-left: 5px solid #18181b; }
  .finding[data-sev="warning"] { border-left: 5px dashed #18181b; }
  .finding[data-sev="info"] { border-left: 5px dotted #18181b; }
  code { font: 12px ui-monospace, monospace; background: #f4f4f5; padding: 1px 3px; border-radius: 3px; }
  .key svg { vertical-align: middle; }
  .caution { font-size: 11px; color: #3f3f46; border-top: 1px solid #d4d4d8; margin-top: 8px; padding-top: 6px; }
  .catcher { position: fixed; inset: 0; pointer-events: auto; cursor: crosshair; background: transparent; }
  .error { border-color: #b91c1c; }
  @media (prefers-reduced-motion: reduce) { * { transition: none !important; animation: none !important; } }
  `;

  const state = {
    open: false,
    host: null,
    root: null,
    panel: null,
    layers: new Map(), // path → {svg, entry, readBox, chart, highlight, selection}
    picking: false,
    picked: new Set(), // picked marks, as "chart path#snapshot node"
    catcher: null,
    observers: [],
    listeners: [],
    preview: null, // {svg, restored: [[el, styleAttr]]}
    emphasis: [], // the picks the shown check ran with
    rerunTimer: 0,
    frame: 0,
  };

  function el(tag, attrs, text) {
    const e = document.createElement(tag);
    for (const [k, v] of Object.entries(attrs || {})) e.setAttribute(k, v);
    if (text !== undefined) e.textContent = text;
    return e;
  }

  function svgEl(tag, attrs) {
    const e = document.createElementNS(SVG_NS, tag);
    for (const [k, v] of Object.entries(attrs || {})) e.setAttribute(k, String(v));
    return e;
  }

  function listen(target, type, fn, opts) {
    target.addEventListener(type, fn, opts);
    state.listeners.push([target, type, fn, opts]);
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

  const VERDICT_OF = { p: 'pops', c: 'conjunction', b: 'blends' };

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

  function drawLayers(page) {
    for (const l of state.layers.values()) l.svg.remove();
    state.layers.clear();
    const entries = chartEntries();
    for (const c of page.charts) {
      if (!c.isChart) continue;
      const entry = entries.get(c.path);
      if (!entry) continue;
      const svg = svgEl('svg', { class: 'layer', 'data-chart': c.path, 'aria-hidden': 'true' });
      const readBox = c.box;
      const groups = byVerdict(c);
      for (const v of ['blends', 'conjunction', 'pops']) {
        if (!groups[v].length) continue;
        const st = STYLE[v];
        const d = rectPath(c, groups[v], readBox[0], readBox[1], 1.5);
        if (st.halo) svg.appendChild(svgEl('path', { d, fill: 'none', stroke: '#ffffff', 'stroke-width': st.width + 2.5, 'stroke-linejoin': 'round' }));
        const p = svgEl('path', { d, fill: 'none', stroke: st.colour, 'stroke-width': st.width, 'stroke-linejoin': 'round', 'data-verdict': v });
        if (st.dash) p.setAttribute('stroke-dasharray', st.dash);
        svg.appendChild(p);
        if (st.corner === 'notch') {
          svg.appendChild(svgEl('path', { d: cornerPath(c, groups[v], readBox[0], readBox[1], 'notch'), fill: st.colour, stroke: '#ffffff', 'stroke-width': 1 }));
        } else if (st.corner === 'ring') {
          svg.appendChild(svgEl('path', { d: cornerPath(c, groups[v], readBox[0], readBox[1], 'ring'), fill: '#ffffff', stroke: st.colour, 'stroke-width': 2 }));
        }
      }
      const highlight = svgEl('path', { d: '', fill: 'none', stroke: '#1d4ed8', 'stroke-width': 4, 'stroke-dasharray': '2 2' });
      const selection = svgEl('path', { d: '', fill: 'none', stroke: '#18181b', 'stroke-width': 3, 'stroke-dasharray': '10 2 2 2' });
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
        b = globalThis.standoutReader.pageBox(l.entry);
      } catch (e) {
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
    for (const [path, l] of state.layers) {
      const idx = [];
      l.chart.nodes.forEach((node, i) => {
        if (state.picked.has(path + '#' + node)) idx.push(i);
      });
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
    if (st.corner === 'ring') s.appendChild(svgEl('circle', { cx: 21, cy: 5, r: 3.5, fill: '#fff', stroke: st.colour, 'stroke-width': 2 }));
    return s;
  }

  function buildPanel(result) {
    const page = result.report.pages[0];
    const panel = el('div', { class: 'panel', role: 'dialog', 'aria-labelledby': 'standout-title', 'aria-modal': 'false' });
    panel.appendChild(el('h1', { id: 'standout-title' }, 'Standout'));

    const key = el('div', { class: 'row key', 'aria-label': 'Outline key' });
    for (const v of ['pops', 'conjunction', 'blends']) {
      const item = el('span');
      item.append(keySample(v), document.createTextNode(' ' + WORDS[v]));
      key.appendChild(item);
    }
    panel.appendChild(key);

    const controls = el('div', { class: 'row' });
    const pick = el('button', { type: 'button', 'aria-pressed': String(state.picking), 'data-action': 'pick' }, 'Pick the point of the chart');
    pick.addEventListener('click', () => setPicking(!state.picking));
    const apply = el('button', { type: 'button', 'data-action': 'check-emphasis' }, 'Check the picked marks');
    apply.addEventListener('click', () => rerun());
    const close = el('button', { type: 'button', 'data-action': 'close' }, 'Close');
    close.addEventListener('click', () => teardown());
    controls.append(pick, apply, close);
    panel.appendChild(controls);

    const cvd = el('div', { class: 'row' });
    const lab = el('label', { for: 'standout-cvd' }, 'Preview as:');
    const sel = el('select', { id: 'standout-cvd', 'data-action': 'cvd' });
    for (const [v, t] of [['off', 'normal vision (off)'], ['protan', 'protan'], ['deutan', 'deutan'], ['tritan', 'tritan'], ['achromat', 'achromatic']]) {
      sel.appendChild(el('option', { value: v }, t));
    }
    const sevLab = el('label', { for: 'standout-sev' }, 'severity');
    const sev = el('input', { id: 'standout-sev', type: 'range', min: '0', max: '10', step: '1', value: '10', 'data-action': 'severity', 'aria-valuetext': '1.0' });
    const scopeLab = el('label', { for: 'standout-scope' }, 'on');
    const scope = el('select', { id: 'standout-scope', 'data-action': 'scope' });
    scope.append(el('option', { value: 'charts' }, 'the charts'), el('option', { value: 'page' }, 'the whole page'));
    const update = () => {
      sev.setAttribute('aria-valuetext', (Number(sev.value) / 10).toFixed(1));
      setPreview(sel.value, Number(sev.value), scope.value);
    };
    sel.addEventListener('change', update);
    sev.addEventListener('input', update);
    scope.addEventListener('change', update);
    cvd.append(lab, sel, sevLab, sev, scopeLab, scope);
    panel.appendChild(cvd);

    const exp = el('div', { class: 'row' });
    const bJSON = el('button', { type: 'button', 'data-action': 'export-json' }, 'Export JSON');
    bJSON.addEventListener('click', () => exportReport('json'));
    const bMD = el('button', { type: 'button', 'data-action': 'export-md' }, 'Export Markdown');
    bMD.addEventListener('click', () => exportReport('md'));
    const bPNG = el('button', { type: 'button', 'data-action': 'export-png' }, 'Export PNG');
    bPNG.addEventListener('click', () => exportPNG());
    exp.append(bJSON, bMD, bPNG);
    panel.appendChild(exp);

    for (const pr of page.problems || []) panel.appendChild(el('p', {}, 'Note: ' + pr));
    let n = 0;
    for (const c of page.charts) {
      if (!c.isChart) continue;
      n++;
      const sec = el('section', { 'aria-label': 'Chart ' + c.path });
      sec.appendChild(el('h2', {}, `Chart ${c.path}: ${c.nodes.length} marks`));
      const counts = { pops: 0, conjunction: 0, blends: 0 };
      for (const v of c.verdicts) counts[VERDICT_OF[v] || 'blends']++;
      sec.appendChild(el('p', {}, `${counts.pops} ${WORDS.pops}; ${counts.conjunction} only by a slow search; ${counts.blends} ${WORDS.blends}.`));
      if (c.emphasis && c.emphasis.marks.length) {
        const holds = VISIONS.map((v) => `${v}: ${c.emphasis.holds[v] ? 'yes' : 'no'}`).join(', ');
        sec.appendChild(el('p', { 'data-role': 'emphasis' }, `${c.emphasis.inferred ? 'Inferred' : 'Declared'} emphasis (${c.emphasis.marks.length} ${c.emphasis.marks.length === 1 ? 'mark' : 'marks'}) stands out for ${holds}.`));
      }
      const ul = el('ul', { class: 'findings' });
      for (const f of c.findings) {
        const li = el('li');
        const b = el('button', { type: 'button', class: 'finding', 'data-sev': f.severity, 'data-id': f.id });
        b.append(el('span', { class: 'sev' }, f.severity), document.createTextNode(f.message));
        const on = () => highlight(c.path, f.marks);
        const off = () => highlight(c.path, []);
        b.addEventListener('mouseenter', on);
        b.addEventListener('focus', on);
        b.addEventListener('mouseleave', off);
        b.addEventListener('blur', off);
        li.appendChild(b);
        if (f.fix) {
          const p = el('p');
          p.append(document.createTextNode(f.fix.kind === 'mute-others' ? 'Fix: mute the other marks with ' : 'Fix: recolour the emphasis with '), el('code', {}, f.fix.css), document.createTextNode(f.fix.verified ? ' (re-checked for every vision type).' : ' (not enough on its own).'));
          li.appendChild(p);
        }
        ul.appendChild(li);
      }
      sec.appendChild(ul);
      panel.appendChild(sec);
    }
    if (n === 0) panel.appendChild(el('p', {}, 'No inline SVG charts were found on this page.'));
    panel.appendChild(el('p', { class: 'caution' }, result.report.caution));
    return panel;
  }

  // ---------- picking ----------

  function setPicking(on) {
    state.picking = on;
    const b = state.panel && state.panel.querySelector('[data-action="pick"]');
    if (b) b.setAttribute('aria-pressed', String(on));
    if (on && !state.catcher) {
      const c = el('div', { class: 'catcher', 'aria-hidden': 'true' });
      c.addEventListener('click', (ev) => {
        ev.preventDefault();
        ev.stopPropagation();
        pickAt(ev.clientX + window.scrollX, ev.clientY + window.scrollY);
      });
      state.root.insertBefore(c, state.panel);
      state.catcher = c;
    } else if (!on && state.catcher) {
      state.catcher.remove();
      state.catcher = null;
    }
  }

  function pickAt(px, py) {
    let best = null;
    let bestArea = Infinity;
    for (const [path, l] of state.layers) {
      const pb = globalThis.standoutReader.pageBox(l.entry);
      const dx = pb[0] - l.readBox[0];
      const dy = pb[1] - l.readBox[1];
      const b = l.chart.boxes;
      const pad = 3;
      for (let i = 0; i < l.chart.nodes.length; i++) {
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
    if (best === null) return;
    if (state.picked.has(best)) state.picked.delete(best);
    else state.picked.add(best);
    showSelection();
  }

  // ---------- re-running ----------

  async function rerun() {
    setPicking(false);
    const severity = state.panel ? Number(state.panel.querySelector('[data-action="severity"]').value) / 10 : 1;
    state.emphasis = [...state.picked];
    const resp = await chrome.runtime.sendMessage({ type: 'standout/reanalyse', target: 'background', data: { emphasisNodes: state.emphasis, severity } });
    if (!resp || !resp.ok) {
      showError((resp && resp.error) || 'the check could not run again');
      return;
    }
    render(resp.data);
  }

  function observeCharts() {
    for (const o of state.observers) o.disconnect();
    state.observers = [];
    for (const l of state.layers.values()) {
      const o = new MutationObserver(() => {
        clearTimeout(state.rerunTimer);
        state.rerunTimer = setTimeout(() => {
          if (state.open) rerun();
        }, 600);
      });
      o.observe(l.entry.svg, { subtree: true, childList: true, attributes: true, characterData: true });
      state.observers.push(o);
    }
  }

  // ---------- CVD preview ----------

  // setPreview applies the feColorMatrix of a CVD type at a severity (in
  // tenths) to the charts or the page, or removes it. The values come from
  // cvd-filters.js, generated from the Go matrices the analysis uses.
  function setPreview(type, tenths, scope) {
    clearPreview();
    if (type === 'off' || !globalThis.standoutCVDFilters[type]) return;
    const values = globalThis.standoutCVDFilters[type][Math.max(0, Math.min(10, tenths))];
    const id = 'standout-cvd-' + Math.random().toString(36).slice(2);
    const svg = document.createElementNS(SVG_NS, 'svg');
    svg.setAttribute('width', '0');
    svg.setAttribute('height', '0');
    svg.setAttribute('aria-hidden', 'true');
    svg.style.position = 'absolute';
    const filter = document.createElementNS(SVG_NS, 'filter');
    filter.setAttribute('id', id);
    filter.setAttribute('color-interpolation-filters', 'linearRGB');
    const m = document.createElementNS(SVG_NS, 'feColorMatrix');
    m.setAttribute('type', 'matrix');
    m.setAttribute('values', values);
    filter.appendChild(m);
    svg.appendChild(filter);
    const targets = scope === 'page' ? [document.body || document.documentElement] : [...state.layers.values()].map((l) => l.entry.svg).filter((s) => s.ownerDocument === document);
    for (const o of state.observers) o.disconnect();
    document.body.appendChild(svg);
    const restored = [];
    for (const t of targets) {
      restored.push([t, t.getAttribute('style')]);
      t.style.filter = `url(#${id})`;
    }
    state.preview = { svg, restored };
    observeCharts();
  }

  function clearPreview() {
    if (!state.preview) return;
    for (const o of state.observers) o.disconnect();
    for (const [t, s] of state.preview.restored) {
      if (s === null) t.removeAttribute('style');
      else t.setAttribute('style', s);
    }
    state.preview.svg.remove();
    state.preview = null;
    if (state.open) observeCharts();
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
  // Markdown.
  async function exportReport(kind) {
    const severity = state.panel ? Number(state.panel.querySelector('[data-action="severity"]').value) / 10 : 1;
    const resp = await chrome.runtime.sendMessage({ type: 'standout/full-report', target: 'background', data: { emphasisNodes: state.emphasis || [], severity } });
    if (!resp || !resp.ok) {
      showError((resp && resp.error) || 'the report could not be made');
      return;
    }
    const r = JSON.parse(resp.data.response);
    if (!r.ok) {
      showError(r.error);
      return;
    }
    if (kind === 'md') download('standout-report.md', 'text/markdown', r.markdown);
    else download('standout-report.json', 'application/json', JSON.stringify(r.report, null, 1));
  }

  async function exportPNG() {
    // Let the outlines reach the screen before the tab is captured.
    await new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)));
    const resp = await chrome.runtime.sendMessage({ type: 'standout/capture', target: 'background' });
    if (!resp || !resp.ok) {
      showError((resp && resp.error) || 'the screenshot failed');
      return;
    }
    const img = new Image();
    img.src = resp.data;
    await img.decode();
    const dpr = img.width / window.innerWidth;
    for (const [path, l] of state.layers) {
      const b = globalThis.standoutReader.pageBox(l.entry);
      const x = Math.max(0, b[0] - window.scrollX - 10);
      const y = Math.max(0, b[1] - window.scrollY - 10);
      const w = Math.min(window.innerWidth - x, b[2] + 20);
      const h = Math.min(window.innerHeight - y, b[3] + 20);
      if (w <= 0 || h <= 0) continue;
      const c = document.createElement('canvas');
      c.width = Math.round(w * dpr);
      c.height = Math.round(h * dpr);
      c.getContext('2d').drawImage(img, x * dpr, y * dpr, w * dpr, h * dpr, 0, 0, c.width, c.height);
      const blob = await new Promise((r) => c.toBlob(r, 'image/png'));
      const url = URL.createObjectURL(blob);
      const a = el('a', { href: url, download: `standout-${path.replace(/\//g, '-')}.png` });
      state.root.appendChild(a);
      a.click();
      a.remove();
      setTimeout(() => URL.revokeObjectURL(url), 10000);
    }
  }

  // ---------- lifecycle ----------

  function ensureHost() {
    if (state.host) return;
    const host = document.createElement('standout-overlay');
    host.style.position = 'absolute';
    host.style.left = '0px';
    host.style.top = '0px';
    host.style.width = '0px';
    host.style.height = '0px';
    host.style.zIndex = '2147483647';
    host.style.pointerEvents = 'none';
    state.root = host.attachShadow({ mode: 'closed' });
    const style = document.createElement('style');
    style.textContent = CSS;
    state.root.appendChild(style);
    state.panel = el('div');
    state.root.appendChild(state.panel);
    // On the root element, so that a whole-page preview (a filter on
    // <body>) leaves the overlay's own colours alone.
    document.documentElement.appendChild(host);
    state.host = host;
    listen(window, 'scroll', schedulePosition, { capture: true, passive: true });
    listen(window, 'resize', schedulePosition, { passive: true });
    listen(window, 'keydown', (ev) => {
      if (ev.key === 'Escape' && state.open) {
        ev.preventDefault();
        teardown();
      }
    }, { capture: true });
    state.open = true;
  }

  // unpack turns the background's {response, timing} into {report,
  // timing}, or throws the core's error.
  function unpack(data) {
    const r = JSON.parse(data.response);
    if (!r.ok) throw new Error(r.error);
    // The core sends the overlay's digest of the report; the whole report
    // is made when it is exported.
    return { report: r.overlay, timing: Object.assign({}, data.timing, { core: r.timing }) };
  }

  function render(data) {
    const t0 = performance.now();
    let result;
    try {
      result = unpack(data);
    } catch (e) {
      showError(String((e && e.message) || e));
      return;
    }
    ensureHost();
    const panel = buildPanel(result);
    state.panel.replaceWith(panel);
    state.panel = panel;
    drawLayers(result.report.pages[0]);
    showSelection();
    observeCharts();
    result.timing.renderMs = performance.now() - t0;
    state.host.setAttribute('data-timing', JSON.stringify(result.timing));
    state.host.setAttribute('data-state', 'ready');
    panel.setAttribute('tabindex', '-1');
    panel.focus({ preventScroll: true });
  }

  function showError(msg) {
    ensureHost();
    const panel = el('div', { class: 'panel error', role: 'alert' });
    panel.appendChild(el('h1', {}, 'Standout could not check this page'));
    panel.appendChild(el('p', {}, msg));
    const close = el('button', { type: 'button', 'data-action': 'close' }, 'Close');
    close.addEventListener('click', () => teardown());
    panel.appendChild(close);
    state.panel.replaceWith(panel);
    state.panel = panel;
    state.host.setAttribute('data-state', 'error');
  }

  function teardown() {
    clearPreview();
    for (const o of state.observers) o.disconnect();
    state.observers = [];
    clearTimeout(state.rerunTimer);
    if (state.frame) cancelAnimationFrame(state.frame);
    state.frame = 0;
    for (const [t, type, fn, opts] of state.listeners) t.removeEventListener(type, fn, opts);
    state.listeners = [];
    if (state.host) state.host.remove();
    state.host = null;
    state.root = null;
    state.panel = null;
    state.layers.clear();
    state.picked.clear();
    state.emphasis = [];
    state.picking = false;
    state.catcher = null;
    state.open = false;
  }

  // read reads the page for the core: the read pass's result as one JSON
  // string (it crosses the messaging layer far faster than a large object,
  // and goes to the core as it is), with its timings.
  function read() {
    const t0 = performance.now();
    const page = globalThis.standoutReader.readPage(document);
    const t1 = performance.now();
    const json = JSON.stringify(page);
    return { json, readMs: t1 - t0, stringifyMs: performance.now() - t1 };
  }

  // press is the toolbar action: it closes an open check, or reads the
  // page for a new one.
  function press() {
    if (state.open) {
      teardown();
      return { closed: true };
    }
    return read();
  }

  // The background calls these through chrome.scripting (press through
  // press.js).
  globalThis.standoutOverlay = Object.freeze({ press, read, show: render, showError });
})();
