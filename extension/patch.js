// Patches: a long string sent between the page and the background as its
// differences from a string the receiver already holds.
//
// In a press the read pass's JSON (150 KB at 5,000 marks) and the core's
// answer (100 KB) cross between the page and the background, and each
// crossing cost 8–10 ms, more than linearly in the string's length (1 MB
// took 70–90 ms): the page, the browser and the background each copy and
// convert the value (a trace of a press; DEVELOPERS.md). A
// press on an edited page, or on the same page again, changes a few bytes
// of either string, so each side keeps the last strings it sent and
// received (a Keeper), named by random ids, and the next one crosses as
// copies from one the other side holds and the characters in between.
//
// diff copies what the two strings share and sends the rest: their common
// prefix and suffix, then, between them, the runs where the new string
// joins the old one again after each edit, found by looking for a short
// sample of the new string in the old one, first near where an edit of the
// same length would put it, now and then anywhere. The comparisons and
// searches are the engine's own (slices compared, indexOf): a patch of a
// 150 KB reading took 0.1–2 ms in the browser benchmark (patchMs), where
// a first version that chunked both strings by a rolling hash in
// JavaScript took 23 ms on a page's first patch.
(() => {
  if (globalThis.standoutPatch) return;

  // Strings are compared SLICE characters at a time.
  const SLICE = 256;
  // A middle shorter than this is sent as it is.
  const SMALL = 2048;
  // A copy costs about this many characters on the wire (two numbers).
  const COPY_COST = 12;
  // A run shorter than MIN_RUN is sent rather than copied.
  const MIN_RUN = 32;
  // Where the new string departs from the old, samples of PROBE
  // characters of it, every PROBE / 2, are looked for in the old string
  // within WINDOW of where they would be after an edit of the same length,
  // and every FAR_EVERY-th sample anywhere; a patch spends at most
  // MAX_SEARCHES searches, and sends the rest of the string as it is.
  const PROBE = 32;
  const WINDOW = 2048;
  const FAR_EVERY = 16;
  const MAX_SEARCHES = 4096;
  // Before that, PROBES samples spread over the middle are looked for in
  // the old one: when fewer than half are there, as when an edit renumbers
  // all that follows it (a new colour in a reading's paints), the middle is
  // sent as it is, without a search. The samples are placed by the golden
  // ratio's multiples, so that edits at a regular step (one field of every
  // record) cannot fall on all of them.
  const PROBES = 16;
  const GOLDEN = (Math.sqrt(5) - 1) / 2;

  // A literal crosses as a string, which the messaging layer carries as
  // UTF-8: it must not begin or end inside a surrogate pair, where it
  // would arrive as U+FFFD. Copies are taken from the receiver's own
  // string and may cut anywhere.
  const isHigh = (c) => c >= 0xd800 && c <= 0xdbff;
  const isLow = (c) => c >= 0xdc00 && c <= 0xdfff;

  // runLength is how far a from i and b from j agree, up to b's end j1.
  function runLength(a, i, b, j, j1) {
    const max = Math.min(a.length - i, j1 - j);
    let n = 0;
    while (n + SLICE <= max && a.slice(i + n, i + n + SLICE) === b.slice(j + n, j + n + SLICE)) n += SLICE;
    while (n < max && a.charCodeAt(i + n) === b.charCodeAt(j + n)) n++;
    return n;
  }

  // suffixLength is the common suffix of a and b, at most max long.
  function suffixLength(a, b, max) {
    const m = a.length;
    const n = b.length;
    let i = 0;
    while (i + SLICE <= max && a.slice(m - i - SLICE, m - i) === b.slice(n - i - SLICE, n - i)) i += SLICE;
    while (i < max && a.charCodeAt(m - 1 - i) === b.charCodeAt(n - 1 - i)) i++;
    return i;
  }

  // Ops is a patch under construction: copies [at, n] of the old string,
  // as two numbers, and literals, as strings, each merged with the one
  // before when they join up.
  class Ops {
    constructor() {
      this.list = [];
      this.cost = 0;
    }

    copy(at, n) {
      const l = this.list;
      const k = l.length;
      if (k >= 2 && typeof l[k - 1] === 'number' && l[k - 2] + l[k - 1] === at) {
        l[k - 1] += n;
        return;
      }
      l.push(at, n);
      this.cost += COPY_COST;
    }

    literal(s) {
      const l = this.list;
      const k = l.length;
      if (k > 0 && typeof l[k - 1] === 'string') l[k - 1] += s;
      else l.push(s);
      this.cost += s.length;
    }
  }

  // shared says whether most samples of b[b0, b1) are in a[a0, a1).
  function shared(a, a0, a1, b, b0, b1) {
    const within = a.slice(a0, a1);
    const span = b1 - b0 - PROBE;
    let found = 0;
    for (let k = 1; k <= PROBES; k++) {
      const at = b0 + Math.floor(((k * GOLDEN) % 1) * span);
      if (within.includes(b.slice(at, at + PROBE))) found++;
    }
    return 2 * found >= PROBES;
  }

  // Search finds where b joins a again.
  class Search {
    constructor(a, b, b1) {
      this.a = a;
      this.b = b;
      this.b1 = b1;
      this.left = MAX_SEARCHES;
    }

    // rejoin returns [i, j], a run of a from i and b from j at least
    // MIN_RUN long, with j from b's departure from at most back to lit,
    // where the run of a departed at guess; null when there is none
    // within the searches left.
    rejoin(from, lit, guess) {
      const { a, b, b1 } = this;
      for (let q = from, k = 0; q + PROBE <= b1 && this.left > 0; q += PROBE / 2, k++) {
        this.left--;
        const probe = b.slice(q, q + PROBE);
        const near = guess + (q - from);
        const lo = Math.max(0, near - WINDOW);
        const hi = Math.min(a.length, near + WINDOW + PROBE);
        let x = lo < hi ? a.slice(lo, hi).indexOf(probe) : -1;
        if (x >= 0) x += lo;
        else if (k % FAR_EVERY === FAR_EVERY - 1) x = a.indexOf(probe);
        if (x < 0) continue;
        // The run may begin before the sample.
        let back = 0;
        while (q - back > lit && x - back > 0 && a.charCodeAt(x - back - 1) === b.charCodeAt(q - back - 1)) back++;
        if (runLength(a, x - back, b, q - back, b1) >= MIN_RUN) return [x - back, q - back];
      }
      return null;
    }
  }

  // middle patches b[b0, b1) against a, whose a[a0, a1) lies between the
  // same prefix and suffix.
  function middle(a, a0, a1, b, b0, b1, ops) {
    if (b1 - b0 < SMALL || a1 - a0 < PROBE || !shared(a, a0, a1, b, b0, b1)) {
      ops.literal(b.slice(b0, b1));
      return;
    }
    const search = new Search(a, b, b1);
    let i = a0;
    let j = b0;
    let lit = b0;
    while (j < b1) {
      let n = runLength(a, i, b, j, b1);
      if (n >= MIN_RUN || (n > 0 && j + n === b1)) {
        // Literals around the copy keep surrogate pairs whole.
        if (lit < j && isLow(b.charCodeAt(j))) {
          i++;
          j++;
          n--;
        }
        if (j + n < b1 && isHigh(b.charCodeAt(j + n - 1))) n--;
        if (n <= 0) break;
        if (lit < j) ops.literal(b.slice(lit, j));
        ops.copy(i, n);
        i += n;
        j += n;
        lit = j;
        continue;
      }
      const at = search.rejoin(j + n, lit, i + n);
      if (at === null) break;
      [i, j] = at;
    }
    if (lit < b1) ops.literal(b.slice(lit, b1));
  }

  // diff returns the patch that makes b from a, or null when it would not
  // be much shorter than b itself.
  function diff(a, b) {
    let p = runLength(a, 0, b, 0, b.length);
    if (p > 0 && p < b.length && isHigh(b.charCodeAt(p - 1))) p--;
    let s = suffixLength(a, b, Math.min(a.length, b.length) - p);
    if (s > 0 && isLow(b.charCodeAt(b.length - s))) s--;
    const ops = new Ops();
    if (p > 0) ops.copy(0, p);
    if (b.length - s > p) middle(a, p, a.length - s, b, p, b.length - s, ops);
    if (s > 0) ops.copy(a.length - s, s);
    return 2 * ops.cost > b.length ? null : ops.list;
  }

  // apply makes the patched string from a; it throws when the patch does
  // not fit a or does not give length characters.
  function apply(a, ops, length) {
    if (!Array.isArray(ops)) throw new Error('a patch is not a list');
    const parts = [];
    for (let i = 0; i < ops.length; i++) {
      const op = ops[i];
      if (typeof op === 'string') {
        parts.push(op);
        continue;
      }
      const n = ops[++i];
      if (!Number.isInteger(op) || !Number.isInteger(n) || op < 0 || n <= 0 || op + n > a.length) {
        throw new Error('a patch copies from outside the text it applies to');
      }
      parts.push(a.slice(op, op + n));
    }
    const out = parts.join('');
    if (out.length !== length) throw new Error(`a patch gave ${out.length} characters, not ${length}`);
    return out;
  }

  // sent is about how many characters a message puts on the wire.
  function sent(msg) {
    if (typeof msg.text === 'string') return msg.text.length;
    let n = 0;
    for (const op of msg.ops) n += typeof op === 'string' ? op.length : COPY_COST / 2;
    return n;
  }

  function newId() {
    const v = new Uint32Array(2);
    crypto.getRandomValues(v);
    return v[0].toString(36) + '.' + v[1].toString(36);
  }

  // A Keeper holds the last strings sent or received on each line (a tab,
  // for the background; the reads or the answers, for the page): perKey
  // of them per line, for up to lines lines, the least recently used line
  // dropped first. give makes the message that sends a string, as a patch
  // when the other side holds one of this line's strings; take reads a
  // message back into its string.
  class Keeper {
    constructor(perKey = 2, lines = 4) {
      this.perKey = perKey;
      this.lines = lines;
      // key → entries {id, text}, newest first; the Map's order is the
      // lines' use, oldest first.
      this.kept = new Map();
    }

    // held lists the ids of the strings this keeper holds on key, newest
    // first: what the other side may patch against.
    held(key) {
      const l = this.kept.get(key);
      return l ? l.map((e) => e.id) : [];
    }

    keep(key, id, text) {
      const l = this.kept.get(key) || [];
      this.kept.delete(key);
      this.kept.set(key, [{ id, text }, ...l].slice(0, this.perKey));
      if (this.kept.size > this.lines) this.kept.delete(this.kept.keys().next().value);
    }

    // give returns the message that sends text on key: {id, text}, or
    // {id, base, ops, length} against the newest string the other side
    // holds (theirs: its ids) that this keeper holds too.
    give(key, text, theirs) {
      const id = newId();
      const base = (this.kept.get(key) || []).find((e) => Array.isArray(theirs) && theirs.includes(e.id));
      const ops = base ? diff(base.text, text) : null;
      this.keep(key, id, text);
      return ops ? { id, base: base.id, ops, length: text.length } : { id, text };
    }

    // take returns the string a message sends on key, and keeps it; null
    // when the message is a patch against a string no longer held (the
    // sender then sends it whole). A malformed message throws.
    take(key, msg) {
      if (!msg || typeof msg !== 'object' || typeof msg.id !== 'string') throw new Error('a message without an id');
      let text = msg.text;
      if (typeof text !== 'string') {
        const base = (this.kept.get(key) || []).find((e) => e.id === msg.base);
        if (!base) return null;
        text = apply(base.text, msg.ops, msg.length);
      }
      this.keep(key, msg.id, text);
      return text;
    }
  }

  globalThis.standoutPatch = Object.freeze({ diff, apply, sent, Keeper });
})();
