// One entry point for every input format: refuses binary, non-UTF-8 and oversized input with
// clear messages, picks the format from the extension or the content, and dispatches to the
// reader; writeDesign dispatches to the writers.
import { InputError, type Diagnostic } from '../errors';
import type { Design, Format } from '../netlist/ir';
import { formatBytes, withDefaults, type Limits } from '../netlist/limits';
import { readJson } from './json/read';
import { writeJson } from './json/write';
import { designToPla, plaToDesign } from './pla/design';
import { readPla, writePla } from './pla/pla';
import { readSpice } from './spice/read';
import { writeSpice } from './spice/write';
import { readVerilog } from './verilog/read';
import { writeVerilog } from './verilog/write';

export const FORMATS: readonly Format[] = ['spice', 'verilog', 'json', 'pla'];

const BY_EXTENSION: Record<string, Format> = {
  cir: 'spice',
  sp: 'spice',
  spi: 'spice',
  spice: 'spice',
  net: 'spice',
  ckt: 'spice',
  v: 'verilog',
  vg: 'verilog',
  json: 'json',
  pla: 'pla',
};

export const EXTENSION: Record<Format, string> = { spice: 'cir', verilog: 'v', json: 'json', pla: 'pla' };

export interface ReadOptions {
  file: string;
  format?: Format;
  limits?: Partial<Limits>;
}

export interface ReadResult {
  design: Design;
  diagnostics: Diagnostic[];
}

/** The format a file name's extension names, if any. */
export function formatFromName(file: string): Format | undefined {
  const m = /\.([A-Za-z0-9]+)$/.exec(file);
  return m ? BY_EXTENSION[m[1].toLowerCase()] : undefined;
}

/** Guesses the format from the text when the name does not say. */
export function sniffFormat(text: string): Format {
  const head = text.slice(0, 4096);
  if (/^\s*[{[]/.test(head)) return 'json';
  if (/^\s*(\/\/.*\n\s*|\/\*[\s\S]*?\*\/\s*)*(`timescale[^\n]*\n\s*)?(macro)?module\s/.test(head)) return 'verilog';
  if (/^\s*(#.*\n\s*)*\.(i|o)\s+\d+/m.test(head) && !/^\s*\.(model|subckt|end)\b/im.test(head)) return 'pla';
  return 'spice';
}

function utf8Length(s: string): number {
  let n = 0;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    n += c < 0x80 ? 1 : c < 0x800 ? 2 : c >= 0xd800 && c < 0xdc00 ? 4 : c >= 0xdc00 && c < 0xe000 ? 0 : 3;
  }
  return n;
}

/** Decodes and checks raw input: size, NUL bytes, UTF-8. */
export function decodeInput(input: string | Uint8Array, file: string, limits: Limits): string {
  const size = typeof input === 'string' ? utf8Length(input) : input.byteLength;
  const at = { file, line: 1, col: 1 };
  if (size > limits.maxFileBytes) {
    throw InputError.at('input.too-large', `the file is ${formatBytes(size)}; the limit is ${formatBytes(limits.maxFileBytes)}`, at);
  }
  let text: string;
  if (typeof input === 'string') text = input;
  else {
    if (input.includes(0)) throw InputError.at('input.binary', 'this is a binary file, not a netlist (it contains NUL bytes)', at);
    try {
      text = new TextDecoder('utf-8', { fatal: true }).decode(input);
    } catch {
      throw InputError.at('input.encoding', 'the file is not UTF-8 text', at);
    }
  }
  const nul = text.indexOf('\0');
  if (nul >= 0) throw InputError.at('input.binary', 'this is a binary file, not a netlist (it contains NUL bytes)', locate(text, nul, file));
  const bad = text.search(/\uFFFD|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/);
  if (bad >= 0) throw InputError.at('input.encoding', 'the file is not valid UTF-8 text', locate(text, bad, file));
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

function locate(text: string, pos: number, file: string) {
  const before = text.slice(0, pos);
  const line = before.split('\n').length;
  return { file, line, col: pos - before.lastIndexOf('\n') };
}

export function readDesign(input: string | Uint8Array, opts: ReadOptions): ReadResult {
  const limits = withDefaults(opts.limits);
  const text = decodeInput(input, opts.file, limits);
  const format = opts.format ?? formatFromName(opts.file) ?? sniffFormat(text);
  switch (format) {
    case 'spice':
      return readSpice(text, opts.file);
    case 'verilog':
      return readVerilog(text, opts.file, 2 * limits.maxDevices);
    case 'json':
      return readJson(text, opts.file);
    case 'pla': {
      const title = opts.file.replace(/^.*[\\/]/, '');
      return { design: plaToDesign(readPla(text, opts.file), title), diagnostics: [] };
    }
  }
}

export function writeDesign(design: Design, format: Format): string {
  switch (format) {
    case 'spice':
      return writeSpice(design);
    case 'verilog':
      return writeVerilog(design);
    case 'json':
      return writeJson(design);
    case 'pla':
      return writePla(designToPla(design));
  }
}
