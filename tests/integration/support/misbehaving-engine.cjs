// An engine thread entry for the scan-thread tests: a job whose source carries a marker comment
// makes the thread fail the way a real fault would — an uncaught throw, running out of memory, or
// exiting — before the real engine sees it; every other job goes to the real engine unchanged.
const { parentPort } = require('node:worker_threads');

parentPort.on('message', (m) => {
  if (m.type !== 'job') return;
  const marker = /^\* engine-test: (\S+)/m.exec(m.job.source)?.[1];
  if (marker === 'throw') throw new Error('engine-test fault in the engine thread');
  if (marker === 'exit') process.exit(7);
  if (marker === 'exhaust-memory') {
    const kept = [];
    for (;;) kept.push(new Array(1 << 20).fill(kept.length + 0.5));
  }
});
// Registered after the listener above, so a marked job never reaches the real engine.
require('../../../server/jobs/engine-thread.cjs');
