// The team's designs: the list, one design's detail, and the designer's actions on a design
// (upload, new revision by applying accepted proposals, assumptions).
import useSWR, { useSWRConfig } from 'swr';
import { useMemo } from 'react';
import type { DesignDetail, DesignListResponse } from '@/shared/api/designs';
import type { Assumption, AssumptionBody, AssumptionPatchBody } from '@/shared/api/assumptions';
import type { Revision } from '@/shared/api/revisions';
import { api } from './api-client';
import { AUDIT_KEY } from './keys';
import { DESIGNS_KEY, designKey, isProposalsKeyOf, proposalKey, REVIEW_QUEUE_KEY } from './workflow-keys';

export function useDesigns() {
  const { data, error, isLoading, mutate } = useSWR<DesignListResponse>(DESIGNS_KEY);
  return { designs: data?.designs, error: error as unknown, isLoading, retry: () => mutate() };
}

export function useDesign(id: string | null) {
  const { data, error, isLoading, mutate } = useSWR<DesignDetail>(id ? designKey(id) : null);
  return { design: data, error: error as unknown, isLoading, retry: () => mutate() };
}

export type UploadInput = {
  file: Blob | { uri: string; name: string; type: string };
  fileName: string;
  name: string;
  format?: string;
  family?: string;
  boardName?: string;
  budgetParts?: string;
  budgetAreaMm2?: string;
  budgetCost?: string;
  note?: string;
};

export function uploadForm(input: UploadInput): FormData {
  const form = new FormData();
  for (const [field, value] of Object.entries(input)) {
    if (field === 'file' || field === 'fileName' || value === undefined || value === '') continue;
    form.append(field, String(value));
  }
  // A Blob gets its file name from the third argument; React Native's { uri, name, type } carries its own.
  if (typeof Blob !== 'undefined' && input.file instanceof Blob) form.append('file', input.file, input.fileName);
  else form.append('file', input.file as unknown as Blob);
  return form;
}

export function useDesignActions() {
  const { mutate } = useSWRConfig();
  return useMemo(() => {
    const refreshDesign = async (id: string) => {
      await Promise.all([mutate(designKey(id)), mutate(DESIGNS_KEY), mutate(isProposalsKeyOf(id)), mutate(REVIEW_QUEUE_KEY), mutate(AUDIT_KEY)]);
    };
    return {
      upload: async (input: UploadInput) => {
        const design = await api.upload<DesignDetail>('/api/designs', uploadForm(input));
        await mutate(designKey(design.id), design, { revalidate: false });
        await mutate(DESIGNS_KEY);
        return design;
      },
      applyAccepted: async (designId: string, applyProposalIds: string[], baseRevision: number) => {
        const revision = await api.post<Revision>(`${designKey(designId)}/revisions`, { applyProposalIds, baseRevision });
        await refreshDesign(designId);
        await Promise.all(applyProposalIds.map((id) => mutate(proposalKey(id))));
        return revision;
      },
      addAssumption: async (designId: string, body: AssumptionBody) => {
        const made = await api.post<Assumption>(`${designKey(designId)}/assumptions`, body);
        await refreshDesign(designId);
        return made;
      },
      // Editing or withdrawing puts the proposals that relied on it out of date, so lists refresh too.
      changeAssumption: async (designId: string, assumptionId: string, body: AssumptionPatchBody) => {
        const changed = await api.patch<Assumption>(`${designKey(designId)}/assumptions/${encodeURIComponent(assumptionId)}`, body);
        await refreshDesign(designId);
        return changed;
      },
      refreshDesign,
    };
  }, [mutate]);
}
