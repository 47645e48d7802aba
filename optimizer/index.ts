// The engine's public surface: one plain list of re-exports for the server, the client and the cli.
export * from './errors';
export * from './netlist/ir';
export { readSpice, SPICE_TOP } from './formats/spice/read';
export { parseSpiceNumber } from './formats/spice/numbers';
export { validateDesign } from './netlist/validate';
export { solveRails } from './netlist/rails';
