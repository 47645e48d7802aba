// The engine's public surface: one plain list of re-exports for the server, the client and the cli.
export * from './errors';
export * from './netlist/ir';
export { readSpice, SPICE_TOP } from './formats/spice/read';
export { parseSpiceNumber } from './formats/spice/numbers';
export { validateDesign } from './netlist/validate';
export { solveRails } from './netlist/rails';
export { flatten, SUPPLY1_VOLTS } from './netlist/flatten';
export { hierarchyStats, occurrences } from './netlist/hierarchy';
export { DEFAULT_LIMITS, withDefaults, type Limits } from './netlist/limits';
export { countParts, countFlat, bucketOf, zeroCounts, type PartCounts, type CountReport, type CellCounts } from './netlist/counts';
export { writeSpice } from './formats/spice/write';
export { generateBitSliced, slicesFor, TRANSISTORS_PER_SLICE, type Family, type GenerateOptions } from './netlist/generate';
