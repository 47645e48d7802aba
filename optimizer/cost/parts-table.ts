// The editable parts table: footprint, board area and unit price per part kind. The defaults are
// INVENTED DEMO PRICES and typical through-hole footprints — replace them with your supplier's
// figures; nothing here is a quotation.
import { z } from 'zod';

export const PART_KINDS = ['npn', 'pnp', 'nmos', 'pmos', 'resistor', 'diode', 'capacitor', 'gate'] as const;
export type PartKind = (typeof PART_KINDS)[number];

export const PartEntrySchema = z.object({
  footprint: z.string().min(1),
  /** Board area one part takes, mm² (body plus pads and spacing). */
  areaMm2: z.number().nonnegative(),
  /** Unit price in `currency`. */
  price: z.number().nonnegative(),
});
export type PartEntry = z.infer<typeof PartEntrySchema>;

export const PartsTableSchema = z.object({
  currency: z.string().min(1),
  /** Where the figures come from; the defaults say they are invented. */
  note: z.string(),
  parts: z.record(z.enum(PART_KINDS), PartEntrySchema),
});
export type PartsTable = z.infer<typeof PartsTableSchema>;

export const DEFAULT_PARTS_TABLE: PartsTable = {
  currency: 'EUR',
  note: 'invented demo prices — not a quotation; replace with your supplier’s figures',
  parts: {
    npn: { footprint: 'TO-92', areaMm2: 30, price: 0.06 },
    pnp: { footprint: 'TO-92', areaMm2: 30, price: 0.07 },
    nmos: { footprint: 'SOT-23', areaMm2: 9, price: 0.05 },
    pmos: { footprint: 'SOT-23', areaMm2: 9, price: 0.06 },
    resistor: { footprint: 'axial 0.4 in', areaMm2: 25, price: 0.01 },
    diode: { footprint: 'DO-35', areaMm2: 22, price: 0.02 },
    capacitor: { footprint: 'radial 2.5 mm', areaMm2: 20, price: 0.03 },
    gate: { footprint: 'DIP-14 (quarter package)', areaMm2: 45, price: 0.08 },
  },
};
