// Child process that runs the native Espresso minimiser for the parent's pool, one request at a
// time. Plain CommonJS so it starts under bare node from any host (vitest, tsx, the CLI). The
// native code may call exit() on input it rejects; the parent sees the exit and restarts us.
'use strict';
const espresso = require('kuzzle-espresso-logic-minimizer');

// One message carries a batch of PLAs, each as one text (lines joined by "\n": one string to
// serialise instead of thousands); the answer is one text of cube lines per PLA.
process.on('message', (msg) => {
  if (!msg || typeof msg.id !== 'number' || !Array.isArray(msg.batch)) return;
  try {
    const cubes = msg.batch.map((text) => espresso.minimize(String(text).split('\n')).join('\n'));
    process.send({ id: msg.id, ok: true, cubes });
  } catch (err) {
    process.send({ id: msg.id, ok: false, error: String((err && err.message) || err) });
  }
});
process.on('disconnect', () => process.exit(0));
