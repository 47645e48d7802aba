// Writes a design as the product's versioned JSON netlist (see shared/domain/netlist-json.ts).
import { NETLIST_JSON_FORMAT, NETLIST_JSON_VERSION } from '@/shared/domain/netlist-json';
import type { Design } from '../../netlist/ir';

export function writeJson(design: Design): string {
  return JSON.stringify({ format: NETLIST_JSON_FORMAT, version: NETLIST_JSON_VERSION, design }, null, 2) + '\n';
}
