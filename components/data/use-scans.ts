// Scans of a design: start one, follow it while it runs (polling only while queued or running),
// and cancel it.
import useSWR, { useSWRConfig } from 'swr';
import { useMemo } from 'react';
import type { Scan, ScanStartBody } from '@/shared/api/scans';
import { api } from './api-client';
import { DESIGNS_KEY, designKey, isProposalsKeyOf, REVIEW_QUEUE_KEY, scanKey } from './workflow-keys';

/** How often a live scan is re-read; finished scans are not polled at all. */
export const SCAN_POLL_MS = 1000;

export function isLive(scan: Pick<Scan, 'status'> | null | undefined): boolean {
  return scan?.status === 'queued' || scan?.status === 'running';
}

// `known` (the design's copy of the scan) is shown until the first read of the scan answers.
export function useScan(id: string | null, known?: Scan | null) {
  const { mutate: mutateGlobal } = useSWRConfig();
  const { data, error, mutate } = useSWR<Scan>(id ? scanKey(id) : null, {
    refreshInterval: (latest) => (isLive(latest) ? SCAN_POLL_MS : 0),
    // When the scan finishes the design's counts and proposals change: read them again.
    onSuccess: (scan) => {
      if (!isLive(scan)) {
        void mutateGlobal(designKey(scan.designId));
        void mutateGlobal(isProposalsKeyOf(scan.designId));
        void mutateGlobal(DESIGNS_KEY);
        void mutateGlobal(REVIEW_QUEUE_KEY);
      }
    },
  });
  return { scan: data ?? (known && known.id === id ? known : null), error: error as unknown, retry: () => mutate() };
}

export function useScanActions() {
  const { mutate } = useSWRConfig();
  return useMemo(
    () => ({
      start: async (designId: string, body: ScanStartBody = {}) => {
        const scan = await api.post<Scan>(`${designKey(designId)}/scans`, body);
        await mutate(scanKey(scan.id), scan, { revalidate: false });
        await mutate(designKey(designId));
        return scan;
      },
      cancel: async (scan: Scan) => {
        const next = await api.post<Scan>(`${scanKey(scan.id)}/cancel`);
        await mutate(scanKey(scan.id), next, { revalidate: false });
        await mutate(designKey(scan.designId));
        return next;
      },
    }),
    [mutate],
  );
}
