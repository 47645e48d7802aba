// The explorer's what-if in the browser: the engine imported by the client, run under happy-dom on
// the inputs the server sent, gives exactly the server's results for the same settings (the
// recording is kept true to the server by tests/integration/lessons.test.ts).
import fs from 'node:fs';
import path from 'node:path';
import { renderHook } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { runWhatIf, type ExplorerData, type WhatIfInputs, type WhatIfSettings } from '@/optimizer/whatif';
import { computeWhatIf, useWhatIf } from './use-lessons';

type Recorded = { inputs: WhatIfInputs; cases: { settings: WhatIfSettings; enabled: string[]; server: unknown }[] };
const recorded = JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../tests/fixtures/whatif/wren8-lesson.json'), 'utf8')) as Recorded;
const explorer = { inputs: recorded.inputs } as ExplorerData;

describe('what-if in the browser', () => {
  it('runs where a browser runs', () => {
    expect(typeof window).toBe('object');
    expect(typeof document.createElement).toBe('function');
  });

  it.each(recorded.cases.map((c, i) => [i, c] as const))('equals the server for recorded case %i', (_i, c) => {
    const browser = computeWhatIf(explorer, c.settings, c.enabled);
    expect(browser.error).toBeUndefined();
    // Through JSON as the server's answer came, so Infinity and -0 are compared as sent.
    expect(JSON.parse(JSON.stringify(browser.result))).toEqual(c.server);
  });

  it('covers a pass → fail turn in the recording (the explorer’s lesson)', () => {
    const statuses = recorded.cases.map((c) => (c.server as { status: string }).status);
    expect(statuses).toContain('fail');
    expect(statuses).toContain('pass');
  });

  it('gives the hook’s result for the current settings and recomputes when they change', () => {
    const bus = 'proposal:tristate-slim';
    const { result, rerender } = renderHook(({ s }: { s: WhatIfSettings }) => useWhatIf(explorer, s, [bus]), { initialProps: { s: {} } });
    expect(result.current.result).toEqual(runWhatIf(recorded.inputs, {}, [bus]));
    rerender({ s: { pullUpOhms: 30_000 } });
    expect(result.current.result?.worstRiseTime?.status).toBe('fail');
  });

  it('turns a refused setting into a sentence, not a thrown render', () => {
    const r = computeWhatIf(explorer, { supplyVolts: -1 }, []);
    expect(r.result).toBeUndefined();
    expect(r.error).toMatch(/supplyVolts must be a positive number/);
  });
});
