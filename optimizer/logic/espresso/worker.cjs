// Child process that runs the native Espresso minimiser for the parent's pool, one request at a
// time, over framed messages on stdin and stdout (child-frames.cjs). Plain CommonJS so it starts
// under bare node from any host (vitest, tsx, the CLI). The native code may call exit() on input
// it rejects; the parent sees the exit and restarts us.
'use strict';
const espresso = require('kuzzle-espresso-logic-minimizer');
const { tableText } = require('./pla-rows.cjs');
const { serve } = require('./child-frames.cjs');

// Each item is PLA text (lines joined by "\n") or a table payload { n, on, dc } whose rows are
// written here (pla-rows.cjs, which checks the table first). Either way the native call gets the
// whole text as one array element: the bridge copies each element and writes it to the file
// Espresso reads followed by a line break, so the file is the same as with a line per element,
// without a string per row to make and copy.
serve((item) => espresso.minimize([typeof item === 'string' ? item : tableText(item)]).join('\n'));
