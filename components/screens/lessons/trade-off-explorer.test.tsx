// Proves the explorer screen against the engine it runs: switching a proposal off moves its parts
// saving out of the "after" column, and moving the pull-up slider to its end shows the badge the
// engine computes for that setting (a rise time that passes at the scanned pull-up and fails at
// the largest one).
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
    evidence: { method: 'sat', assumptions: [] }, location: { devices: [], instances: [], nets: [] }, region: { before: [], after: [], reconnect: [], mergeNets: [] }, twoLevel: null,
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
