// Child process that runs the native Espresso minimiser for the parent's pool, one request at a
// time. Plain CommonJS so it starts under bare node from any host (vitest, tsx, the CLI). The
// native code may call exit() on input it rejects; the parent sees the exit and restarts us.
'use strict';
const espresso = require('kuzzle-espresso-logic-minimizer');
const { tableLines } = require('./pla-rows.cjs');

/** Answers already computed are sent at least this often, so the parent's per-function timer can restart. */
const FLUSH_MS = 50;

const cpuMicros = () => {
  const u = process.cpuUsage();
  return u.user + u.system;
};

// One message carries a batch of PLAs, each as one text (lines joined by "\n": one string to
// serialise instead of thousands) or as a table payload { n, on, dc } whose rows are written here
// (pla-rows.cjs). Answers (one text of cube lines per PLA) go back in order, in
// as few messages as the flush interval allows: { from, cubes } covers PLAs from..from+len-1.
// Every message also carries this process's processor time so far (benchmarks read it).
process.on('message', (msg) => {
  if (!msg || typeof msg.id !== 'number' || !Array.isArray(msg.batch)) return;
  let from = 0;
  let cubes = [];
  let last = Date.now();
  for (let k = 0; k < msg.batch.length; k++) {
    try {
      const item = msg.batch[k];
      const lines = typeof item === 'string' ? item.split('\n') : tableLines(item);
      cubes.push(espresso.minimize(lines).join('\n'));
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
