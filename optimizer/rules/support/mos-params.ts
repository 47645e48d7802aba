// First-order (SPICE level-1) parameters of one MOS transistor for margin checks: β = KP·W/L and
// V_T from the device and its model card, with documented family defaults where both are silent,
// and the saturation current of a load transistor (depletion or always-on PMOS).
import type { FlatNetlist, ParamValue } from '../../netlist/ir';

/**
 * Defaults when the model card says nothing: KP 20 µA/V² and W = L (the SPICE level-1 defaults);
 * |V_T| 0.7 V for enhancement devices (common practice; SPICE's own default of 0 V would make
 * every gate conduct). Check the transistor's data sheet.
 */
export const MOS_DEFAULTS = { kp: 2e-5, vtEnhancement: 0.7 } as const;

export interface MosParams {
  /** KP·W/L, A/V². */
  beta: number;
  /** Threshold voltage with its sign (negative for depletion NMOS and for PMOS). */
  vt: number;
  from: 'model' | 'default';
}

function num(v: ParamValue | undefined): number | undefined {
  if (typeof v === 'number') return Number.isFinite(v) ? v : undefined;
  if (typeof v === 'string') {
    const x = Number(v);
    return Number.isFinite(x) ? x : undefined;
  }
  return undefined;
}

const param = (p: Record<string, ParamValue>, name: string): number | undefined => num(p[name] ?? p[name.toLowerCase()]);

export function mosParams(nl: Readonly<FlatNetlist>, device: number): MosParams {
  const d = nl.devices[device];
  const model = d.model ? nl.models[d.model.toLowerCase()] : undefined;
  const kpModel = model ? param(model.params, 'KP') : undefined;
  const vtModel = model ? param(model.params, 'VTO') : undefined;
  const w = param(d.params, 'W');
  const l = param(d.params, 'L');
  const ratio = w !== undefined && l !== undefined && l > 0 ? w / l : 1;
  const sign = d.kind === 'pmos' ? -1 : 1;
  return {
    beta: (kpModel ?? MOS_DEFAULTS.kp) * ratio,
    vt: vtModel ?? sign * MOS_DEFAULTS.vtEnhancement,
    from: kpModel !== undefined && vtModel !== undefined ? 'model' : 'default',
  };
}

/**
 * Saturation current of a load transistor while the line it pulls up is low (≈ 0 V): a depletion
 * NMOS with its gate on the line has V_GS ≈ 0 − 0, so I = β/2·V_T²; a PMOS (or enhancement NMOS)
 * with its gate on a rail has its overdrive from that rail. Square law (SPICE level 1), at `vcc`.
 */
export function loadSaturationAmps(nl: Readonly<FlatNetlist>, device: number, vcc: number, railVolts: (net: number) => number | undefined): number {
  const d = nl.devices[device];
  const p = mosParams(nl, device);
  const gate = railVolts(d.terminals[1]);
  let overdrive: number;
  if (d.kind === 'pmos') overdrive = vcc - (gate ?? 0) - Math.abs(p.vt);
  else overdrive = (gate ?? 0) - p.vt;
  return overdrive > 0 ? (p.beta / 2) * overdrive * overdrive : 0;
}
