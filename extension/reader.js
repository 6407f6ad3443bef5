// The read pass: one walk over the live page that turns every inline SVG
// chart into the snapshot that Go's marks.Walk reads (see snapshot/json.go
// for the format, and constants.js for its numbers, generated from Go). The extension injects this file into the page, and the
// command line's browser mode evaluates the very same file, so the two
// ways in share one reader.
//
// It only reads: it never changes the page.
(() => {
  if (globalThis.standoutReader) return;

  // The wire format's numbers, the limits both ways in share (a chart
  // beyond a cap is not read and the page says so: a partial chart would
  // be judged wrongly) and the geometry layouts, generated from Go
  // (constants.js).
  const C = globalThis.standoutConstants;
  const { SNAPSHOT_VERSION, MAX_CHART_NODES, MAX_PAGE_NODES, MAX_USE_NODES, NAME_USE, NAME_NEXT, STR_NEXT, PARENT_PREV, GEOM_AUTO } = C;
  const notRendered = new Set(C.NOT_RENDERED);
  // The read pass hands the tab back to the page after this much work
  // (ms), so that a large page stays responsive while it is read.
  const SLICE_MS = 40;
  const SHAPES = new Set(['circle', 'ellipse', 'rect', 'line', 'polyline', 'polygon', 'path', 'text', 'image']);
  const SVG_NS = 'http://www.w3.org/2000/svg';
  const XHTML_NS = 'http://www.w3.org/1999/xhtml';
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

  // Computed fill or stroke to a Paint: {k: its kind (PAINT_COLOUR or
  // PAINT_SERVER), c: colour, st: stops}; null for none.
  function paintOf(v, root) {
    if (!v || v === 'none') return null;
    if (v.startsWith('url(')) {
      const m = /^url\(\s*["']?#([^"')]+)["']?\s*\)\s*(.*)$/.exec(v);
      const el = m && findById(root, m[1]);
      if (el) {
        const n = el.localName.toLowerCase();
        if (n === 'lineargradient' || n === 'radialgradient') {
          const st = stops(el, root, 0);
          if (st.length === 0) return null;
          return { k: C.PAINT_SERVER, c: stopAt(st, 0.5), st: st.map((s) => s[1]) };
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
          if (list.length === 0) return null;
          return { k: C.PAINT_SERVER, c: best, st: list };
        }
      }
      if (m && m[2]) return paintOf(m[2], root);
      return null;
    }
    const c = packColour(v);
    if (c === null) return null;
    return { k: C.PAINT_COLOUR, c, st: [] };
  }

  function num(v) {
    const x = parseFloat(v);
    return isFinite(x) ? x : 1;
  }

  function clamp01(v) {
    return Math.max(0, Math.min(1, v));
  }

  // Pushes the numeric geometry attributes, as the static builder reads
  // them, onto out (count first), and for text its font size and weight;
  // false when the tag has none.
  function geometry(el, tag, out, fontSize, fontWeight) {
    const keys = C.GEOM[tag];
    if (!keys) return false;
    out.push(keys.length + (tag === 'text' ? 2 : 0));
    for (const k of keys) {
      const a = el.getAttribute(k);
      if (a === null || a === '') {
        out.push(tag === 'rect' && (k === 'rx' || k === 'ry') ? GEOM_AUTO : 0);
        continue;
      }
      // Plain numbers (the usual case) parse directly; lengths with units
      // go through the SVG DOM.
      if (PLAIN_NUMBER.test(a)) {
        out.push(+a);
        continue;
      }
      let v = null;
      const p = el[k];
      if (p && p.baseVal !== undefined) {
        const bv = p.baseVal;
        if (bv && typeof bv.value === 'number') v = bv.value;
        else if (bv && bv.numberOfItems > 0) v = bv.getItem(0).value;
      }
      if (v === null) v = parseFloat(a);
      out.push(isFinite(v) ? v : 0);
    }
    if (tag === 'text') out.push(fontSize, fontWeight);
    return true;
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

  // invert returns the inverse of an affine matrix, or null when it is
  // singular.
  function invert(m) {
    const det = m[0] * m[3] - m[1] * m[2];
    if (!det || !isFinite(det)) return null;
    return [
      m[3] / det, -m[1] / det, -m[2] / det, m[0] / det,
      (m[2] * m[5] - m[3] * m[4]) / det, (m[1] * m[4] - m[0] * m[5]) / det,
    ];
  }

  function sameMatrix(p, q) {
    return p[0] === q[0] && p[1] === q[1] && p[2] === q[2] && p[3] === q[3] && p[4] === q[4] && p[5] === q[5];
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

  // ownTransform is the product of an element's transform list, read
  // without consolidate(), which would rewrite the page's list into one
  // matrix.
  function ownTransform(el) {
    const list = el.transform && el.transform.baseVal;
    let m = [1, 0, 0, 1, 0, 0];
    if (!list) return m;
    for (let i = 0; i < list.numberOfItems; i++) m = mul(m, matrixOf(list.getItem(i).matrix));
    return m;
  }

  // Sibling style sharing. Computed-style reads are most of the read
  // pass's cost, and a chart's marks are mostly siblings alike in every
  // attribute that can reach their style. Two siblings with the same tag
  // and the same class, id, style and presentation attributes have the
  // same computed style when no selector can tell them apart and nothing
  // animates: the cascade then sees the same element twice under the same
  // parent. That is checked for each document or shadow root, cheaply
  // and conservatively: every style sheet must be readable, and no
  // selector may use a pseudo-class, an attribute selector or a sibling
  // combinator: only type, class and id selectors, descendant and child
  // combinators, :root, :host, and :is(), :where() and :not() of such
  // selectors (none of which tells alike siblings apart), and
  // pseudo-elements (which style no element itself); and no animation or
  // transition may be running, nor any SMIL animation be in the root.
  // Otherwise every element's style is read. Siblings that share a style
  // and have no transform share their group's CTM too (ChartWalk.add).
  // The attributes that can reach the style a read pass reads: those
  // selectors and presentation attributes use, and those the browser's
  // own style sheet and <switch> test.
  const STYLE_ATTRS = ['class', 'id', 'style', 'part', 'fill', 'stroke', 'opacity', 'fill-opacity', 'stroke-opacity',
    'stroke-width', 'display', 'visibility', 'color', 'font-size', 'font', 'font-family', 'font-weight', 'hidden',
    'systemLanguage', 'requiredExtensions', 'requiredFeatures'];

  function selectorShareable(sel) {
    const s = sel.replace(/::[-\w]+(\([^)]*\))?/g, '').replace(/:(root|host|is|where|not)\b/g, '');
    return !/[:[+~]/.test(s);
  }

  function rulesShareable(rules, depth) {
    if (depth > 16) return false;
    for (const r of rules) {
      if (r.selectorText !== undefined && !selectorShareable(r.selectorText)) return false;
      if (r.styleSheet) {
        if (!sheetShareable(r.styleSheet, depth + 1)) return false;
        continue;
      }
      let inner;
      try {
        inner = r.cssRules || null;
      } catch {
        return false;
      }
      if (inner && inner.length && !rulesShareable(inner, depth + 1)) return false;
    }
    return true;
  }

  function sheetShareable(sheet, depth) {
    let rules;
    try {
      rules = sheet.cssRules;
    } catch {
      return false; // a cross-origin sheet: its selectors are unknown
    }
    return rulesShareable(rules, depth);
  }

  // siblingsShareStyles says whether sibling style sharing is safe for
  // the charts under root (a document or a shadow root).
  function siblingsShareStyles(root) {
    const doc = root.ownerDocument || root;
    if (typeof doc.getAnimations !== 'function' || doc.getAnimations().length > 0) return false;
    // SMIL animates an element by its children, which no style key sees.
    if (root.querySelector('animate, animateTransform, animateMotion, set')) return false;
    const adopted = adoptedSheets(root);
    if (!adopted) return false;
    for (const sh of [...(root.styleSheets || []), ...adopted]) if (!sheetShareable(sh, 0)) return false;
    return true;
  }

  // adoptedSheets lists root's adopted style sheets, or null when they
  // cannot be listed. Firefox (ESR 140.10) hands a content script the
  // page's list through a wrapper that is neither iterable nor has a
  // length; there the page's own list tells whether it is empty, and a
  // list that is not empty counts as unknown.
  function adoptedSheets(root) {
    const list = root.adoptedStyleSheets;
    if (list == null) return [];
    if (typeof list[Symbol.iterator] === 'function') return [...list];
    try {
      const own = root.wrappedJSObject && root.wrappedJSObject.adoptedStyleSheets;
      return own && own.length === 0 ? [] : null;
    } catch {
      return null;
    }
  }

  const STYLE_ATTR_SET = new Set(STYLE_ATTRS);

  // The style of a clip region's node: no paint, nothing hidden.
  const CLIP_STYLE = Object.freeze([0, 0, 0, 1, 1, 1, 0, 0, 0]);
  // The overflow values with which an <svg> clips what lies outside it
  // (auto is visible for an <svg>).
  const VIEWPORT_CLIPS = new Set(['hidden', 'clip', 'scroll']);

  // The elements whose CTM is their parent's when they have no transform
  // of their own (the shapes, text and groups; not <use>, whose x and y
  // place its content, nor viewports or what is not rendered), and the
  // parents whose CTM they then share: groups.
  const PLAIN_TAGS = new Set(['g', 'a', 'circle', 'ellipse', 'rect', 'line', 'polyline', 'polygon', 'path', 'text']);
  const GROUP_TAGS = new Set(['g', 'a']);

  // untransformed says whether a computed style moves its element by
  // none of CSS's transforms: transform (which holds the transform
  // attribute too), the individual translate, rotate and scale, a motion
  // path, or zoom.
  function untransformed(cs) {
    const none = (v) => v === undefined || v === '' || v === 'none';
    return none(cs.transform) && none(cs.translate) && none(cs.rotate) && none(cs.scale) && none(cs.offsetPath) && (cs.zoom === undefined || cs.zoom === '' || cs.zoom === '1' || cs.zoom === 'normal');
  }

  // styleKey is what of an element's attributes can reach its style: its
  // tag and those attributes, by name and value, in document order (the
  // names are listed in one call; asking for each attribute in turn costs
  // more than the style read it saves).
  function styleKey(el, tag) {
    let k = tag;
    for (const a of el.getAttributeNames()) {
      if (STYLE_ATTR_SET.has(a)) k += '\u0000' + a + '\u0001' + el.getAttribute(a);
      else if (a === 'transform') k += '\u0000transform'; // siblings share a CTM only without one
    }
    return k;
  }

  const IDENTITY = [1, 0, 0, 1, 0, 0];
  // The optional fields of a node record and the slots of its style
  // (snapshot/json.go).
  const { HAS_CTM, HAS_GEOM, HAS_BBOX, HAS_D, HAS_TEXT, HAS_LABEL, HAS_NAME, HAS_SAME_STYLE, HAS_CLASS, HAS_STYLE_REF } = C;
  const { STYLE_FILL, STYLE_STROKE, STYLE_FILL_OPACITY, STYLE_STROKE_OPACITY, STYLE_STROKE_WIDTH } = C;

  // sameStyle compares the seven numbers of two records' styles.
  function sameStyle(a, b) {
    return a[0] === b[0] && a[1] === b[1] && a[2] === b[2] && a[3] === b[3] && a[4] === b[4] && a[5] === b[5] && a[6] === b[6];
  }

  // styleHash is a number that alike styles share, and unlike ones seldom.
  function styleHash(st) {
    return st[0] + 3 * (st[1] + 4099 * (st[2] + 4099 * (st[3] + 7 * (st[4] + 7 * (st[5] + 7 * st[6])))));
  }

  // capError is thrown when a chart passes a cap; its message is the note.
  class capError extends Error {}

  // The paints and styles of the charts read last, by path: the computed
  // values of the paints table's entries 1…, and the styles written out
  // (seven numbers each), in order. A chart's next reading starts from
  // them, writing the styles as its "styles" table (snapshot/json.go), so
  // that a paint or a style new to the chart (a mark given a colour of
  // its own) takes the next entry instead of shifting, in every record
  // after the mark, the numbers of those first met after it; the reading
  // then crosses as a patch (patch.js). Entries the reading does not use
  // stay, up to as many as it uses (and KEPT_SPARE); past that the table
  // starts again from the entries in use, and the styles with the paints.
  const keptPaints = new Map();
  const keptStyles = new Map();
  const KEPT_SPARE = 16;

  // keptIn is the list of values whose used flag is set, or all of them
  // while the unused are few enough and all are no more than a chart's
  // elements (so a reading's styles table, what was kept and what the
  // reading added, stays within what the core takes: snapshot/json.go).
  function keptIn(values, used) {
    const inUse = values.filter((_, i) => used[i]);
    const spare = values.length - inUse.length;
    return spare > inUse.length + KEPT_SPARE || values.length > MAX_CHART_NODES ? inUse : values;
  }

  // SnapshotWriter writes one chart's snapshot in its columnar JSON form,
  // record by record, as snapshot/json.go's encoder does: the tags, paints
  // and strings tables, and per node its record (parent, tag, name link,
  // has bits, the style unless it repeats the previous record's, then the
  // optional fields in the order of their bits). It also keeps what the
  // walk needs back per node: its style, its CTM and its name's parts.
  class SnapshotWriter {
    constructor(path, paintOf) {
      this.path = path;
      this.paintOf = paintOf;
      this.tags = [];
      this.tagIndex = new Map();
      this.paints = [0, 0, 0]; // entry 0: none
      this.nPaints = 1;
      this.paintIndex = new Map();
      this.paintValues = []; // the computed value of each entry from 1 on
      this.paintUsed = []; // whether a record uses each entry from 1 on
      for (const v of keptPaints.get(path) || []) this.entry(v, false);
      this.sharedIndex = new Map(); // strings many records repeat, by text
      this.strs = [];
      this.nodes = [];
      this.sel = [];
      this.problems = [];
      this.styles = [];
      this.ctms = [];
      this.parentOf = [];
      this.linkOf = [];
      this.lastK = []; // per node, the link of its last child named by one, or -1
      this.tagName = [];
      this.prev = null;
      this.full = []; // the styles table: those kept, then those new, in order
      this.fullUsed = []; // whether a record uses each of full
      this.byKey = new Map(); // styleHash → the numbers in full of its styles
      this.written = new Map(); // style arrays → their number in full
      for (const st of keptStyles.get(path) || []) this.add(st, false);
    }

    // add puts a style in full and returns its number.
    add(st, used) {
      const n = this.full.length;
      this.full.push(st);
      this.fullUsed.push(used);
      this.written.set(st, n);
      const k = styleHash(st);
      const b = this.byKey.get(k);
      if (b) b.push(n);
      else this.byKey.set(k, [n]);
      return n;
    }

    get count() {
      return this.styles.length;
    }

    tag(t) {
      let i = this.tagIndex.get(t);
      if (i === undefined) {
        i = this.tags.length;
        this.tags.push(t);
        this.tagIndex.set(t, i);
      }
      return i;
    }

    // paint is the index of a computed paint's entry in the paints table.
    paint(v) {
      const i = this.paintIndex.get(v);
      if (i === undefined) return this.entry(v, true);
      if (i > 0) this.paintUsed[i - 1] = true;
      return i;
    }

    // entry adds v's entry to the paints table and returns its index, 0
    // for none. A kept value that no longer resolves (a gradient taken
    // away) keeps its place, as an entry of kind none.
    entry(v, used) {
      const p = this.paintOf(v);
      if (!p && used) {
        this.paintIndex.set(v, 0);
        return 0;
      }
      const i = this.nPaints++;
      this.paintValues.push(v);
      this.paintUsed.push(used);
      if (!p) {
        this.paints.push(0, 0, 0);
        this.paintIndex.set(v, 0);
        return 0;
      }
      this.paints.push(p.k, p.c, p.st.length);
      for (const c of p.st) this.paints.push(c);
      this.paintIndex.set(v, i);
      return i;
    }

    // keep keeps the paints and the styles for the chart's next reading.
    // Styles name paints by number, so they start again with the paints.
    keep() {
      const paints = keptIn(this.paintValues, this.paintUsed);
      keptPaints.set(this.path, paints);
      keptStyles.set(this.path, paints === this.paintValues ? keptIn(this.full, this.fullUsed) : []);
    }

    // begin starts a node's record and returns the node's index; its has
    // bits are written by end. A child's link that follows its parent's
    // last one is written as NAME_NEXT, and a parent that is the record
    // just before as PARENT_PREV, so that an element added or taken away
    // leaves the records after it as they were, and the next reading
    // crosses as a patch (patch.js).
    begin(parent, tag, link, ctm) {
      const idx = this.styles.length;
      this.at = this.nodes.length;
      this.ctms.push(ctm);
      this.parentOf.push(parent);
      this.linkOf.push(link);
      this.lastK.push(-1);
      this.tagName.push(tag);
      let field = link < 0 ? NAME_USE : link;
      if (link >= 0 && parent >= 0) {
        if (link === this.lastK[parent] + 1) field = NAME_NEXT;
        this.lastK[parent] = link;
      }
      this.nodes.push(parent >= 0 && parent === idx - 1 ? PARENT_PREV : parent, this.tag(tag), field, 0);
      return idx;
    }

    // style writes the record's style; when it repeats the previous
    // record's (as runs of marks do), it says so in the has bits it
    // returns, and otherwise it writes the style's number in the styles
    // table, which it adds to when the style is new. So a reading of an
    // unchanged chart is the same string as the last, although its table
    // started from the last one's. A style shared among alike siblings is
    // one array (ChartWalk.style): it is found by identity, others by their
    // values (among those with their hash).
    style(st) {
      const p = this.prev;
      this.styles.push(st);
      this.prev = st;
      if (p && sameStyle(st, p)) return HAS_SAME_STYLE;
      let ref = this.written.get(st);
      const b = (ref === undefined && this.byKey.get(styleHash(st))) || [];
      for (let i = 0; ref === undefined && i < b.length; i++) {
        if (sameStyle(st, this.full[b[i]])) ref = b[i];
      }
      if (ref === undefined) {
        ref = this.add(st, true);
      } else {
        this.written.set(st, ref);
        this.fullUsed[ref] = true;
      }
      this.nodes.push(ref);
      return HAS_STYLE_REF;
    }

    // ctm writes the node's CTM where it is not its parent's.
    ctm(idx, m) {
      const parent = this.parentOf[idx];
      if (sameMatrix(m, parent >= 0 ? this.ctms[parent] : IDENTITY)) return 0;
      this.nodes.push(m[0], m[1], m[2], m[3], m[4], m[5]);
      return HAS_CTM;
    }

    box(r, sx, sy) {
      this.nodes.push(r.left + sx, r.top + sy, r.width, r.height);
      return HAS_BBOX;
    }

    // text writes a string field (D, Text, Label or Name) with its bit.
    // A string new to strs is written STR_NEXT, not its index, so that the
    // records after an element added or taken away stay as they were.
    text(s, bit) {
      this.nodes.push(STR_NEXT);
      this.strs.push(s);
      return bit;
    }

    // shared writes a string field that many records repeat (Class) once
    // into strs, every record pointing at it.
    shared(s, bit) {
      const k = this.sharedIndex.get(s);
      if (k !== undefined) {
        this.nodes.push(k);
        return bit;
      }
      this.sharedIndex.set(s, this.strs.length);
      return this.text(s, bit);
    }

    end(has) {
      this.nodes[this.at + 3] = has;
    }

    nameOf(i) {
      if (this.parentOf[i] < 0) return this.path;
      const k = this.linkOf[i];
      return this.nameOf(this.parentOf[i]) + (k < 0 ? '>' + this.tagName[i] : '/' + this.tagName[i] + k);
    }

    snapshot(source, title, anchor, box, bg) {
      this.keep();
      const snap = {
        v: SNAPSHOT_VERSION, source, path: this.path, box, bg, problems: this.problems,
        tags: this.tags, paints: this.paints, strs: this.strs, nodes: this.nodes,
      };
      // A walk's style array holds more than a record writes (ChartWalk).
      snap.styles = this.full.flatMap((st) => st.slice(0, 7));
      if (title) snap.title = title;
      if (anchor) snap.anchor = anchor;
      if (this.sel.length) snap.sel = this.sel;
      return snap;
    }
  }

  // screenCTMOf is el's transform to page px: the screen CTM plus the
  // offset (sx, sy). vp is el's nearest viewport ({} when its mapping to
  // the screen is not known yet): getCTM, which maps to the viewport,
  // costs about half of getScreenCTM, and the viewport's own mapping to
  // the screen is the same for every element in it.
  function screenCTMOf(el, vp, sx, sy) {
    let m;
    if (!el.getCTM) {
      m = null; // not a graphics element (<title>, <style>, …)
    } else if (vp && vp.toScreen === undefined) {
      const sc = el.getScreenCTM();
      const c = el.getCTM();
      const inv = c && sc && invert(matrixOf(c));
      vp.toScreen = inv ? mul(matrixOf(sc), inv) : null;
      m = sc ? matrixOf(sc) : null;
    } else if (vp && vp.toScreen) {
      const c = el.getCTM();
      m = c ? mul(vp.toScreen, matrixOf(c)) : null;
    } else {
      const sc = el.getScreenCTM();
      m = sc ? matrixOf(sc) : null;
    }
    if (!m) return [1, 0, 0, 1, sx, sy];
    m[4] += sx;
    m[5] += sy;
    return m;
  }

  // styleOf reads an element's style as a record holds it, with its font
  // size and weight: [flags, fill, stroke, fill-opacity, stroke-opacity,
  // opacity, stroke-width, font size, font weight], its paints as indices
  // into w's table. up is
  // the style of the <use> (or of the instantiated parent) for content a
  // <use> instantiates, which inherits from there, not from where it is
  // defined: where the element's value merely repeats its defining
  // parent's (it was inherited there), the instance's inherited value is
  // taken instead.
  function styleOf(w, el, tag, up) {
    const cs = getComputedStyle(el);
    let fi = w.paint(cs.fill);
    let si = w.paint(cs.stroke);
    const dp = up && el.parentElement ? getComputedStyle(el.parentElement) : null;
    let fo = 1;
    let so = 1;
    let sw = 0;
    if (fi || up) fo = clamp01(num(cs.fillOpacity));
    if (si || up) {
      so = clamp01(num(cs.strokeOpacity));
      sw = Math.max(0, parseFloat(cs.strokeWidth) || 0);
    }
    if (dp) {
      if (cs.fill === dp.fill) fi = up[STYLE_FILL];
      if (cs.stroke === dp.stroke) si = up[STYLE_STROKE];
      if (cs.fillOpacity === dp.fillOpacity) fo = up[STYLE_FILL_OPACITY];
      if (cs.strokeOpacity === dp.strokeOpacity) so = up[STYLE_STROKE_OPACITY];
      if (cs.strokeWidth === dp.strokeWidth) sw = up[STYLE_STROKE_WIDTH];
    }
    let x = 0;
    if (cs.display === 'none') x |= C.NODE_HIDDEN;
    const vis = cs.visibility;
    if (vis === 'hidden' || vis === 'collapse') x |= C.NODE_INVISIBLE;
    const fontSize = tag === 'text' ? parseFloat(cs.fontSize) || 16 : 0;
    const fontWeight = tag === 'text' ? parseFloat(cs.fontWeight) || 400 : 0;
    return [x, fi, si, fo, so, clamp01(num(cs.opacity)), sw, fontSize, fontWeight];
  }

  // ChartWalk walks one outermost <svg> in document order and writes each
  // element to a SnapshotWriter: the DOM side of the read pass.
  class ChartWalk {
    constructor(svg, path, root, off, emphasis, share, budget) {
      this.path = path;
      this.root = root;
      this.sx = off[0];
      this.sy = off[1];
      this.emphasis = emphasis;
      this.share = share;
      this.budget = budget;
      this.useNodes = 0;
      this.w = new SnapshotWriter(path, (v) => paintOf(v, root));
    }

    // count enforces the caps before an element is read.
    count(useDepth) {
      const path = this.path;
      if (this.w.count >= MAX_CHART_NODES) throw new capError(`${path}: not checked: it has more than ${MAX_CHART_NODES} elements`);
      if (this.budget.nodes++ >= MAX_PAGE_NODES) throw new capError(`${path} and the charts after it: not checked: the page's charts have more than ${MAX_PAGE_NODES} elements`);
      if (useDepth > 0 && this.useNodes++ >= MAX_USE_NODES) throw new capError(`${path}: not checked: it instantiates more than ${MAX_USE_NODES} elements through <use> (a chain of references?)`);
    }

    // style reads el's style, shared among alike siblings where that is
    // safe (shared maps their style keys to {st, plain}: the style, and
    // whether the siblings have neither a transform attribute nor a
    // transform in their computed style, which sharing finds once for
    // all of them). It returns {st, plain}; plain is false where the
    // style was read alone.
    style(el, tag, parent, instanced, shared) {
      if (instanced && parent >= 0) return { st: styleOf(this.w, el, tag, this.w.styles[parent]), plain: false };
      if (!shared) return { st: styleOf(this.w, el, tag, null), plain: false };
      const key = styleKey(el, tag);
      let e = shared.get(key);
      if (!e) {
        e = { st: styleOf(this.w, el, tag, null), plain: PLAIN_TAGS.has(tag) && !el.hasAttribute('transform') && untransformed(getComputedStyle(el)) };
        shared.set(key, e);
      }
      return e;
    }

    // add writes el's record and walks its subtree. k is its index among
    // its parent's element children, or NAME_USE for content a <use>
    // instantiates; vp is its nearest viewport; ctmOverride is its parent's
    // CTM for instantiated content, which the browser does not lay out.
    add(el, parent, k, vp, ctmOverride, useDepth, shared) {
      this.count(useDepth);
      const w = this.w;
      const tag = el.localName.toLowerCase();
      const { st, plain } = this.style(el, tag, parent, !!ctmOverride, shared);
      // An <svg> is a viewport of its own: measured directly. An element
      // with no transform of its own in a group has the group's CTM: a
      // getCTM per mark was about a third of reading a large scatter.
      let m;
      if (ctmOverride) m = mul(ctmOverride, ownTransform(el));
      else if (plain && parent >= 0 && GROUP_TAGS.has(w.tagName[parent])) m = w.ctms[parent];
      else m = screenCTMOf(el, tag === 'svg' ? null : vp, this.sx, this.sy);
      const idx = w.begin(parent, tag, k, m);
      let has = w.style(st) | w.ctm(idx, m);
      if (geometry(el, tag, w.nodes, st[7], st[8])) has |= HAS_GEOM;
      if ((tag === 'text' || tag === 'path') && !ctmOverride && !(st[0] & C.NODE_HIDDEN)) has |= w.box(el.getBoundingClientRect(), this.sx, this.sy);
      if (tag === 'path' || tag === 'polyline' || tag === 'polygon') {
        const d = el.getAttribute(tag === 'path' ? 'd' : 'points');
        if (d) has |= w.text(d, HAS_D);
      }
      const isText = tag === 'text' || tag === 'title' || tag === 'desc';
      const t = isText ? (el.textContent || '').trim() : '';
      if (t) has |= w.text(t, HAS_TEXT);
      const al = el.getAttribute('aria-label');
      if (al) has |= w.text(al, HAS_LABEL);
      const cl = (el.getAttribute('class') || '').trim();
      if (cl && cl.length <= C.MAX_CLASS_BYTES) has |= w.shared(cl, HAS_CLASS);
      w.end(has);
      if (el.hasAttribute('data-standout-emphasis') || (this.emphasis && el.matches(this.emphasis))) w.sel.push(idx);
      if (isText || notRendered.has(tag)) return;
      if (tag === 'use') {
        this.expandUse(el, idx, m, useDepth);
        return;
      }
      if (!ctmOverride && GROUP_TAGS.has(tag)) this.clip(el, idx, m);
      const childVp = tag === 'svg' ? {} : vp;
      const siblings = this.share && !ctmOverride ? new Map() : null;
      let i = 0;
      // Sibling links: iterating el.children costs ten times as much.
      for (let c = el.firstElementChild; c; c = c.nextElementSibling, i++) {
        if (c.namespaceURI !== SVG_NS) continue;
        this.add(c, idx, i, childVp, ctmOverride ? m : null, useDepth, siblings);
      }
    }

    // clip writes the clip region of a group (a <g> or <a>, CTM m) as a
    // node of its own (snapshot.ClipTag), as the static builder does
    // (static/build.go: clipRegion): when its clip-path refers to a
    // <clipPath> of one <rect> in the group's user space, as charts clip
    // their plot area. The core sets aside what lies wholly outside it.
    clip(el, idx, m) {
      const v = getComputedStyle(el).clipPath;
      if (!v || !v.startsWith('url(')) return;
      const ref = /^url\(\s*["']?#([^"')]*)["']?\s*\)$/.exec(v);
      const cp = ref && findById(this.root, ref[1]);
      if (!cp || cp.localName.toLowerCase() !== 'clippath' || (cp.getAttribute('clipPathUnits') || '').toLowerCase() === 'objectboundingbox') return;
      const kids = cp.children;
      const rect = kids.length === 1 ? kids[0] : null;
      if (!rect || rect.localName.toLowerCase() !== 'rect') return;
      // Lengths in percent are left to the browser alone: the static
      // builder cannot resolve them, and the two ways in read alike.
      if (['x', 'y', 'width', 'height'].some((k) => (rect.getAttribute(k) || '').includes('%'))) return;
      const g = [];
      geometry(rect, 'rect', g, 0, 0);
      this.clipNode(idx, g.slice(1, 5), mul(mul(m, ownTransform(cp)), ownTransform(rect)));
    }

    // viewportClip writes the box of the chart's outermost <svg> (at idx,
    // in page px) as its clip region when the <svg> clips what is drawn
    // outside it, as browsers' own style sheet has it do (static/build.go:
    // clipsOverflow).
    viewportClip(el, idx, box) {
      const cs = getComputedStyle(el);
      if (VIEWPORT_CLIPS.has(cs.overflowX) && VIEWPORT_CLIPS.has(cs.overflowY)) this.clipNode(idx, box, IDENTITY);
    }

    // clipNode writes a clip region, x y width height mapped to page px by
    // m, as a child of the node at idx.
    clipNode(idx, rect, m) {
      // A transform that overflows leaves the group unclipped, as the
      // static builder does; JSON has no infinity.
      if (!rect.every(Number.isFinite) || !m.every(Number.isFinite)) return;
      this.count(0);
      const w = this.w;
      const ci = w.begin(idx, C.CLIP_TAG, NAME_USE, m);
      const has = w.style(CLIP_STYLE) | w.ctm(ci, m);
      w.nodes.push(4, rect[0], rect[1], rect[2], rect[3]);
      w.end(has | HAS_GEOM);
    }

    // expandUse instantiates the content a <use> refers to under it.
    expandUse(el, idx, m, depth) {
      const w = this.w;
      const h = el.getAttribute('href') || el.getAttributeNS('http://www.w3.org/1999/xlink', 'href');
      if (!h || !h.startsWith('#')) return;
      const target = findById(this.root, h.slice(1));
      if (!target) {
        w.problems.push(`${w.nameOf(idx)}: <use> refers to missing #${h.slice(1, 61)}`);
        return;
      }
      if (depth >= 16 || target.contains(el)) {
        w.problems.push(`${w.nameOf(idx)}: <use> of #${h.slice(1, 61)} is a reference cycle; not expanded`);
        return;
      }
      const ux = el.x ? el.x.baseVal.value : 0;
      const uy = el.y ? el.y.baseVal.value : 0;
      const base = mul(m, [1, 0, 0, 1, ux, uy]);
      if (target.localName !== 'symbol') {
        this.add(target, idx, NAME_USE, null, base, depth + 1);
        return;
      }
      this.expandSymbol(el, target, idx, base, depth);
    }

    // expandSymbol instantiates a <symbol> as the static builder does
    // (static/build.go): a nested viewport sized by the use's width and
    // height (else its own, else 100), mapped from its viewBox, that
    // renders like a <g> holding its children.
    expandSymbol(el, target, idx, base, depth) {
      const w = this.w;
      const size = (k) => {
        for (const e of [el, target]) {
          const v = parseFloat(e.getAttribute(k));
          if (e.getAttribute(k) !== null && isFinite(v)) return v;
        }
        return 100;
      };
      let inner = base;
      const vb = (target.getAttribute('viewBox') || '').trim().split(/[\s,]+/).map(Number);
      if (vb.length === 4 && vb.every(isFinite) && vb[2] > 0 && vb[3] > 0) {
        inner = mul(base, viewBoxMatrix(vb, size('width'), size('height'), target.getAttribute('preserveAspectRatio') || ''));
      }
      const cs = getComputedStyle(target);
      const dp = target.parentElement ? getComputedStyle(target.parentElement) : null;
      const up = w.styles[idx];
      const fi = dp && cs.fill === dp.fill ? up[STYLE_FILL] : w.paint(cs.fill);
      const si = dp && cs.stroke === dp.stroke ? up[STYLE_STROKE] : w.paint(cs.stroke);
      const name = w.nameOf(idx) + '>symbol';
      const gi = w.begin(idx, 'g', NAME_USE, inner);
      w.tagName[gi] = 'symbol';
      const has = w.style([0, fi, si, 1, 1, clamp01(num(cs.opacity)), 1]);
      w.nodes.push(inner[0], inner[1], inner[2], inner[3], inner[4], inner[5]);
      w.end(HAS_CTM | HAS_NAME | has | w.text(name, HAS_NAME));
      let i = 0;
      for (let c = target.firstElementChild; c; c = c.nextElementSibling, i++) {
        if (c.namespaceURI === SVG_NS) this.add(c, gi, i, null, inner, depth + 1);
      }
    }
  }

  // readChart reads one outermost <svg> into a snapshot in its columnar
  // JSON form (snapshot/json.go). off maps the client coordinates of the
  // element's own window to page coordinates of the top document, in CSS
  // px (the scroll offset, plus the frame's position for charts inside
  // frames).
  //
  // The browser reads each computed property and geometry call at a cost
  // (about half a microsecond each), so the pass reads only what the walk
  // uses: no fill-opacity without a fill, no stroke-opacity or
  // stroke-width without a stroke, and a bounding box only for text and
  // paths, whose extent only the browser knows (the walk computes the
  // other shapes' boxes from their geometry, as the browser does).
  function readChart(svg, path, root, off, emphasis, share, budget, heading, caches) {
    const r = svg.getBoundingClientRect();
    const box = [r.left + off[0], r.top + off[1], r.width, r.height];
    const walk = new ChartWalk(svg, path, root, off, emphasis, share, budget);
    walk.add(svg, -1, 0, null, null, 0);
    // The <svg>'s own clip region comes last, so that the elements keep
    // their places.
    walk.viewportClip(svg, 0, box);
    const title = chartTitle(svg, heading, caches.captions);
    return walk.w.snapshot(svg.ownerDocument.location.href, title, anchorOf(svg, caches.anchors), box, background(svg, caches.canvas));
  }

  const PLAIN_IDENT = /^[A-Za-z_][A-Za-z0-9_-]*$/;

  // AnchorCounts counts, once per document for a whole read pass, each id
  // and each <svg>'s aria-label, and each element's place among its
  // siblings, so that naming 25,000 icons costs no more than reading them.
  class AnchorCounts {
    constructor() {
      this.docs = new Map();
      this.places = new Map();
    }

    of(doc) {
      let c = this.docs.get(doc);
      if (!c) {
        c = { ids: new Map(), labels: new Map() };
        for (const el of doc.querySelectorAll('[id]')) c.ids.set(el.id, (c.ids.get(el.id) || 0) + 1);
        for (const el of doc.querySelectorAll('svg[aria-label]')) {
          const l = el.getAttribute('aria-label');
          c.labels.set(l, (c.labels.get(l) || 0) + 1);
        }
        this.docs.set(doc, c);
      }
      return c;
    }

    // place is el's 1-based position among its parent's element children.
    place(el) {
      let k = this.places.get(el);
      if (k === undefined) {
        let i = 1;
        for (let s = el.parentElement ? el.parentElement.firstElementChild : el; s; s = s.nextElementSibling) this.places.set(s, i++);
        k = this.places.get(el) || 1;
      }
      return k;
    }
  }

  // anchorOf is a CSS selector that matches the chart's <svg> and nothing
  // else in its document, for fixes an author can paste: its id; else its
  // aria-label; else :nth-child steps from the nearest ancestor with an
  // id, or from body. The static reader builds the same one
  // (static/anchor.go). Empty inside a shadow root, which no document
  // selector reaches.
  function anchorOf(svg, counts) {
    const doc = svg.ownerDocument;
    if (svg.getRootNode() !== doc) return '';
    if (svg === doc.documentElement) return ':root'; // an SVG document's own root
    const c = counts.of(doc);
    const uniqueID = (el) => {
      const id = el.getAttribute('id');
      return id && PLAIN_IDENT.test(id) && c.ids.get(id) === 1 ? '#' + id : '';
    };
    if (uniqueID(svg)) return uniqueID(svg);
    const label = svg.getAttribute('aria-label');
    if (label && label.length <= 120 && c.labels.get(label) === 1) {
      return 'svg[aria-label="' + label.replace(/\\/g, '\\\\').replace(/"/g, '\\"').replace(/\n/g, '\\a ') + '"]';
    }
    const steps = [];
    for (let el = svg; el; el = el.parentElement) {
      const tag = el.localName.toLowerCase();
      if (tag === 'body' || tag === 'html') {
        steps.unshift(tag);
        break;
      }
      if (el !== svg && uniqueID(el)) {
        steps.unshift(uniqueID(el));
        break;
      }
      steps.unshift(`${tag}:nth-child(${counts.place(el)})`);
    }
    return steps.join(' > ');
  }

  // cleanTitle collapses white space and bounds a title to 120 code
  // points, as the static reader does (static/title.go).
  function cleanTitle(s) {
    return Array.from((s || '').split(/\s+/).filter(Boolean).join(' ')).slice(0, 120).join('');
  }

  // chartTitle is what a reader would call the chart: its aria-label, its
  // own <title>, the <figcaption> of the <figure> that holds it, or the
  // nearest heading before it (heading, found by findCharts' walk), in the
  // static reader's order (static/title.go). captions caches each figure's
  // caption, so that a figure of many charts is searched once.
  function chartTitle(svg, heading, captions) {
    const al = cleanTitle(svg.getAttribute('aria-label'));
    if (al) return al;
    for (let c = svg.firstElementChild; c; c = c.nextElementSibling) {
      if (c.localName.toLowerCase() === 'title') {
        const t = cleanTitle(c.textContent);
        if (t) return t;
      }
    }
    const fig = svg.closest('figure');
    if (fig && !captions.has(fig)) {
      const cap = fig.querySelector('figcaption');
      captions.set(fig, cap ? cleanTitle(cap.textContent) : '');
    }
    const ct = fig ? captions.get(fig) : '';
    if (ct) return ct;
    return heading ? cleanTitle(heading.textContent) : '';
  }

  // The colour behind an element: ancestors' backgrounds composited over
  // the canvas the browser paints under the page, nearest last. canvases
  // keeps each document's canvas for one read (a page may hold thousands
  // of charts).
  function background(el, canvases) {
    const chain = [];
    for (let p = el.parentElement; p; p = p.parentElement) chain.push(p);
    const doc = el.ownerDocument;
    if (!canvases.has(doc)) canvases.set(doc, canvasColour(doc));
    const base = canvases.get(doc);
    let r = base >>> 24, g = (base >>> 16) & 0xff, b = (base >>> 8) & 0xff;
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

  // The Canvas system colour under a document (CSS Color 4 §6.2): white,
  // or, when the root's used colour scheme is dark (CSS Color Adjustment 1
  // §2: its color-scheme, or the page's <meta name="color-scheme"> when
  // that is normal, with the reader's preference deciding between light
  // and dark), the engine's dark canvas. No page can read a system colour
  // without adding an element, so the two engines' values are kept here;
  // the end-to-end suite checks them against screenshots of each.
  const DARK_CANVAS = { gecko: 0x1c1b22ff, blink: 0x121212ff };
  function canvasColour(doc) {
    const root = doc.documentElement;
    const win = doc.defaultView;
    if (!root || !win) return 0xffffffff;
    let cs = String(win.getComputedStyle(root).colorScheme || 'normal').toLowerCase();
    if (cs === 'normal') {
      const meta = doc.querySelector('meta[name="color-scheme" i]');
      if (meta) cs = String(meta.getAttribute('content') || '').toLowerCase();
    }
    const words = cs.split(/\s+/);
    if (!words.includes('dark')) return 0xffffffff;
    if (words.includes('light') && !win.matchMedia('(prefers-color-scheme: dark)').matches) return 0xffffffff;
    return /\bGecko\/\d/.test(navigator.userAgent) ? DARK_CANVAS.gecko : DARK_CANVAS.blink;
  }

  // Finds the outermost <svg> elements of a document or shadow root in
  // document order, descending into open shadow roots and same-origin
  // frames. Each entry: {svg, path, root, off}. Frames that cannot be read
  // are listed in problems.
  // Elements that draw a chart as pixels, and the smallest box (CSS px)
  // taken for a chart rather than an icon (snapshot.RasterMin).
  const RASTER_TAGS = new Set(['canvas', 'img', 'object', 'embed']);
  const RASTER_MIN = C.RASTER_MIN;

  // rasterKind is the kind of pixels an HTML element draws a chart in: its
  // tag for a canvas, an image, an object or an embed; 'background' for an
  // element that holds nothing (no element, no text) whose CSS background
  // is an image (a gradient is not one); '' for the others. Elements with
  // text are ruled out before their style is read: a page of text has
  // thousands.
  function rasterKind(n, tag) {
    if (RASTER_TAGS.has(tag)) return tag;
    if (n.firstElementChild || tag === 'html' || tag === 'body' || tag === 'iframe' || tag === 'frame') return '';
    for (let c = n.firstChild; c; c = c.nextSibling) {
      if (c.nodeType === 3 && /\S/.test(c.data)) return '';
    }
    return /\burl\(/.test(getComputedStyle(n).backgroundImage) ? 'background' : '';
  }

  function findCharts(doc, problems, rasters, unread) {
    const out = [];
    const nRaster = {};
    let nTop = 0;
    let nShadow = 0;
    let nFrame = 0;
    const perPrefix = new Map(); // charts named so far under each prefix
    const HEADING = /^h[1-6]$/;
    const visit = (root, prefix, off, top, frames, heading) => {
      const walker = (root.ownerDocument || root).createTreeWalker(root, NodeFilter.SHOW_ELEMENT);
      let n = walker.currentNode;
      if (n === root) n = walker.nextNode();
      while (n) {
        const tag = n.localName;
        // The last heading so far in document order: a chart's name when
        // it has no label of its own.
        if (HEADING.test(tag) && n.namespaceURI === XHTML_NS) heading = n;
        if (tag === 'svg' && n.namespaceURI === SVG_NS) {
          let path;
          if (top) {
            path = 'svg' + nTop++;
          } else {
            const k = perPrefix.get(prefix) || 0;
            perPrefix.set(prefix, k + 1);
            path = prefix + 'svg' + k;
          }
          out.push({ svg: n, path, root, off, frames, heading });
          // Skip the subtree: nested <svg> belong to this chart.
          let next = walker.nextSibling();
          while (!next && walker.parentNode()) next = walker.nextSibling();
          n = next;
          continue;
        }
        // A chart drawn as pixels (a canvas, an image, an object, or a
        // CSS background image on an element that holds nothing else): its
        // marks cannot be read. Named, so that no check passes in silence
        // where nothing was read.
        const raster = rasters && n.namespaceURI === XHTML_NS && rasterKind(n, tag);
        if (raster) {
          const r = n.getBoundingClientRect();
          if (r.width >= RASTER_MIN[0] && r.height >= RASTER_MIN[1] && rasters.length < C.MAX_RASTERS) {
            const k = nRaster[raster] || 0;
            nRaster[raster] = k + 1;
            rasters.push({ tag: raster, name: prefix + raster + k, box: [off[0] + r.left, off[1] + r.top, r.width, r.height] });
          }
        }
        if (n.shadowRoot) {
          visit(n.shadowRoot, 'shadow' + nShadow++ + '/', off, false, frames, heading);
        }
        if (tag === 'iframe' || tag === 'frame') {
          const i = nFrame++;
          let d;
          try {
            d = n.contentDocument;
          } catch {
            d = null;
          }
          const r = n.getBoundingClientRect();
          const cs = getComputedStyle(n);
          // off already holds this window's scroll; frames nest.
          const fx = off[0] + r.left + (parseFloat(cs.borderLeftWidth) || 0) + (parseFloat(cs.paddingLeft) || 0);
          const fy = off[1] + r.top + (parseFloat(cs.borderTopWidth) || 0) + (parseFloat(cs.paddingTop) || 0);
          if (!d) {
            problems.push(`frame${i} (${(n.getAttribute('src') || '').slice(0, 120)}): not readable (a cross-origin frame); its charts were not checked`);
            // A frame of the top document that another origin serves: the
            // extension may read it with that origin's permission.
            if (unread && top && unread.length < 16) {
              let origin;
              try {
                origin = new URL(n.src).origin;
              } catch {
                origin = '';
              }
              if (/^https?:/.test(origin)) unread.push({ name: 'frame' + i, url: String(n.src).slice(0, 2048), origin, box: [fx, fy] });
            }
          } else {
            visit(d, 'frame' + i + '/', [fx, fy], false, frames.concat([n]), null);
          }
        }
        n = walker.nextNode();
      }
    };
    visit(doc, '', [window.scrollX, window.scrollY], true, [], null);
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
  // sharedStyles in the result counts the charts read with sibling style
  // sharing. It resolves to the reading; between charts it hands the tab
  // back to the page whenever it has worked SLICE_MS.
  async function readPage(doc, opts) {
    const emphasis = (opts && opts.emphasis) || '';
    const t0 = performance.now();
    const problems = [];
    const rasters = [];
    const unreadFrames = [];
    const charts = findCharts(doc || document, problems, rasters, unreadFrames);
    const snapshots = [];
    // Whether sibling style sharing is safe, per document or shadow root;
    // opts.noSharing turns it off (to measure what it saves).
    const shareable = new Map();
    // Per <figure>, its caption, and per document, the counts that anchor
    // selectors need: read once for all the charts.
    const caches = { captions: new Map(), anchors: new AnchorCounts(), canvas: new Map() };
    let shared = 0;
    let slice = performance.now();
    let yieldMs = 0;
    const budget = { nodes: 0 };
    for (const c of charts) {
      if (performance.now() - slice > SLICE_MS) {
        const y = performance.now();
        await new Promise((r) => setTimeout(r, 0));
        slice = performance.now();
        yieldMs += slice - y;
      }
      try {
        if (!shareable.has(c.root)) shareable.set(c.root, !(opts && opts.noSharing) && siblingsShareStyles(c.root));
        const share = shareable.get(c.root);
        const before = budget.nodes;
        try {
          snapshots.push(readChart(c.svg, c.path, c.root, c.off, emphasis, share, budget, c.heading, caches));
        } catch (e) {
          if (!(e instanceof capError)) throw e;
          problems.push(e.message);
          if (budget.nodes > MAX_PAGE_NODES) break;
          budget.nodes = before;
          continue;
        }
        if (share) shared++;
      } catch (e) {
        problems.push(`${c.path}: could not be read: ${e && e.message}`);
      }
    }
    // The tables kept for charts the page no longer has go.
    const paths = new Set(charts.map((c) => c.path));
    for (const p of keptPaints.keys()) {
      if (!paths.has(p)) {
        keptPaints.delete(p);
        keptStyles.delete(p);
      }
    }
    return { source: location.href, snapshots, problems, rasters, unreadFrames, readMs: performance.now() - t0 - yieldMs, sharedStyles: shared };
  }

  // The pure parts, which need no page, are exported too, for the unit
  // tests under Node (test/reader.test.js).
  const pure = Object.freeze({ packColour, stopAt, mul, invert, viewBoxMatrix, clamp01, adoptedSheets });
  globalThis.standoutReader = Object.freeze({ readPage, findCharts, pageBox, pure, SNAPSHOT_VERSION, MAX_CHART_NODES, MAX_PAGE_NODES, MAX_USE_NODES });
})();
