// Proves the proposal list keys carry only the filters that are set, in a fixed order, so two
// screens asking for the same list share one cache entry.
import { describe, expect, it } from 'vitest';
import { exportUrl, isProposalsKeyOf, proposalsKey } from './workflow-keys';

const ID = '6f1c2a4e-0000-4000-8000-000000000001';

describe('proposalsKey', () => {
  it('has no query when nothing is filtered', () => {
    expect(proposalsKey(ID)).toBe(`/api/designs/${ID}/proposals`);
  });

  it('keeps set filters in one order whatever order they were given in', () => {
    const a = proposalsKey(ID, { sort: 'savings', status: 'open', rule: 'tristate-slim' });
    const b = proposalsKey(ID, { rule: 'tristate-slim', status: 'open', sort: 'savings', verdict: undefined });
    expect(a).toBe(b);
    expect(a).toBe(`/api/designs/${ID}/proposals?rule=tristate-slim&status=open&sort=savings`);
  });

  it('matches every filtered list of the same design and no other design', () => {
    const match = isProposalsKeyOf(ID);
    expect(match(proposalsKey(ID, { status: 'accepted' }))).toBe(true);
    expect(match(proposalsKey('6f1c2a4e-0000-4000-8000-000000000002'))).toBe(false);
    expect(match(`/api/designs/${ID}`)).toBe(false);
  });
});

describe('exportUrl', () => {
  it('addresses a revision by number and the format as a query', () => {
    expect(exportUrl(ID, 3, 'report-html')).toBe(`/api/designs/${ID}/revisions/3/export?format=report-html`);
  });
});
