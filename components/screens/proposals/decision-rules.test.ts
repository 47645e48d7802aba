// Proves who sees the accept/reject actions: reviewers and admins on open proposals from someone
// else's scan; otherwise an explanation (or nothing, for roles that never decide).
import { describe, expect, it } from 'vitest';
import { decisionAccess, startedByMe } from './decision-rules';

const ines = { user: { id: '0b5c1e52-1111-4111-8111-111111111111', email: 'reviewer@trimwire.test', name: 'Ines Varga' }, role: 'reviewer' as const };

describe('startedByMe', () => {
  it('matches the person by "Name <email>", bare e-mail, name or id, case-insensitively', () => {
    expect(startedByMe('Ines Varga <Reviewer@trimwire.test>', ines)).toBe(true);
    expect(startedByMe('reviewer@trimwire.test', ines)).toBe(true);
    expect(startedByMe('ines varga', ines)).toBe(true);
    expect(startedByMe(ines.user.id, ines)).toBe(true);
  });
  it('does not match someone else, even with a similar address', () => {
    expect(startedByMe('Tobias Quell <designer@trimwire.test>', ines)).toBe(false);
    expect(startedByMe('Ines Varga-Holm <ivh@trimwire.test>', ines)).toBe(false);
  });
});

describe('decisionAccess', () => {
  const open = { status: 'open' as const, startedBy: 'Tobias Quell <designer@trimwire.test>' };
  it('lets a reviewer or an admin decide an open proposal from another person’s scan', () => {
    expect(decisionAccess(open, ines)).toEqual({ canDecide: true });
    expect(decisionAccess(open, { ...ines, role: 'admin' })).toEqual({ canDecide: true });
  });
  it('explains why the reviewer of their own scan cannot decide', () => {
    const own = decisionAccess({ ...open, startedBy: 'Ines Varga <reviewer@trimwire.test>' }, ines);
    expect(own.canDecide).toBe(false);
    expect(own.canDecide === false && own.why).toMatch(/another reviewer/);
  });
  it('explains that decided and out-of-date proposals have nothing to decide', () => {
    const done = decisionAccess({ ...open, status: 'accepted' }, ines);
    expect(done.canDecide === false && done.why).toMatch(/accepted/);
    const stale = decisionAccess({ ...open, status: 'out-of-date' }, ines);
    expect(stale.canDecide === false && stale.why).toMatch(/out of date/);
  });
  it('shows no actions and no explanation to roles that never decide', () => {
    expect(decisionAccess(open, { ...ines, role: 'designer' })).toEqual({ canDecide: false, why: null });
  });
});
