// Starting values and slider ranges for the explorer, read from the inputs stored with the
// proposals' margins (the design's own supply, pull-ups, β_min, clock and loads), so the sliders
// open on the scanned figures and the first result equals the stored margins.
import type { MarginInputs } from '../margins/corners';
import { DEFAULT_MARGIN_SETTINGS } from '../margins/defaults';
import type { WhatIfInputs, WhatIfSettings } from './types';

export interface SliderRange {
  min: number;
  max: number;
  step: number;
}

export type SettingKey = keyof Required<WhatIfSettings>;

export interface ExplorerDefaults {
  /** The scanned figures (a key is absent when no stored margin uses it). */
  settings: WhatIfSettings;
  ranges: Record<SettingKey, SliderRange>;
}

function first<T>(list: T[]): T | undefined {
  return list.length ? list[0] : undefined;
}

/** Scanned settings of a set of proposals: the first stored figure of each kind. */
export function defaultSettings(inputs: WhatIfInputs): ExplorerDefaults {
  const all: MarginInputs[] = inputs.proposals.flatMap((p) => p.margins.flatMap((m) => (m.inputs ? [m.inputs] : [])));
  const supply = first(all.flatMap((i) => ('vcc' in i ? [i.vcc] : [])));
  const pullUp = first(
    all.flatMap((i) => {
      if (i.check === 'rise-time' || i.check === 'pull-up-min' || i.check === 'pull-up-max') return [i.pullUp];
      if (i.check === 'loaded-high-level' || i.check === 'load-base-current') return [i.rc];
      if (i.check === 'sink-current' || i.check === 'forced-beta' || i.check === 'static-power') return i.pullUps.length ? [Math.min(...i.pullUps)] : [];
      return [];
    }),
  );
  const beta = first(all.flatMap((i) => (i.check === 'forced-beta' || i.check === 'load-base-current' ? [i.betaMin] : [])));
  const clock = first(all.flatMap((i) => (i.check === 'rise-time' ? [i.clockPeriod] : [])));
  const loads = first(all.flatMap((i) => ('loads' in i && typeof i.loads === 'number' ? [i.loads] : [])));
  const settings: WhatIfSettings = {
    ...(beta !== undefined ? { betaMin: beta } : {}),
    ...(pullUp !== undefined ? { pullUpOhms: pullUp } : {}),
    ...(supply !== undefined ? { supplyVolts: supply } : {}),
    ...(clock !== undefined ? { clockPeriod: clock } : {}),
    ...(loads !== undefined ? { loads } : {}),
  };
  const clockAt = clock ?? 1e-6;
  return {
    settings,
    ranges: {
      // β_min of small-signal switching transistors spans roughly 10–300 (common practice).
      betaMin: { min: 5, max: 300, step: 1 },
      pullUpOhms: { min: 100, max: 100_000, step: 10 },
      supplyVolts: { min: 1, max: 15, step: 0.05 },
      clockPeriod: { min: clockAt / 20, max: clockAt * 20, step: clockAt / 20 },
      loads: { min: 1, max: Math.max(32, (loads ?? 1) * 4, DEFAULT_MARGIN_SETTINGS.fanOut.cmos), step: 1 },
    },
  };
}
