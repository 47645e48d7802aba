// The doc-example reader: expect-line decks read into labels, expectations and assumptions, and a
// deck that states no expectation names its file, line and title instead of failing obscurely.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { deckExamples } from './rule-test-kit';

function docFile(text: string): string {
  const file = path.join(mkdtempSync(path.join(tmpdir(), 'rule-doc-')), 'rule.md');
  writeFileSync(file, text);
  return file;
}

describe('deckExamples', () => {
  it('reads the expectation, its data and the assumptions', () => {
    const file = docFile(
      '# r\n\n```spice\nWren-8 strobe\n* expect: pair gate=U1 place=top\n* assume: A1 WR -> SEL\nVCC VCC 0 DC 5\n.end\n```\n\n```spice\nWren-8 idle\n* expect: none\n.end\n```\n',
    );
    const [a, b] = deckExamples(file);
    expect(a.label).toBe('Wren-8 strobe');
    expect(a.expect).toEqual({ messageId: 'pair', data: { gate: 'U1', place: 'top' } });
    expect(a.assumptions.map((x) => [x.id, x.text])).toEqual([['A1', 'WR -> SEL']]);
    expect(b.expect).toEqual({ messageId: null, data: {} });
    expect(b.assumptions).toEqual([]);
  });

  it('names the file, line and deck title when a deck states no expectation', () => {
    const file = docFile('# r\n\nText.\n\n```spice\nWren-8 bus bit\nVCC VCC 0 DC 5\n.end\n```\n');
    expect(() => deckExamples(file)).toThrow(`${file}:5: the spice example "Wren-8 bus bit" lacks a "* expect: none"`);
  });
});
