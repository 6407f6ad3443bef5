// Go's runtime finds the function a code address belongs to through a
// table its linker writes into the module's data (findfunctab). The
// extension's build takes that table out of the overlay core, a third of
// a megabyte of small data segments, and leaves a custom section saying
// where it goes (extension/findfunc.go); restoreFindFuncTable builds it
// again from the runtime's function table, which the module keeps, into
// the instance's memory before Go starts. It gives what the linker's loop
// (cmd/link/internal/ld/pcln.go) gives for a table of WebAssembly code
// addresses, and the build strips the table only when that loop, in Go,
// reproduces the linker's bytes and every function begins a bucket;
// TestFindFuncTableRebuilt holds this file to the linker's bytes too.

const SECTION = 'standout.findfunctab';
const BUCKET = 4096;
const SUBBUCKETS = 16;

// rebuildFindFuncTable writes the table into buffer (the memory's
// ArrayBuffer) from the seven uint32s of the section in layout.
export function rebuildFindFuncTable(layout, buffer) {
  const v = new DataView(layout);
  const [table, size, ftab, nfunc, text, minpc, maxpc] = [0, 4, 8, 12, 16, 20, 24].map((o) => v.getUint32(o, true));
  // On WebAssembly a code address is the function's index shifted left by
  // 16, so every function begins a bucket (the build checks it): a bucket
  // holds the index of the function that begins it and, the memory being
  // zero there, its subbuckets need nothing written. Numbers stay exact in
  // doubles far past 32 bits. The loop runs as the worker starts, before
  // the engine has optimised any script, so it reads and writes through
  // one Uint32Array in plain arithmetic. A typed array has the platform's
  // byte order and WebAssembly's memory is little-endian, so on a
  // big-endian platform each number is swapped.
  if (table % 4 !== 0 || ftab % 4 !== 0) throw new Error('the core is damaged: its function tables are not aligned');
  const mem = new Uint32Array(buffer, 0, buffer.byteLength >> 2);
  const little = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;
  const order = (x) => (little ? x : (((x & 0xff) << 24) | ((x & 0xff00) << 8) | ((x >>> 8) & 0xff00) | (x >>> 24)) >>> 0);
  const stride = (4 + SUBBUCKETS) / 4;
  const first = table / 4;
  const span = maxpc - minpc;
  const buckets = Math.ceil(span / BUCKET);
  if ((buckets - 1) * (4 + SUBBUCKETS) + 4 > size || ftab / 4 + 2 * nfunc > mem.length || first + buckets * stride > mem.length) {
    throw new Error('the core is damaged: its findfunctab is too small');
  }
  let p = order(mem[ftab / 4]) * 65536 + text - minpc;
  for (let k = 0; k < nfunc; k++) {
    const q = (k + 1 < nfunc ? order(mem[ftab / 4 + 2 * (k + 1)]) * 65536 + text : maxpc) - minpc;
    if (p < 0 || q > span || q <= p || p % BUCKET !== 0) throw new Error('the core is damaged: its function table is not as built');
    const w = order(k);
    for (let b = p / BUCKET; b * BUCKET < q; b++) mem[first + b * stride] = w;
    p = q;
  }
}

// restoreFindFuncTable rebuilds the table in an instance of module whose
// build took it out, and does nothing for one that keeps it.
export function restoreFindFuncTable(module, instance) {
  const [layout] = WebAssembly.Module.customSections(module, SECTION);
  if (layout) rebuildFindFuncTable(layout, instance.exports.mem.buffer);
}
