// Documented, editable defaults for first-order margin checks: device drops, tolerances, logic
// thresholds and fan-out limits per family. Values are common practice unless a source is named;
// a design's models override them where they say more (β from BF). Check parts' data sheets.
import type { Model } from '../netlist/ir';
import type { MapFamily } from '../logic/family-parts';

export interface Thresholds {
  /** Highest input voltage the receiving stage still reads as 0. */
  vil: number;
  /** Lowest input voltage it reads as 1. */
  vih: number;
}

export interface MarginSettings {
  /** Fractional supply tolerance for corners (0.05 = ±5 %). */
  supplyTolerance: number;
  /** Fractional resistor tolerance for corners. */
  resistorTolerance: number;
  /** Base-emitter on voltage, V (common practice 0.6–0.7). */
  vbe: number;
  /** Collector-emitter saturation voltage, nominal and worst, V (common practice 0.1–0.3). */
  vceSat: number;
  vceSatMax: number;
  /** Silicon diode forward drop, nominal and worst, V (common practice ≈ 0.7). */
  vDiode: number;
  vDiodeMax: number;
  /** β_min = BF × derating when a model gives BF (production spread and temperature). */
  betaDerating: number;
  /** β_min when no model says anything. */
  defaultBetaMin: number;
  /** Forced β (I_C/I_B) at or below which saturation is called hard (common practice: 10). */
  forcedBetaTarget: number;
  /** Collector current a small-signal switching transistor is allowed, A (check the data sheet). */
  maxCollectorCurrent: number;
  /** Resistor power rating, W (¼-W parts), and the derated fraction above which we warn. */
  resistorRatingW: number;
  powerDerating: number;
  /** A pulled-up line must rise (10–90 %) within this fraction of the clock period. */
  riseFraction: number;
  /** Capacitance of a line plus each load's input, F, when the design gives none. */
  lineCapacitance: number;
  loadCapacitance: number;
  /** Fraction of a limit within which a passing value is reported as a warning. */
  warnBand: number;
  thresholds: Record<MapFamily, Thresholds>;
  /** Maximum loads per output. RTL 5, DTL 8 (Mano, Digital Design, from memory); others common practice. */
  fanOut: Record<MapFamily, number>;
}

export const DEFAULT_MARGIN_SETTINGS: MarginSettings = {
  supplyTolerance: 0.05,
  resistorTolerance: 0.05,
  vbe: 0.7,
  vceSat: 0.2,
  vceSatMax: 0.3,
  vDiode: 0.7,
  vDiodeMax: 0.75,
  betaDerating: 0.5,
  defaultBetaMin: 30,
  forcedBetaTarget: 10,
  maxCollectorCurrent: 0.1,
  resistorRatingW: 0.25,
  powerDerating: 0.5,
  riseFraction: 0.25,
  lineCapacitance: 20e-12,
  loadCapacitance: 5e-12,
  warnBand: 0.1,
  thresholds: {
    // RTL: an input below ~0.5 V keeps a silicon base off; above ~1 V it saturates (common practice).
    rtl: { vil: 0.5, vih: 1.0 },
    // DTL: the transistor turns on near V_BE + 2·V_D − V_D at the input ≈ 1.4 V; keep margin.
    dtl: { vil: 1.2, vih: 2.0 },
    // CMOS at 5 V: 30 % / 70 % of V_DD (common practice); scaled by supply in thresholdsFor.
    cmos: { vil: 1.5, vih: 3.5 },
    nmos: { vil: 0.8, vih: 2.0 },
    gate: { vil: 1.5, vih: 3.5 },
  },
  fanOut: { rtl: 5, dtl: 8, cmos: 20, nmos: 10, gate: 20 },
};

/** Settings with some fields replaced (nested records merged). */
export function marginSettings(over: Partial<MarginSettings> = {}): MarginSettings {
  return {
    ...DEFAULT_MARGIN_SETTINGS,
    ...over,
    thresholds: { ...DEFAULT_MARGIN_SETTINGS.thresholds, ...over.thresholds },
    fanOut: { ...DEFAULT_MARGIN_SETTINGS.fanOut, ...over.fanOut },
  };
}

/** CMOS thresholds follow the supply; the bipolar ones are set by junction drops. */
export function thresholdsFor(family: MapFamily, supply: number, s: MarginSettings): Thresholds {
  const t = s.thresholds[family];
  if (family === 'cmos' || family === 'gate') return { vil: (t.vil / 5) * supply, vih: (t.vih / 5) * supply };
  return t;
}

/** Minimum β of a transistor: the model's BF derated, or the family default. */
export function betaMinOf(model: Model | undefined, s: MarginSettings): { beta: number; from: 'model' | 'default' } {
  const raw = model?.params.BF ?? model?.params.bf ?? model?.params.Bf;
  const bf = typeof raw === 'number' ? raw : typeof raw === 'string' ? Number(raw) : NaN;
  if (Number.isFinite(bf) && bf > 0) return { beta: bf * s.betaDerating, from: 'model' };
  return { beta: s.defaultBetaMin, from: 'default' };
}
