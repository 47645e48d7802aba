// Proves the rendered drawing: one symbol group per part and one group per net of the region, and
// the highlighted groups are exactly the proposal's removed parts (before) and added parts (after).
import { describe, expect, it } from 'vitest';
import { render } from '@testing-library/react';
import Svg from 'react-native-svg';
import { extractRegion } from '@/optimizer/region/region';
import { sliceInverters } from '@/optimizer/rules/test-helpers';
import { emptyEdit, type Edit } from '@/optimizer/rules/types';
import { layoutRegion } from './layout';
import { SchematicContent } from './schematic-svg';

function edit(): Edit {
  const e = emptyEdit();
  for (let k = 1; k < 3; k++) {
    e.removeDevices.push(`XS${k}.Q1`, `XS${k}.RC`, `XS${k}.RB`);
    e.mergeNets.push({ keep: 'XS0.LDN', remove: `XS${k}.LDN` });
  }
  e.addDevices.push({ name: 'RPULL', kind: 'resistor', terminals: ['VCC', 'XS0.LDN'], value: 2200 });
  return e;
}

async function rendered(graph: Parameters<typeof layoutRegion>[0]) {
  const drawing = await layoutRegion(graph);
  const { container } = render(
    <Svg width={drawing.width} height={drawing.height}>
      <SchematicContent drawing={drawing} />
    </Svg>,
  );
  return container;
}

describe('SchematicContent', { timeout: 60_000 }, () => {
  it('draws one symbol per part and one group per net, highlighting exactly the removed parts before', async () => {
    const e = edit();
    const r = extractRegion(sliceInverters(3), e);
    const c = await rendered(r.before);
    const parts = [...c.querySelectorAll('[data-part]')].map((n) => n.getAttribute('data-part'));
    expect(parts.sort()).toEqual(r.before.parts.map((p) => p.name).sort());
    const nets = [...c.querySelectorAll('[data-net]')].map((n) => n.getAttribute('data-net'));
    expect(nets.sort()).toEqual(r.before.nets.map((n) => n.name).sort());
    const removed = [...c.querySelectorAll('[data-role="removed"]')].map((n) => n.getAttribute('data-part'));
    expect(removed.sort()).toEqual([...e.removeDevices].sort());
    expect(c.querySelectorAll('[data-role="added"]')).toHaveLength(0);
  });

  it('highlights exactly the added parts after', async () => {
    const r = extractRegion(sliceInverters(3), edit());
    const c = await rendered(r.after);
    expect([...c.querySelectorAll('[data-role="added"]')].map((n) => n.getAttribute('data-part'))).toEqual(['RPULL']);
    expect(c.querySelectorAll('[data-role="removed"]')).toHaveLength(0);
    expect(c.querySelectorAll('[data-part]')).toHaveLength(r.after.parts.length);
    expect(c.querySelector('[data-part="RPULL"]')?.getAttribute('data-glyph')).toBe('resistor');
  });
});
