// Resource limits for untrusted designs, with the defaults the server and the cli use. Each limit
// is checked before the work it guards (file size before parsing, flattened size before flattening).

export interface Limits {
  /** Largest input file in bytes (checked by readDesign). */
  maxFileBytes: number;
  /** Most devices a design may have after flattening (checked before flattening). */
  maxDevices: number;
  /** Deepest instance nesting, counting the top cell as depth 1. */
  maxDepth: number;
}

/**
 * 4M devices admits a 1M-transistor bipolar design with its resistors (about 2.6M devices, ~1.2 GB
 * flattened) while keeping the worst case inside the memory goal of 3 GB.
 */
export const DEFAULT_LIMITS: Readonly<Limits> = Object.freeze({
  maxFileBytes: 8 * 1024 * 1024,
  maxDevices: 4_000_000,
  maxDepth: 32,
});

export function withDefaults(limits: Partial<Limits> = {}): Limits {
  return { ...DEFAULT_LIMITS, ...limits };
}

export function formatBytes(n: number): string {
  if (n >= 1024 * 1024) return `${Number((n / (1024 * 1024)).toFixed(1))} MiB`;
  if (n >= 1024) return `${Number((n / 1024).toFixed(1))} KiB`;
  return `${n} bytes`;
}
