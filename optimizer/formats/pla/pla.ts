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
  let ilb: Names | undefined;
  let ob: Names | undefined;
  /** Where .i and .o are: the ports they name when .ilb or .ob is missing are placed there. */
  let iAt: Place = { line: 1, col: 1 };
  let oAt: Place = { line: 1, col: 1 };
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
      const here = { line: lineNo, col: at + 1 };
      switch (kw) {
        case '.i':
          ni = count();
          iAt = here;
          break;
        case '.o':
          no = count();
          oAt = here;
          break;
        case '.ilb':
          ilb = names(raw, here);
          break;
        case '.ob':
          ob = names(raw, here);
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
  if (ilb && ni !== undefined && ilb.names.length !== ni) error(`.ilb names ${ilb.names.length} inputs but .i is ${ni}`, ilb.at.line, ilb.at.col);
  if (ob && no !== undefined && ob.names.length !== no) error(`.ob names ${ob.names.length} outputs but .o is ${no}`, ob.at.line, ob.at.col);
  if (declaredP && diags.length === 0 && declaredP.n !== cubes.length) {
    error(`.p says ${declaredP.n} cubes but there are ${cubes.length}`, declaredP.line, 1);
  }
  if (diags.length > 0) throw new InputError(diags);
  const inputs = ilb ?? defaults('x', ni!, iAt);
  const outputs = ob ?? defaults('f', no!, oAt);
  // Every input and output is a port of the design: two of one name would be one net.
  const sides = [
    { side: inputs, written: ilb !== undefined, hint: 'without .ilb the inputs are named x0, x1, …' },
    { side: outputs, written: ob !== undefined, hint: 'without .ob the outputs are named f0, f1, …' },
  ];
  const seen = new Map<string, { place: Place; from: (typeof sides)[number] }>();
  for (const from of sides) {
    from.side.names.forEach((n, k) => {
      const first = seen.get(n);
      if (!first) return void seen.set(n, { place: from.side.places[k], from });
      // At the repeat where the file wrote it, else at the name it repeats.
      const place = from.written ? from.side.places[k] : first.place;
      const hints = [...new Set([first.from, from])].filter((x) => !x.written).map((x) => x.hint);
      error(`${n} names two ports${hints.length ? ` (${hints.join('; ')})` : ''}`, place.line, place.col);
    });
  }
  if (diags.length > 0) throw new InputError(diags);
  return { inputs: inputs.names, outputs: outputs.names, cubes, type };
}

interface Place {
  line: number;
  col: number;
}

/** The names on an .ilb or .ob line, each with its column, and where the keyword is. */
interface Names {
  names: string[];
  places: Place[];
  at: Place;
}

function names(raw: string, at: Place): Names {
  const out: Names = { names: [], places: [], at };
  const token = /\S+/g;
  token.exec(raw); // the keyword
  for (let m = token.exec(raw); m; m = token.exec(raw)) {
    out.names.push(m[0]);
    out.places.push({ line: at.line, col: m.index + 1 });
  }
  return out;
}

/** The names the reader gives unnamed ports (x0, x1, … or f0, f1, …), placed at their count's line. */
function defaults(prefix: string, count: number, at: Place): Names {
  return { names: Array.from({ length: count }, (_, k) => `${prefix}${k}`), places: Array.from({ length: count }, () => at), at };
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
