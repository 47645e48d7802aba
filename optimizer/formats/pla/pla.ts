// Berkeley PLA files (two-level functions): .i .o .ilb .ob .p .type f|fd|fr|fdr .e, cubes of
// 0 1 - on inputs and 0 1 - ~ on outputs. Read with located errors, and written back.
import { InputError, type Diagnostic } from '../../errors';

export type PlaType = 'f' | 'fd' | 'fr' | 'fdr';

export interface Pla {
  inputs: string[];
  outputs: string[];
  cubes: { in: string; out: string }[];
  type: PlaType;
}

const TYPES = new Set(['f', 'fd', 'fr', 'fdr']);
/** Some tools write 2 for a don't-care input and 4 for an output's 1; both are accepted. */
const IN_CHARS = /^[01\-2]*$/;
const OUT_CHARS = /^[01\-~4]*$/;
const MAX_ERRORS = 100;

export function readPla(text: string, file: string): Pla {
  const diags: Diagnostic[] = [];
  const error = (message: string, line: number, col: number) => {
    if (diags.length < MAX_ERRORS) diags.push({ severity: 'error', code: 'pla.syntax', message, loc: { file, line, col } });
  };
  let ni: number | undefined;
  let no: number | undefined;
  let ilb: string[] | undefined;
  let ob: string[] | undefined;
  let declaredP: { n: number; line: number } | undefined;
  let type: PlaType = 'fd';
  const cubes: Pla['cubes'] = [];
  const lines = text.split('\n');
  for (let li = 0; li < lines.length; li++) {
    const lineNo = li + 1;
    const raw = lines[li].replace(/#.*$/, '').replace(/\r$/, '');
    const at = raw.search(/\S/);
    if (at < 0) continue;
    const body = raw.trim();
    if (body.startsWith('.')) {
      const [kw, ...args] = body.split(/\s+/);
      const count = () => {
        const n = Number(args[0]);
        if (args.length !== 1 || !Number.isInteger(n) || n < 0 || n > 1024) {
          error(`${kw} needs one whole number (0–1024)`, lineNo, at + 1);
          return undefined;
        }
        return n;
      };
      switch (kw) {
        case '.i':
          ni = count();
          break;
        case '.o':
          no = count();
          break;
        case '.ilb':
          ilb = args;
          break;
        case '.ob':
          ob = args;
          break;
        case '.p': {
          const n = Number(args[0]);
          if (Number.isInteger(n) && n >= 0) declaredP = { n, line: lineNo };
          else error('.p needs a whole number', lineNo, at + 1);
          break;
        }
        case '.type':
          if (args.length === 1 && TYPES.has(args[0])) type = args[0] as PlaType;
          else error(`.type must be f, fd, fr or fdr`, lineNo, at + 1);
          break;
        case '.e':
        case '.end':
          li = lines.length;
          break;
        default:
          error(`unsupported PLA keyword ${kw}`, lineNo, at + 1);
      }
      continue;
    }
    if (ni === undefined || no === undefined) {
      error('a cube before .i and .o', lineNo, at + 1);
      continue;
    }
    const chars = body.replace(/[\s|]+/g, '');
    if (chars.length !== ni + no) {
      error(`a cube needs ${ni} input and ${no} output characters, found ${chars.length}`, lineNo, at + 1);
      continue;
    }
    const cin = chars.slice(0, ni);
    const cout = chars.slice(ni);
    if (!IN_CHARS.test(cin)) {
      error(`inputs of a cube are 0, 1 or -, found '${cin}'`, lineNo, at + 1);
      continue;
    }
    if (!OUT_CHARS.test(cout)) {
      error(`outputs of a cube are 0, 1, - or ~, found '${cout}'`, lineNo, at + 1);
      continue;
    }
    cubes.push({ in: cin.replace(/2/g, '-'), out: cout.replace(/4/g, '1') });
  }
  if (ni === undefined) error('missing .i (number of inputs)', 1, 1);
  if (no === undefined) error('missing .o (number of outputs)', 1, 1);
  if (ilb && ni !== undefined && ilb.length !== ni) error(`.ilb names ${ilb.length} inputs but .i is ${ni}`, 1, 1);
  if (ob && no !== undefined && ob.length !== no) error(`.ob names ${ob.length} outputs but .o is ${no}`, 1, 1);
  if (declaredP && diags.length === 0 && declaredP.n !== cubes.length) {
    error(`.p says ${declaredP.n} cubes but there are ${cubes.length}`, declaredP.line, 1);
  }
  if (diags.length > 0) throw new InputError(diags);
  return {
    inputs: ilb ?? Array.from({ length: ni! }, (_, k) => `x${k}`),
    outputs: ob ?? Array.from({ length: no! }, (_, k) => `f${k}`),
    cubes,
    type,
  };
}

export function writePla(pla: Pla): string {
  const out = [`.i ${pla.inputs.length}`, `.o ${pla.outputs.length}`];
  if (pla.inputs.length > 0) out.push(`.ilb ${pla.inputs.join(' ')}`);
  if (pla.outputs.length > 0) out.push(`.ob ${pla.outputs.join(' ')}`);
  out.push(`.type ${pla.type}`, `.p ${pla.cubes.length}`);
  for (const c of pla.cubes) out.push(`${c.in} ${c.out}`);
  out.push('.e');
  return out.join('\n') + '\n';
}
