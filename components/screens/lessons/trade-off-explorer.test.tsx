// Proves the explorer screen against the engine it runs: switching a proposal off moves its parts
// saving out of the "after" column, and moving the pull-up slider to its end shows the badge the
// engine computes for that setting (a rise time that passes at the scanned pull-up and fails at
// the largest one). The charts and the drawing follow the same settings.
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { riseTime } from '@/optimizer/margins/line';
import { DEFAULT_MARGIN_SETTINGS } from '@/optimizer/margins/defaults';
import { defaultSettings, runWhatIf, type ExplorerData, type WhatIfInputs } from '@/optimizer/whatif';
import { TradeOffExplorer } from './trade-off-explorer';

afterEach(cleanup);

const parts = (transistors: number, resistors: number, cost: number) => ({ transistors, resistors, diodes: 0, capacitors: 0, gates: 0, areaMm2: 0, cost });

// A Wren-8 bus line: 4.3 kΩ pull-up, 10 pF, 1 µs clock (invented demo figures).
const rise = riseTime({ vcc: 5, pullUp: 4300, capacitance: 10e-12, clockPeriod: 1e-6 }, DEFAULT_MARGIN_SETTINGS);
const inputs: WhatIfInputs = {
  baseline: parts(18, 0, 0.99),
  currency: 'EUR',
  proposals: [
    { id: 'p-bus', ruleId: 'tristate-slim', title: 'open-drain bus with one pull-up', savings: parts(8, -1, 0.4), margins: [rise], overlapsWith: [] },
    { id: 'p-ws', ruleId: 'two-level-minimise', title: 'rebuild WS', savings: parts(2, 0, 0.1), margins: [], overlapsWith: [] },
  ],
};
const explorer: ExplorerData = {
  design: { name: 'Wren-8 bus', family: 'cmos', revision: 1, title: 'demo', devices: 18, nets: 10, clockPeriodNs: 1000 },
  inputs,
  proposals: inputs.proposals.map((p) => ({
    id: p.id, ruleId: p.ruleId, title: p.title, message: '', verdict: 'proved', marginStatus: 'pass', status: 'open',
    evidence: { method: 'sat', assumptions: [] }, location: { devices: [], instances: [], nets: [] }, twoLevel: null,
    region: p.id === 'p-bus'
      ? { before: [{ name: 'XB1.Q1', kind: 'npn', terminals: ['BUS', 'XB1.B', '0'] }], after: [{ name: 'RPULL', kind: 'resistor', terminals: ['VCC', 'BUS'], value: 4300 }], reconnect: [], mergeNets: [] }
      : { before: [], after: [], reconnect: [], mergeNets: [] },
  })),
  defaults: defaultSettings(inputs),
  pricesNote: 'invented demo prices',
  cautions: ['Check the exported deck on the bench.'],
};

describe('TradeOffExplorer', () => {
  it('takes a switched-off proposal’s saving out of the after column', () => {
    render(<TradeOffExplorer explorer={explorer} />);
    const transistorsRow = () => screen.getByTestId('explorer-parts-table-row-0').textContent;
    expect(transistorsRow()).toBe('Transistors188' + '10');
    // The switch's own checkbox takes the click, as in a browser.
    fireEvent.click(screen.getByTestId('explorer-toggle-0').querySelector('input')!);
    expect(transistorsRow()).toBe('Transistors1816' + '2');
  });

  it('shows the engine’s badge after the pull-up slider moves to its end', () => {
    const max = explorer.defaults.ranges.pullUpOhms.max;
    const atMax = runWhatIf(inputs, { pullUpOhms: max }, ['p-bus', 'p-ws']).proposals[0]!.margins[0]!.status;
    // The setting must matter for this test to prove anything.
    expect(rise.status).toBe('pass');
    expect(atMax).toBe('fail');
    render(<TradeOffExplorer explorer={explorer} />);
    expect(screen.getByTestId('margin-badge-0-0').textContent).toBe('Pass');
    expect(screen.getByTestId('explorer-slider-pullUpOhms-value').textContent).toBe('4.3 kΩ');
    fireEvent.keyDown(screen.getByTestId('explorer-slider-pullUpOhms'), { key: 'End' });
    expect(screen.getByTestId('margin-badge-0-0').textContent).toBe('Fail');
    expect(screen.getByTestId('explorer-rise-status').textContent).toBe('Fail');
    // A setting no margin uses says so instead of showing the range's end as if it were scanned.
    expect(screen.getByTestId('explorer-slider-betaMin-value').textContent).toBe('not used here');
    fireEvent.click(screen.getByTestId('explorer-reset'));
    expect(screen.getByTestId('margin-badge-0-0').textContent).toBe('Pass');
  });
});

describe('TradeOffExplorer pictures', () => {
  const label = (id: string) => screen.getByTestId(id).querySelector('[aria-label]')!.getAttribute('aria-label');
  const transistorBars = () => screen.getByTestId('explorer-chart-parts').querySelector('[data-kind="transistors"]')!;

  it('redraws the margins chart with the engine’s figures when the pull-up slider moves', () => {
    const max = explorer.defaults.ranges.pullUpOhms.max;
    const atMax = runWhatIf(inputs, { pullUpOhms: max }, ['p-bus', 'p-ws']).proposals[0]!.margins[0]!;
    render(<TradeOffExplorer explorer={explorer} />);
    const scanned = label('explorer-chart-margins');
    expect(scanned).toContain(`${rise.value} against ${rise.limit} ${rise.unit}, pass`);
    fireEvent.keyDown(screen.getByTestId('explorer-slider-pullUpOhms'), { key: 'End' });
    expect(label('explorer-chart-margins')).toContain(`${atMax.value} against ${atMax.limit} ${atMax.unit}, fail`);
    expect(screen.getByTestId('explorer-chart-margins').querySelector('[data-status]')!.getAttribute('data-status')).toBe('fail');
  });

  it('redraws the parts chart and the drawing when a proposal is switched off', () => {
    render(<TradeOffExplorer explorer={explorer} />);
    expect(transistorBars().getAttribute('data-after')).toBe('8');
    expect(label('explorer-chart-parts')).toContain('Transistors: 18 before, 8 after');
    expect(screen.getByTestId('explorer-region-before')).toBeTruthy();
    fireEvent.click(screen.getByTestId('explorer-toggle-0').querySelector('input')!);
    expect(transistorBars().getAttribute('data-after')).toBe('16');
    expect(label('explorer-chart-parts')).toContain('Transistors: 18 before, 16 after');
    // Only the bus rewrite changes drawable parts; with it off there is nothing to draw.
    expect(screen.queryByTestId('explorer-region-before')).toBeNull();
    expect(screen.getByTestId('explorer-region-empty')).toBeTruthy();
    expect(screen.getByTestId('explorer-chart-margins-empty')).toBeTruthy();
  });
});
