// Who may decide a proposal, and why not when they may not: the role, the proposal's state and
// the rule that nobody reviews a proposal from their own scan.
import type { Me } from '@/components/data/types';
import type { ProposalDetail } from '@/shared/api/proposals';

/** startedBy is the person's name and/or e-mail ("Name <email>"); any of their identifiers matches. */
export function startedByMe(startedBy: string, me: Pick<Me, 'user'>): boolean {
  const s = startedBy.trim().toLowerCase();
  const { id, email, name } = me.user;
  return s === id.toLowerCase() || s === email.toLowerCase() || s.includes(`<${email.toLowerCase()}>`) || (name.trim() !== '' && s === name.trim().toLowerCase());
}

export type DecisionAccess = { canDecide: true } | { canDecide: false; why: string | null };

export function decisionAccess(p: Pick<ProposalDetail, 'status' | 'startedBy'>, me: Pick<Me, 'user' | 'role'>): DecisionAccess {
  // Designers, educators and viewers see the decisions but have no actions to hide behind a reason.
  if (me.role !== 'reviewer' && me.role !== 'admin') return { canDecide: false, why: null };
  if (p.status !== 'open') return { canDecide: false, why: `This proposal is ${p.status === 'out-of-date' ? 'out of date: a new scan will propose it again if it still applies' : p.status}, so there is nothing to decide.` };
  if (startedByMe(p.startedBy, me)) return { canDecide: false, why: 'You started the scan that found this proposal, so another reviewer decides it.' };
  return { canDecide: true };
}
