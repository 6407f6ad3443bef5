// The overlay's state machine, pure so that it is unit-tested under Node
// (test/machine.test.js): which phase the overlay is in, which check it
// waits for, and what each event does. overlay.js holds the DOM and asks
// this script what to do.
//
// Phases:
//   closed      nothing on the page;
//   reading     a press is being read and checked (no host yet);
//   shown       the host shows a check;
//   rechecking  the host shows a check and a new one is on its way;
//   error       the host shows an error.
//
// Every event that starts a check takes a new seq; an answer that does
// not carry the current seq, or that arrives when no check is awaited, is
// dropped. Effects name what the overlay must do on the page:
//   teardown  remove everything and restore the page;
//   read      read the page for a new check (with the new seq);
//   render    show the answer;
//   error     show the error panel;
//   watch     watch the charts for changes (re-check when they change);
//   unwatch   stop watching them.
(() => {
  if (globalThis.standoutMachine) return;

  const PHASES = Object.freeze(['closed', 'reading', 'shown', 'rechecking', 'error']);
  const OPEN = new Set(['shown', 'rechecking', 'error']);

  function initial() {
    return Object.freeze({ phase: 'closed', seq: 0 });
  }

  function to(m, phase, seqStep, effects) {
    return { machine: Object.freeze({ phase, seq: m.seq + seqStep }), effects: Object.freeze(effects) };
  }

  const stay = (m) => ({ machine: m, effects: Object.freeze([]) });

  // next is the machine after an event, with the effects it asks for.
  // Events: {type: 'press'} the toolbar button; {type: 'close'} the Close
  // button or Escape; {type: 'recheck'} a re-check the panel or a change
  // of the charts asks for; {type: 'answer', seq} a check's answer;
  // {type: 'fail', seq} a check's failure (seq undefined: the press failed
  // before any read, which always shows); {type: 'change'} the charts
  // changed (a re-check while a check is shown or awaited; never after an
  // error, when the charts are no longer watched).
  function next(m, ev) {
    const open = OPEN.has(m.phase);
    switch (ev.type) {
      case 'press':
        if (m.phase === 'closed') return to(m, 'reading', 1, ['read']);
        return to(m, 'closed', 1, ['teardown']);
      case 'close':
        if (m.phase === 'closed') return stay(m);
        return to(m, 'closed', 1, ['teardown']);
      case 'recheck':
        if (!open) return stay(m);
        return to(m, 'rechecking', 1, ['read']);
      case 'answer':
        if (ev.seq !== m.seq || !(m.phase === 'reading' || m.phase === 'rechecking')) return stay(m);
        return to(m, 'shown', 0, ['render', 'watch']);
      case 'fail':
        if (ev.seq !== undefined && (ev.seq !== m.seq || m.phase === 'closed')) return stay(m);
        return to(m, 'error', 1, ['unwatch', 'error']);
      case 'change':
        if (m.phase !== 'shown' && m.phase !== 'rechecking') return stay(m);
        return to(m, 'rechecking', 1, ['read']);
    }
    throw new Error(`standoutMachine: unknown event ${ev && ev.type}`);
  }

  globalThis.standoutMachine = Object.freeze({ PHASES, initial, next, isOpen: (m) => OPEN.has(m.phase) });
})();
