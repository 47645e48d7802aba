// Proves the decision card in the browser build: a reviewer sees accept and reject on someone
// else's open proposal, a reject without a reason is stopped on the form before any request, and
// the reviewer of their own scan sees the reason instead of the buttons.
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import type { ProposalDetail } from '@/shared/api/proposals';
import { DecisionCard } from './decision-card';

const ines = {
  user: { id: '0b5c1e52-1111-4111-8111-111111111111', email: 'reviewer@trimwire.test', name: 'Ines Varga' },
  team: { id: '0b5c1e52-2222-4222-8222-222222222222', name: 'Larkspur Relay Works' },
  role: 'reviewer' as const,
  teams: [],
};

const proposal = {
  id: '0b5c1e52-3333-4333-8333-333333333333',
  designId: '0b5c1e52-4444-4444-8444-444444444444',
  status: 'open',
  readiness: 'ready',
  startedBy: 'Tobias Quell <designer@trimwire.test>',
  decisions: [],
} as unknown as ProposalDetail;

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('DecisionCard', () => {
  it('stops a rejection without a reason on the form and sends nothing', () => {
    const fetch = vi.fn();
    vi.stubGlobal('fetch', fetch);
    render(<DecisionCard proposal={proposal} me={ines} />);
    fireEvent.click(screen.getByTestId('proposal-reject'));
    expect(screen.getByTestId('proposal-reason-error').textContent).toMatch(/Say why you reject it/);
    expect(fetch).not.toHaveBeenCalled();
    expect(screen.getByTestId('proposal-accept')).toBeTruthy();
  });

  it('shows the reviewer of their own scan why they cannot decide, without the buttons', () => {
    render(<DecisionCard proposal={{ ...proposal, startedBy: 'Ines Varga <reviewer@trimwire.test>' }} me={ines} />);
    expect(screen.queryByTestId('proposal-accept')).toBeNull();
    expect(screen.queryByTestId('proposal-reject')).toBeNull();
    expect(screen.getByTestId('proposal-decision-unavailable').textContent).toMatch(/another reviewer decides it/);
  });

  it('warns before a refuted proposal is accepted', () => {
    render(<DecisionCard proposal={{ ...proposal, readiness: 'refuted' }} me={ines} />);
    expect(screen.getByTestId('proposal-not-ready').textContent).toMatch(/changes an output/);
  });
});
