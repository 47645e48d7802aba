// Reads the product's JSON netlist: JSON syntax errors and schema problems are located at the
// offending value's line:col; the design then gets the same structural checks as every format.
import { NetlistJsonSchema } from '@/shared/domain/netlist-json';
import { InputError, type Diagnostic } from '../../errors';
import type { Design } from '../../netlist/ir';
import { validateDesign } from '../../netlist/validate';
import { findJsonSyntaxError, locatePath, posToLineCol } from './locate';

const MAX_ISSUES = 50;

export function readJson(text: string, file: string): { design: Design; diagnostics: Diagnostic[] } {
  const at = (pos: number) => ({ file, ...posToLineCol(text, pos) });
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    const e = findJsonSyntaxError(text);
    throw InputError.at('json.syntax', `invalid JSON: ${e?.message ?? 'not a JSON document'}`, at(e?.pos ?? 0));
  }
  const parsed = NetlistJsonSchema.safeParse(raw);
  if (!parsed.success) {
    const diags: Diagnostic[] = parsed.error.issues.slice(0, MAX_ISSUES).map((issue) => ({
      severity: 'error',
      code: 'json.schema',
      message: `${issue.path.length > 0 ? issue.path.join('.') + ': ' : ''}${issue.message}`,
      loc: at(locatePath(text, issue.path)),
    }));
    throw new InputError(diags);
  }
  const design = parsed.data.design as Design;
  const errors: Diagnostic[] = [];
  for (const [key, cell] of Object.entries(design.cells)) {
    if (cell.name !== key) {
      errors.push({
        severity: 'error',
        code: 'json.cell-name',
        message: `cell stored under "${key}" is named "${cell.name}"`,
        loc: at(locatePath(text, ['design', 'cells', key, 'name'])),
      });
    }
  }
  if (errors.length > 0) throw new InputError(errors);
  const designLoc = at(locatePath(text, ['design']));
  // Structural problems keep the design's own source locations; those without one point at the design.
  const diagnostics = validateDesign(design, { cellNoun: design.format === 'verilog' ? 'module' : 'subcircuit' }).map((d) =>
    d.loc ? d : { ...d, loc: designLoc },
  );
  if (diagnostics.some((d) => d.severity === 'error')) throw new InputError(diagnostics);
  return { design, diagnostics };
}
