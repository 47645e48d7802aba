// Proves the wording helpers: every state has a word, savings read as a plain phrase, signs are
// shown the way a part delta is written, and engine stage names become sentences.
import { describe, expect, it } from 'vitest';
import { PROPOSAL_STATUSES, VERDICTS } from '@/shared/api/proposals';
import { SCAN_STATUSES } from '@/shared/api/scans';
import { ruleLabel, SCAN_WORDS, savingsPhrase, signed, stageLabel, STATUS_WORDS, VERDICT_WORDS } from './labels';

const none = { transistors: 0, resistors: 0, diodes: 0, capacitors: 0, gates: 0, parts: 0, areaMm2: 0, cost: 0 };

describe('state words', () => {
  it('names every status, verdict and scan state the API can send', () => {
    for (const s of PROPOSAL_STATUSES) expect(STATUS_WORDS[s].label).toBeTruthy();
    for (const v of VERDICTS) expect(VERDICT_WORDS[v].label).toBeTruthy();
    for (const s of SCAN_STATUSES) expect(SCAN_WORDS[s].sentence).toMatch(/\.$/);
    expect(STATUS_WORDS['out-of-date'].label).toBe('Out of date');
  });
});

describe('savingsPhrase', () => {
  it('lists the kinds saved, singular and plural, leaving out zero kinds', () => {
    expect(savingsPhrase({ ...none, transistors: 3, resistors: 1, parts: 4 })).toBe('3 transistors, 1 resistor');
  });
  it('says when a rewrite adds parts of a kind', () => {
    expect(savingsPhrase({ ...none, transistors: 4, diodes: -2, parts: 2 })).toBe('4 transistors, +2 diodes added');
  });
  it('says "no parts" when nothing changes', () => {
    expect(savingsPhrase(none)).toBe('no parts');
  });
});

describe('signed', () => {
  it('writes a minus sign, a plus sign, or a bare zero', () => {
    expect([signed(-3), signed(2), signed(0)]).toEqual(['−3', '+2', '0']);
  });
});

describe('stageLabel and ruleLabel', () => {
  it('reads rule stages and known stages as sentences and keeps unknown ones readable', () => {
    expect(stageLabel('rule tristate-slim')).toBe('Checking rule tristate-slim');
    expect(stageLabel('parse')).toBe('Reading the netlist');
    expect(stageLabel('cleanup')).toBe('Cleanup');
    expect(ruleLabel('shared-control-driver')).toBe('Shared control driver');
  });
});
