// SWR keys of the review workflow (designs, scans, proposals, the review queue): each is the API
// path it fetches, so an action can revalidate exactly what it changed.
import type { ProposalListQuery } from '@/shared/api/proposals';

export const DESIGNS_KEY = '/api/designs';
export const REVIEW_QUEUE_KEY = '/api/review-queue';

export const designKey = (id: string) => `/api/designs/${encodeURIComponent(id)}`;
export const scanKey = (id: string) => `/api/scans/${encodeURIComponent(id)}`;
export const proposalKey = (id: string) => `/api/proposals/${encodeURIComponent(id)}`;

export type ProposalFilters = Partial<Pick<ProposalListQuery, 'rule' | 'status' | 'verdict' | 'board' | 'sort' | 'order'>>;

export function proposalsKey(designId: string, filters: ProposalFilters = {}): string {
  const params = new URLSearchParams();
  for (const name of ['rule', 'status', 'verdict', 'board', 'sort', 'order'] as const) {
    const value = filters[name];
    if (value) params.set(name, value);
  }
  const query = params.toString();
  return `${designKey(designId)}/proposals${query ? `?${query}` : ''}`;
}

// Every proposals list of one design, whatever its filters: decisions and scans change them all.
export const isProposalsKeyOf = (designId: string) => (key: unknown) => typeof key === 'string' && key.startsWith(`${designKey(designId)}/proposals`);

export function exportUrl(designId: string, revision: number, format: string): string {
  return `${designKey(designId)}/revisions/${revision}/export?format=${encodeURIComponent(format)}`;
}
