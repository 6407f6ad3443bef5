// Go's runtime finds the function a code address belongs to through a
// table its linker writes into the module's data (findfunctab). The
// extension's build takes that table out of the overlay core, a third of
// a megabyte of small data segments, and leaves a custom section saying
// where it goes (extension/findfunc.go); restoreFindFuncTable builds it
// again from the runtime's function table, which the module keeps, into
// the instance's memory before Go starts. The loop is the linker's
// (cmd/link/internal/ld/pcln.go), and the build strips the table only
// when the same loop in Go gives the linker's bytes.

const SECTION = 'standout.findfunctab';
const NONE = 0x7fffffff;
const BUCKET = 4096;
const SUBBUCKETS = 16;
const SUB = BUCKET / SUBBUCKETS;

// rebuildFindFuncTable writes the table into buffer (the memory's
// ArrayBuffer) from the seven uint32s of the section in layout.
export function rebuildFindFuncTable(layout, buffer) {
  const v = new DataView(layout);
  const [table, size, ftab, nfunc, text, minpc, maxpc] = [0, 4, 8, 12, 16, 20, 24].map((o) => v.getUint32(o, true));
  const mem = new DataView(buffer);
  const nsub = Math.ceil((maxpc - minpc) / SUB);
  const idx = new Int32Array(nsub).fill(NONE);
  // On WebAssembly a code address is the function's index shifted left
  // by 16; numbers stay exact in doubles far past 32 bits.
  const entry = (k) => mem.getUint32(ftab + 8 * k, true) * 65536 + text;
  for (let k = 0; k < nfunc; k++) {
    let p = entry(k);
    const q = k + 1 < nfunc ? entry(k + 1) : maxpc;
    if (p < minpc || q > maxpc || q <= p) throw new Error('the core is damaged: its function table is out of order');
    for (; p < q; p += SUB) {
      const i = Math.floor((p - minpc) / SUB);
      if (idx[i] > k) idx[i] = k;
    }
    const i = Math.floor((q - 1 - minpc) / SUB);
    if (idx[i] > k) idx[i] = k;
  }
  const out = new Uint8Array(buffer, table, size);
  for (let b = 0; b * SUBBUCKETS < nsub; b++) {
    const base = idx[b * SUBBUCKETS];
    mem.setUint32(table + b * (4 + SUBBUCKETS), base, true);
    for (let j = 0; j < SUBBUCKETS && b * SUBBUCKETS + j < nsub; j++) {
      out[b * (4 + SUBBUCKETS) + 4 + j] = idx[b * SUBBUCKETS + j] - base;
    }
  }
}

// restoreFindFuncTable rebuilds the table in an instance of module whose
// build took it out, and does nothing for one that keeps it.
export function restoreFindFuncTable(module, instance) {
  const [layout] = WebAssembly.Module.customSections(module, SECTION);
  if (layout) rebuildFindFuncTable(layout, instance.exports.mem.buffer);
}
