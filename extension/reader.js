// The read pass: one walk over the live page that turns every inline SVG
// chart into the snapshot that Go's dom.Walk reads (see dom/snapshot.go for
// the format). The extension injects this file into the page, and the
// command line's browser mode evaluates the very same file, so the two
// ways in share one reader.
//
// It only reads: it never changes the page.
(() => {
  if (globalThis.standoutReader) return;

  const SNAPSHOT_VERSION = 1;
  // Elements whose content is never rendered directly (dom/build.go).
  const NOT_RENDERED = new Set([
    'defs', 'clippath', 'mask', 'marker', 'pattern', 'symbol', 'lineargradient',
    'radialgradient', 'style', 'script', 'metadata', 'foreignobject', 'filter',
  ]);
  const GEOM = {
    rect: ['x', 'y', 'width', 'height', 'rx', 'ry'],
    image: ['x', 'y', 'width', 'height'],
    circle: ['cx', 'cy', 'r'],
    ellipse: ['cx', 'cy', 'rx', 'ry'],
    line: ['x1', 'y1', 'x2', 'y2'],
    text: ['x', 'y'],
  };
  const SHAPES = new Set(['circle', 'ellipse', 'rect', 'line', 'polyline', 'polygon', 'path', 'text', 'image']);
  const SVG_NS = 'http://www.w3.org/2000/svg';
  const PLAIN_NUMBER = /^\s*[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?\s*$/;

  let canvasCtx = null;

  // Packs a CSS colour string into 0xRRGGBBAA (unsigned). Computed colours
  // are usually rgb()/rgba(); anything else is normalised by a canvas.
  function packColour(s) {
    let m = /^rgba?\(\s*([\d.]+)[ ,]+([\d.]+)[ ,]+([\d.]+)(?:\s*[,/]\s*([\d.]+%?))?\s*\)$/.exec(s);
    if (!m) {
      canvasCtx = canvasCtx || document.createElement('canvas').getContext('2d');
      canvasCtx.fillStyle = '#000';
      canvasCtx.fillStyle = s;
      const n = canvasCtx.fillStyle;
      if (/^#[0-9a-f]{6}$/i.test(n)) {
        return (parseInt(n.slice(1), 16) * 256 + 255) >>> 0;
      }
      m = /^rgba?\(\s*([\d.]+)[ ,]+([\d.]+)[ ,]+([\d.]+)(?:\s*[,/]\s*([\d.]+%?))?\s*\)$/.exec(n);
      if (!m) return null;
    }
    const c = (v) => Math.max(0, Math.min(255, Math.round(parseFloat(v))));
    let a = 1;
    if (m[4] !== undefined) a = m[4].endsWith('%') ? parseFloat(m[4]) / 100 : parseFloat(m[4]);
    a = Math.max(0, Math.min(255, Math.round(a * 255)));
    return ((c(m[1]) << 24) | (c(m[2]) << 16) | (c(m[3]) << 8) | a) >>> 0;
  }

  function findById(root, id) {
    if (root.getElementById) return root.getElementById(id);
    return root.querySelector('#' + CSS.escape(id));
  }

  // Resolves a gradient's stops (following href when it has none).
  function stops(el, root, depth) {
    const out = [];
    let last = 0;
    for (const s of el.children) {
      if (s.localName !== 'stop') continue;
      const cs = getComputedStyle(s);
      let off = parseFloat(s.getAttribute('offset') || '0');
      if ((s.getAttribute('offset') || '').trim().endsWith('%')) off /= 100;
      off = Math.max(last, Math.min(1, Math.max(0, isFinite(off) ? off : 0)));
      last = off;
      let c = packColour(cs.stopColor);
      if (c === null) c = 0x000000ff;
      const a = ((c & 0xff) / 255) * Math.max(0, Math.min(1, parseFloat(cs.stopOpacity)));
      c = ((c & 0xffffff00) | Math.round(a * 255)) >>> 0;
      out.push([off, c]);
    }
    if (out.length === 0 && depth < 16) {
      const h = el.getAttribute('href') || el.getAttributeNS('http://www.w3.org/1999/xlink', 'href');
      if (h && h.startsWith('#')) {
        const t = findById(root, h.slice(1));
        if (t) return stops(t, root, depth + 1);
      }
    }
    return out;
  }

  function stopAt(st, t) {
    if (t <= st[0][0]) return st[0][1];
    for (let i = 1; i < st.length; i++) {
      if (t <= st[i][0]) {
        const [a0, ca] = st[i - 1];
        const [a1, cb] = st[i];
        const f = a1 > a0 ? (t - a0) / (a1 - a0) : 0;
        const ch = (c, sh) => (c >>> sh) & 0xff;
        const mix = (sh) => Math.round(ch(ca, sh) + (ch(cb, sh) - ch(ca, sh)) * f);
        return ((mix(24) << 24) | (mix(16) << 16) | (mix(8) << 8) | mix(0)) >>> 0;
      }
    }
    return st[st.length - 1][1];
  }

  // Computed fill or stroke to a Paint: {k: 0 none | 1 colour | 2 server}.
  // Colours repeat across marks, so plain colours are cached by string.
  const paintCache = new Map();
  function paint(v, root) {
    if (v && !v.startsWith('url(')) {
      let p = paintCache.get(v);
      if (!p) {
        p = paintUncached(v, root);
        paintCache.set(v, p);
      }
      return p;
    }
    return paintUncached(v, root);
  }

  function paintUncached(v, root) {
    if (!v || v === 'none') return { k: 0 };
    if (v.startsWith('url(')) {
      const m = /^url\(\s*["']?#([^"')]+)["']?\s*\)\s*(.*)$/.exec(v);
      const el = m && findById(root, m[1]);
      if (el) {
        const n = el.localName.toLowerCase();
        if (n === 'lineargradient' || n === 'radialgradient') {
          const st = stops(el, root, 0);
          if (st.length === 0) return { k: 0 };
          return { k: 2, c: stopAt(st, 0.5), st: st.map((s) => s[1]) };
        }
        if (n === 'pattern') {
          const list = [];
          let best = 0;
          let bestArea = -1;
          for (const c of el.querySelectorAll('*')) {
            const cs = getComputedStyle(c);
            if (!SHAPES.has(c.localName) || cs.fill === 'none' || cs.fill.startsWith('url(')) continue;
            const col = packColour(cs.fill);
            if (col === null || (col & 0xff) === 0) continue;
            list.push(col);
            const w = parseFloat(c.getAttribute('width') || '1');
            const h = parseFloat(c.getAttribute('height') || '1');
            const area = isFinite(w * h) ? w * h : 1;
            if (area > bestArea) { best = col; bestArea = area; }
          }
          if (list.length === 0) return { k: 0 };
          return { k: 2, c: best, st: list };
        }
      }
      if (m && m[2]) return paint(m[2], root);
      return { k: 0 };
    }
    const c = packColour(v);
    if (c === null) return { k: 0 };
    return { k: 1, c };
  }

  function num(v) {
    const x = parseFloat(v);
    return isFinite(x) ? x : 1;
  }

  // The numeric geometry attributes, as the static builder reads them.
  function geometry(el, tag) {
    const keys = GEOM[tag];
    if (!keys) return undefined;
    const g = [];
    for (const k of keys) {
      const a = el.getAttribute(k);
      if (a === null || a === '') {
        g.push((tag === 'rect' || tag === 'image') && (k === 'rx' || k === 'ry') ? -1 : 0);
        continue;
      }
      let v = null;
      // Plain numbers (the usual case) parse directly; lengths with units
      // go through the SVG DOM.
      if (PLAIN_NUMBER.test(a)) {
        g.push(+a);
        continue;
      }
      const p = el[k];
      if (p && p.baseVal !== undefined) {
        const bv = p.baseVal;
        if (bv && typeof bv.value === 'number') v = bv.value;
        else if (bv && bv.numberOfItems > 0) v = bv.getItem(0).value;
      }
      if (v === null) v = parseFloat(a);
      g.push(isFinite(v) ? v : 0);
    }
    if (tag === 'text') g.push(parseFloat(getComputedStyle(el).fontSize) || 16);
    return g;
  }

  function matrixOf(m) {
    return [m.a, m.b, m.c, m.d, m.e, m.f];
  }

  function mul(p, q) {
    return [
      p[0] * q[0] + p[2] * q[1], p[1] * q[0] + p[3] * q[1],
      p[0] * q[2] + p[2] * q[3], p[1] * q[2] + p[3] * q[3],
      p[0] * q[4] + p[2] * q[5] + p[4], p[1] * q[4] + p[3] * q[5] + p[5],
    ];
  }

  // viewBoxMatrix maps a viewBox to a w×h viewport (SVG 1.1 §7.8), the
  // same algorithm as the static builder's.
  function viewBoxMatrix(vb, w, h, par) {
    const sx = w / vb[2];
    const sy = h / vb[3];
    const f = par.trim().split(/\s+/);
    const align = f[0] || 'xMidYMid';
    const slice = f[1] === 'slice';
    if (align === 'none') return [sx, 0, 0, sy, -vb[0] * sx, -vb[1] * sy];
    const s = slice ? Math.max(sx, sy) : Math.min(sx, sy);
    let tx = -vb[0] * s;
    let ty = -vb[1] * s;
    if (align.includes('xMid')) tx += (w - vb[2] * s) / 2;
    else if (align.includes('xMax')) tx += w - vb[2] * s;
    if (align.includes('YMid')) ty += (h - vb[3] * s) / 2;
    else if (align.includes('YMax')) ty += h - vb[3] * s;
    return [s, 0, 0, s, tx, ty];
  }

  function ownTransform(el) {
    const t = el.transform && el.transform.baseVal && el.transform.baseVal.consolidate();
    return t ? matrixOf(t.matrix) : [1, 0, 0, 1, 0, 0];
  }

  // Reads one outermost <svg> into a snapshot. off maps the client
  // coordinates of the element's own window to page coordinates of the top
  // document, in CSS px (the scroll offset, plus the frame's position for
  // charts inside frames).
  function readChart(svg, path, root, off, emphasis) {
    const sx = off[0];
    const sy = off[1];
    const box = svg.getBoundingClientRect();
    const snap = {
      v: SNAPSHOT_VERSION,
      source: svg.ownerDocument.location.href,
      path,
      box: [box.left + sx, box.top + sy, box.width, box.height],
      bg: background(svg),
      nodes: [],
      problems: [],
    };
    const add = (el, parent, name, ctmOverride, useDepth) => {
      const tag = el.localName.toLowerCase();
      const cs = getComputedStyle(el);
      let m;
      if (ctmOverride) {
        m = mul(ctmOverride, ownTransform(el));
      } else {
        const sc = el.getScreenCTM && el.getScreenCTM();
        // Page coordinates: the screen CTM plus the scroll (and frame) offset.
        m = sc ? [sc.a, sc.b, sc.c, sc.d, sc.e + sx, sc.f + sy] : [1, 0, 0, 1, sx, sy];
      }
      const node = {
        p: parent,
        t: tag,
        n: name,
        m,
        f: paint(cs.fill, root),
        s: paint(cs.stroke, root),
        fo: Math.max(0, Math.min(1, num(cs.fillOpacity))),
        so: Math.max(0, Math.min(1, num(cs.strokeOpacity))),
        o: Math.max(0, Math.min(1, num(cs.opacity))),
        sw: Math.max(0, parseFloat(cs.strokeWidth) || 0),
      };
      if (ctmOverride && parent >= 0) {
        // Content instantiated by <use> inherits from the <use>, not from
        // where it is defined. Where the element's value merely repeats its
        // defining parent's (it was inherited there), take the value the
        // instance inherits instead.
        const dp = el.parentElement ? getComputedStyle(el.parentElement) : null;
        const up = snap.nodes[parent];
        if (dp) {
          if (cs.fill === dp.fill) node.f = up.f;
          if (cs.stroke === dp.stroke) node.s = up.s;
          if (cs.fillOpacity === dp.fillOpacity) node.fo = up.fo;
          if (cs.strokeOpacity === dp.strokeOpacity) node.so = up.so;
          if (cs.strokeWidth === dp.strokeWidth) node.sw = up.sw;
        }
      }
      const g = geometry(el, tag);
      if (g) node.g = g;
      if (tag === 'path') node.d = el.getAttribute('d') || '';
      if (tag === 'polyline' || tag === 'polygon') node.d = el.getAttribute('points') || '';
      let x = 0;
      if (cs.display === 'none') x |= 1;
      if (cs.visibility === 'hidden' || cs.visibility === 'collapse') x |= 2;
      if ((cs.clipPath && cs.clipPath !== 'none') || (cs.mask && cs.mask !== 'none' && cs.mask !== '')) x |= 4;
      if (cs.pointerEvents === 'none') x |= 8;
      if (x) node.x = x;
      if (tag === 'text' || tag === 'title' || tag === 'desc') {
        const t = (el.textContent || '').trim();
        if (t) node.tx = t;
      }
      const al = el.getAttribute('aria-label');
      if (al) node.al = al;
      if (SHAPES.has(tag) && !ctmOverride && !(x & 1)) {
        const r = el.getBoundingClientRect();
        node.b = [r.left + sx, r.top + sy, r.width, r.height];
      }
      const idx = snap.nodes.length;
      snap.nodes.push(node);
      if (el.hasAttribute('data-standout-emphasis') || (emphasis && el.matches(emphasis))) {
        (snap.sel = snap.sel || []).push(idx);
      }
      if (tag === 'text' || tag === 'title' || tag === 'desc' || NOT_RENDERED.has(tag)) return;
      if (tag === 'use') {
        expandUse(el, idx, name, m, useDepth);
        return;
      }
      let k = 0;
      for (const c of el.children) {
        const cname = name + '/' + c.localName.toLowerCase() + k;
        k++;
        if (c.namespaceURI !== SVG_NS) continue;
        add(c, idx, cname, ctmOverride ? mul(m, [1, 0, 0, 1, 0, 0]) : null, useDepth);
      }
    };
    const expandUse = (el, idx, name, m, depth) => {
      const h = el.getAttribute('href') || el.getAttributeNS('http://www.w3.org/1999/xlink', 'href');
      if (!h || !h.startsWith('#')) return;
      const target = findById(root, h.slice(1));
      if (!target) {
        snap.problems.push(`${name}: <use> refers to missing #${h.slice(1, 61)}`);
        return;
      }
      if (depth >= 16 || target.contains(el)) {
        snap.problems.push(`${name}: <use> of #${h.slice(1, 61)} is a reference cycle; not expanded`);
        return;
      }
      const ux = el.x ? el.x.baseVal.value : 0;
      const uy = el.y ? el.y.baseVal.value : 0;
      const base = mul(m, [1, 0, 0, 1, ux, uy]);
      const tname = name + '>' + target.localName.toLowerCase();
      let inner = base;
      if (target.localName === 'symbol') {
        // As the static builder does (dom/build.go): a symbol is a nested
        // viewport sized by the use's width and height (else its own, else
        // 100), mapped from its viewBox.
        const size = (k) => {
          for (const e of [el, target]) {
            const v = parseFloat(e.getAttribute(k));
            if (e.getAttribute(k) !== null && isFinite(v)) return v;
          }
          return 100;
        };
        const vb = (target.getAttribute('viewBox') || '').trim().split(/[\s,]+/).map(Number);
        if (vb.length === 4 && vb.every(isFinite) && vb[2] > 0 && vb[3] > 0) {
          inner = mul(base, viewBoxMatrix(vb, size('width'), size('height'), target.getAttribute('preserveAspectRatio') || ''));
        }
      }
      addClone(target, idx, tname, inner, depth + 1);
    };
    // Content instantiated by <use>: positions come from the use's matrix
    // and the content's own transforms, paints from computed style.
    const addClone = (el, parent, name, base, depth) => {
      const tag = el.localName.toLowerCase();
      if (tag === 'symbol') {
        const cs = getComputedStyle(el);
        const dp = el.parentElement ? getComputedStyle(el.parentElement) : null;
        const up = snap.nodes[parent];
        const gi = snap.nodes.length;
        snap.nodes.push({
          p: parent, t: 'g', n: name, m: base,
          f: dp && cs.fill === dp.fill ? up.f : paint(cs.fill, root),
          s: dp && cs.stroke === dp.stroke ? up.s : paint(cs.stroke, root),
          fo: 1, so: 1, o: num(cs.opacity), sw: 1,
        });
        let k = 0;
        for (const c of el.children) {
          const cname = name + '/' + c.localName.toLowerCase() + k;
          k++;
          if (c.namespaceURI === SVG_NS) add(c, gi, cname, base, depth);
        }
        return;
      }
      add(el, parent, name, base, depth);
    };
    add(svg, -1, path, null, 0);
    return snap;
  }

  // The colour behind an element: ancestors' backgrounds composited over
  // white, nearest last.
  function background(el) {
    const chain = [];
    for (let p = el.parentElement; p; p = p.parentElement) chain.push(p);
    let r = 255, g = 255, b = 255;
    for (let i = chain.length - 1; i >= 0; i--) {
      const c = packColour(getComputedStyle(chain[i]).backgroundColor);
      if (c === null) continue;
      const a = (c & 0xff) / 255;
      if (a === 0) continue;
      r = a * (c >>> 24) + (1 - a) * r;
      g = a * ((c >>> 16) & 0xff) + (1 - a) * g;
      b = a * ((c >>> 8) & 0xff) + (1 - a) * b;
    }
    return ((Math.round(r) << 24) | (Math.round(g) << 16) | (Math.round(b) << 8) | 255) >>> 0;
  }

  // Finds the outermost <svg> elements of a document or shadow root in
  // document order, descending into open shadow roots and same-origin
  // frames. Each entry: {svg, path, root, off}. Frames that cannot be read
  // are listed in problems.
  function findCharts(doc, problems) {
    const out = [];
    let nTop = 0;
    let nShadow = 0;
    let nFrame = 0;
    const visit = (root, prefix, off, top, frames) => {
      const walker = (root.ownerDocument || root).createTreeWalker(root, NodeFilter.SHOW_ELEMENT);
      let n = walker.currentNode;
      if (n === root) n = walker.nextNode();
      while (n) {
        const tag = n.localName;
        if (tag === 'svg' && n.namespaceURI === SVG_NS) {
          const path = top ? 'svg' + nTop++ : prefix + 'svg' + out.filter((c) => c.path.startsWith(prefix)).length;
          out.push({ svg: n, path, root, off, frames });
          // Skip the subtree: nested <svg> belong to this chart.
          let next = walker.nextSibling();
          while (!next && walker.parentNode()) next = walker.nextSibling();
          n = next;
          continue;
        }
        if (n.shadowRoot) {
          visit(n.shadowRoot, 'shadow' + nShadow++ + '/', off, false, frames);
        }
        if (tag === 'iframe' || tag === 'frame') {
          const i = nFrame++;
          let d = null;
          try {
            d = n.contentDocument;
          } catch (e) {
            d = null;
          }
          if (!d) {
            problems.push(`frame${i} (${(n.getAttribute('src') || '').slice(0, 120)}): not readable (a cross-origin frame); its charts were not checked`);
          } else {
            const r = n.getBoundingClientRect();
            const cs = getComputedStyle(n);
            // off already holds this window's scroll; frames nest.
            const fx = off[0] + r.left + (parseFloat(cs.borderLeftWidth) || 0) + (parseFloat(cs.paddingLeft) || 0);
            const fy = off[1] + r.top + (parseFloat(cs.borderTopWidth) || 0) + (parseFloat(cs.paddingTop) || 0);
            visit(d, 'frame' + i + '/', [fx, fy], false, frames.concat([n]));
          }
        }
        n = walker.nextNode();
      }
    };
    visit(doc, '', [window.scrollX, window.scrollY], true, []);
    return out;
  }

  // pageBox is a chart's current box in page coordinates of the top
  // document, following the frames it sits in.
  function pageBox(entry) {
    let x = window.scrollX;
    let y = window.scrollY;
    for (const f of entry.frames) {
      const r = f.getBoundingClientRect();
      const cs = getComputedStyle(f);
      x += r.left + (parseFloat(cs.borderLeftWidth) || 0) + (parseFloat(cs.paddingLeft) || 0);
      y += r.top + (parseFloat(cs.borderTopWidth) || 0) + (parseFloat(cs.paddingTop) || 0);
    }
    const r = entry.svg.getBoundingClientRect();
    return [x + r.left, y + r.top, r.width, r.height];
  }

  // Reads every chart of the page. opts.emphasis, a CSS selector, names
  // the intended emphasis besides the data-standout-emphasis attribute.
  function readPage(doc, opts) {
    const emphasis = (opts && opts.emphasis) || '';
    const t0 = performance.now();
    const problems = [];
    const charts = findCharts(doc || document, problems);
    const snapshots = [];
    for (const c of charts) {
      try {
        snapshots.push(readChart(c.svg, c.path, c.root, c.off, emphasis));
      } catch (e) {
        problems.push(`${c.path}: could not be read: ${e && e.message}`);
      }
    }
    return { source: location.href, snapshots, problems, readMs: performance.now() - t0 };
  }

  globalThis.standoutReader = Object.freeze({ readPage, findCharts, pageBox, SNAPSHOT_VERSION });
})();
