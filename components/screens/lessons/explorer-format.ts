// Number wording for the trade-off explorer: engineering prefixes for margins and settings, money
// for cost, and the slider settings' labels and units in one table.
import type { SettingKey } from '@/optimizer/whatif';

const PREFIXES: [number, string][] = [
  [1e9, 'G'], [1e6, 'M'], [1e3, 'k'], [1, ''], [1e-3, 'm'], [1e-6, 'µ'], [1e-9, 'n'], [1e-12, 'p'],
];

/** 4700 Ω → "4.7 kΩ"; 2.5e-7 s → "250 ns". A unit that is a word (e.g. "loads") gets no prefix. */
export function formatSi(value: number, unit: string): string {
  if (!Number.isFinite(value)) return `${value} ${unit}`.trim();
  if (unit === '' || /^[a-z]{2,}/.test(unit)) return `${Number(value.toPrecision(3))}${unit ? ` ${unit}` : ''}`;
  const abs = Math.abs(value);
  const [scale, prefix] = abs === 0 ? [1, ''] : (PREFIXES.find(([s]) => abs >= s * 0.9995) ?? PREFIXES[PREFIXES.length - 1]!);
  return `${Number((value / scale).toPrecision(3))} ${prefix}${unit}`;
}

export function formatMoney(value: number, currency?: string): string {
  return currency ? `${value.toFixed(2)} ${currency}` : value.toFixed(2);
}

export const SETTING_LABELS: Record<SettingKey, { label: string; unit: string }> = {
  betaMin: { label: 'Minimum current gain β', unit: '' },
  pullUpOhms: { label: 'Pull-up value', unit: 'Ω' },
  supplyVolts: { label: 'Supply voltage', unit: 'V' },
  clockPeriod: { label: 'Clock period', unit: 's' },
  loads: { label: 'Number of loads', unit: 'loads' },
};

export const SETTING_ORDER: SettingKey[] = ['betaMin', 'pullUpOhms', 'supplyVolts', 'clockPeriod', 'loads'];

/** A slider's value in words: "4.7 kΩ", "250 ns", "1 load", "12 loads". */
export function formatSetting(key: SettingKey, value: number): string {
  if (key === 'loads') return `${value} load${value === 1 ? '' : 's'}`;
  return formatSi(value, SETTING_LABELS[key].unit);
}

/** Kinds of part the explorer counts, with their row labels. */
export const PART_ROWS = [
  ['transistors', 'Transistors'],
  ['resistors', 'Resistors'],
  ['diodes', 'Diodes'],
  ['capacitors', 'Capacitors'],
  ['gates', 'Gates'],
] as const;
