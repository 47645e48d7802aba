// Child process that runs the native Espresso minimiser for the parent's pool, one request at a
// time. Plain CommonJS so it starts under bare node from any host (vitest, tsx, the CLI). The
// native code may call exit() on input it rejects; the parent sees the exit and restarts us.
'use strict';
const espresso = require('kuzzle-espresso-logic-minimizer');
const { tableText } = require('./pla-rows.cjs');

/** Answers already computed are sent at least this often, so the parent's per-function timer can restart. */
const FLUSH_MS = 50;

const cpuMicros = () => {
  const u = process.cpuUsage();
  return u.user + u.system;
};

// One message carries a batch of PLAs, each as one text (lines joined by "\n": one string to
// serialise instead of thousands) or as a table payload { n, on, dc } whose rows are written here
// (pla-rows.cjs). Either way the native call gets the whole text as one array element: the bridge
// copies each element and writes it to the file Espresso reads followed by a line break, so the
// file is the same as with a line per element, without a string per row to make and copy.
// Answers (one text of cube lines per PLA) go back in order, in as few messages as the flush
// interval allows: { from, cubes } covers PLAs from..from+len-1.
// Every message also carries this process's processor time so far (benchmarks read it).
process.on('message', (msg) => {
  if (!msg || typeof msg.id !== 'number' || !Array.isArray(msg.batch)) return;
  let from = 0;
  let cubes = [];
  let last = Date.now();
  for (let k = 0; k < msg.batch.length; k++) {
    try {
      const item = msg.batch[k];
      const text = typeof item === 'string' ? item : tableText(item);
      cubes.push(espresso.minimize([text]).join('\n'));
    } catch (err) {
      process.send({ id: msg.id, ok: false, from, cubes, at: k, error: String((err && err.message) || err), cpu: cpuMicros() });
      return;
    }
    const now = Date.now();
    if (k === msg.batch.length - 1 || now - last >= FLUSH_MS) {
      process.send({ id: msg.id, ok: true, from, cubes, done: k === msg.batch.length - 1, cpu: cpuMicros() });
      from = k + 1;
      cubes = [];
      last = now;
    }
  }
});
process.on('disconnect', () => process.exit(0));
