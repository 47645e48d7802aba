// Child process that runs the native Espresso minimiser for the parent's pool, one request at a
// time, over framed messages on stdin and stdout (child-frames.cjs). Plain CommonJS so it starts
// under bare node from any host (vitest, tsx, the CLI). The native code may call exit() on input
// it rejects; the parent sees the exit and restarts us.
'use strict';
const crypto = require('crypto');
const fs = require('fs');
const path = require('path');
const { tableBytes } = require('./pla-rows.cjs');
const { serve } = require('./child-frames.cjs');

const PACKAGE = 'kuzzle-espresso-logic-minimizer';

/**
 * The bridge's entry that reads a PLA from a file path, when the built addon is where the package
 * builds it; the package's minimize() is the fallback.
 */
function loadPathEntry() {
  try {
    const root = path.dirname(require.resolve(`${PACKAGE}/package.json`));
    const addon = require(path.join(root, 'build', 'Release', 'EspressoLogicMinimizer.node'));
    return typeof addon.minimize_from_path === 'function' ? addon.minimize_from_path : undefined;
  } catch {
    return undefined;
  }
}

/**
 * A file in memory (tmpfs) that only this process can reach: created, unlinked at once, and
 * named through /proc/self/fd, so nothing is left behind however the process ends. Undefined
 * where the machine has no /dev/shm or /proc (or it does not read back what was written).
 */
function memoryFile() {
  let fd;
  try {
    const name = path.join('/dev/shm', `trimwire-espresso-${process.pid}-${crypto.randomBytes(6).toString('hex')}.pla`);
    fd = fs.openSync(name, 'wx+', 0o600);
    fs.unlinkSync(name);
    const via = `/proc/self/fd/${fd}`;
    fs.writeSync(fd, '.e\n', 0);
    if (fs.readFileSync(via, 'latin1') !== '.e\n') throw new Error('the file does not read back');
    return { fd, via };
  } catch {
    if (fd !== undefined) fs.closeSync(fd);
    return undefined;
  }
}

const fromPath = loadPathEntry();
const file = fromPath && memoryFile();
const LINE_BREAK = Buffer.from('\n');

/**
 * Espresso on one PLA (bytes). The package's minimize() has the bridge write the text to a new
 * temporary file on disk for every call (created, written, read back and deleted); here the same
 * bytes go to the one in-memory file, rewritten in place, which the bridge reads by path. Either
 * way Espresso reads the same PLA and does the same work.
 */
function minimise(bytes) {
  if (!file) return require(PACKAGE).minimize([bytes.toString('utf8')]);
  // The text and a line break, as the bridge writes each element it is given.
  const size = fs.writevSync(file.fd, [bytes, LINE_BREAK], 0);
  if (size !== bytes.length + 1) throw new Error(`the PLA file took ${size} of ${bytes.length + 1} bytes`);
  fs.ftruncateSync(file.fd, size);
  return fromPath(file.via);
}

// Each item is PLA text (lines joined by "\n") or a table payload { n, on, dc } whose rows are
// written here (pla-rows.cjs, which checks the table first).
serve((item) => minimise(typeof item === 'string' ? Buffer.from(item, 'utf8') : tableBytes(item)).join('\n'));
