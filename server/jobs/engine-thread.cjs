// Entry of a scan's engine thread. Under tsx (`npm start`, the e2e and crash tests' worker
// processes) the thread inherits tsx's loader through execArgv and can require TypeScript already;
// anywhere else (vitest's test processes, plain node) it registers tsx's require hook itself, with
// the repository's tsconfig so the `@/…` paths resolve whatever the working directory.
const path = require('node:path');

if (!require.extensions['.ts']) {
  process.env.TSX_TSCONFIG_PATH ??= path.resolve(__dirname, '../../tsconfig.json');
  require('tsx/cjs/api').register();
}
require('./engine-thread.ts').startEngineThread();
