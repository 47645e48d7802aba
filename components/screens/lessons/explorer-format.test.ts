import { describe, expect, it } from 'vitest';
import { formatMoney, formatSetting, formatSi } from './explorer-format';

describe('explorer number wording', () => {
  it('writes values with engineering prefixes', () => {
    expect(formatSi(4700, 'Ω')).toBe('4.7 kΩ');
    expect(formatSi(2.5e-7, 's')).toBe('250 ns');
    expect(formatSi(0.0021, 'A')).toBe('2.1 mA');
    expect(formatSi(5, 'V')).toBe('5 V');
    expect(formatSi(0, 'V')).toBe('0 V');
  });

  it('leaves word units and bare numbers unprefixed', () => {
    expect(formatSi(12, 'loads')).toBe('12 loads');
    expect(formatSi(1500, '')).toBe('1500');
  });

  it('writes money to two places with the currency', () => {
    expect(formatMoney(1.2, 'EUR')).toBe('1.20 EUR');
  });

  it('words slider settings with their units', () => {
    expect(formatSetting('loads', 1)).toBe('1 load');
    expect(formatSetting('loads', 4)).toBe('4 loads');
    expect(formatSetting('pullUpOhms', 4300)).toBe('4.3 kΩ');
    expect(formatSetting('clockPeriod', 1e-6)).toBe('1 µs');
  });
});
