// Lessons for the client: the list, one lesson, the educator's actions (create, edit, reorder,
// duplicate, publish, delete, share links), the explorer's data (a lesson, a share link or a
// design) and the in-browser what-if, which runs the engine's own runWhatIf — no round trip.
import useSWR, { useSWRConfig } from 'swr';
import { useMemo } from 'react';
import { runWhatIf, type ExplorerData, type WhatIfResult, type WhatIfSettings } from '@/optimizer/whatif';
import type { Lesson, LessonBody, LessonListResponseSchema, LessonPatchBody, Section, ShareLink, ShareLinkBody, ShareLinkCreatedSchema } from '@/shared/api/lessons';
import type { z } from 'zod';
import { api } from './api-client';

type LessonList = z.infer<typeof LessonListResponseSchema>;
type ShareLinkCreated = z.infer<typeof ShareLinkCreatedSchema>;

/** What GET /api/share/:token returns: the lesson's notes and its explorer, nothing else. */
export type SharedLesson = {
  lesson: { id: string; title: string; sections: Section[]; author: string; publishedAt: string | null };
  explorer: ExplorerData;
};

export const LESSONS_KEY = '/api/lessons';
export const lessonKey = (id: string) => `/api/lessons/${encodeURIComponent(id)}`;
export const lessonExplorerKey = (id: string) => `${lessonKey(id)}/explorer`;
export const shareLinksKey = (id: string) => `${lessonKey(id)}/share-links`;
export const sharedLessonKey = (token: string) => `/api/share/${encodeURIComponent(token)}`;
export const designExplorerKey = (designId: string) => `/api/designs/${encodeURIComponent(designId)}/explorer`;

export function useLessons() {
  const { data, error, isLoading, mutate } = useSWR<LessonList>(LESSONS_KEY);
  return { lessons: data?.lessons, error: error as unknown, isLoading, retry: () => mutate() };
}

export function useLesson(id: string | null) {
  const { data, error, isLoading, mutate } = useSWR<Lesson>(id ? lessonKey(id) : null);
  return { lesson: data, error: error as unknown, isLoading, retry: () => mutate() };
}

export function useShareLinks(lessonId: string | null) {
  const { data, error, isLoading, mutate } = useSWR<{ links: ShareLink[] }>(lessonId ? shareLinksKey(lessonId) : null);
  return { links: data?.links, error: error as unknown, isLoading, retry: () => mutate() };
}

/** The explorer of a lesson (signed in), of a share link (signed out or in) or of a design. */
export function useExplorer(source: { lessonId: string } | { designId: string } | null) {
  const key = !source ? null : 'lessonId' in source ? lessonExplorerKey(source.lessonId) : designExplorerKey(source.designId);
  const { data, error, isLoading, mutate } = useSWR<ExplorerData>(key);
  return { explorer: data, error: error as unknown, isLoading, retry: () => mutate() };
}

export function useSharedLesson(token: string | null) {
  const { data, error, isLoading, mutate } = useSWR<SharedLesson>(token ? sharedLessonKey(token) : null);
  return { shared: data, error: error as unknown, isLoading, retry: () => mutate() };
}

/**
 * What-if, computed in the browser with the same engine the server runs. Only the settings the
 * learner moved are passed (an absent key keeps each margin's scanned figure). Settings the engine
 * refuses come back as `error` (a sentence), never as a thrown render.
 */
export function computeWhatIf(explorer: ExplorerData, settings: WhatIfSettings, enabled: readonly string[]): { result?: WhatIfResult; error?: string } {
  try {
    return { result: runWhatIf(explorer.inputs, settings, enabled) };
  } catch (err) {
    return { error: err instanceof Error ? err.message : String(err) };
  }
}

export function useWhatIf(explorer: ExplorerData | undefined, settings: WhatIfSettings, enabled: readonly string[]) {
  // Keyed on the values, not the object identities, so a re-render with equal settings reuses the result.
  const key = JSON.stringify([settings, enabled]);
  return useMemo(() => (explorer ? computeWhatIf(explorer, settings, enabled) : {}), [explorer, key]);
}

export function useLessonActions() {
  const { mutate } = useSWRConfig();
  return useMemo(() => {
    const refresh = async (id?: string) => {
      await Promise.all([mutate(LESSONS_KEY), ...(id ? [mutate(lessonKey(id)), mutate(lessonExplorerKey(id))] : [])]);
    };
    return {
      create: async (body: LessonBody) => {
        const made = await api.post<Lesson>(LESSONS_KEY, body);
        await mutate(lessonKey(made.id), made, { revalidate: false });
        await refresh();
        return made;
      },
      /** Sections are sent whole; their order is the saved order (reorder = send them reordered). */
      update: async (id: string, body: LessonPatchBody) => {
        const changed = await api.patch<Lesson>(lessonKey(id), body);
        await mutate(lessonKey(id), changed, { revalidate: false });
        await refresh(id);
        return changed;
      },
      moveSection: async (lesson: Lesson, from: number, to: number) => {
        const sections = [...lesson.sections];
        const [moved] = sections.splice(from, 1);
        if (!moved) return lesson;
        sections.splice(Math.max(0, Math.min(to, sections.length)), 0, moved);
        const changed = await api.patch<Lesson>(lessonKey(lesson.id), { sections });
        await mutate(lessonKey(lesson.id), changed, { revalidate: false });
        return changed;
      },
      duplicate: async (id: string) => {
        const copy = await api.post<Lesson>(`${lessonKey(id)}/duplicate`);
        await refresh();
        return copy;
      },
      publish: async (id: string) => {
        const done = await api.post<Lesson>(`${lessonKey(id)}/publish`);
        await mutate(lessonKey(id), done, { revalidate: false });
        await refresh(id);
        return done;
      },
      unpublish: async (id: string) => {
        const done = await api.patch<Lesson>(lessonKey(id), { status: 'draft' });
        await mutate(lessonKey(id), done, { revalidate: false });
        await refresh(id);
        return done;
      },
      remove: async (id: string) => {
        await api.del(lessonKey(id));
        await mutate(lessonKey(id), undefined, { revalidate: false });
        await refresh();
      },
      /** The token comes back once; show it (or its url) now — it cannot be read again. */
      share: async (id: string, body: ShareLinkBody) => {
        const link = await api.post<ShareLinkCreated>(shareLinksKey(id), body);
        await mutate(shareLinksKey(id));
        return link;
      },
      revokeLink: async (id: string, linkId: string) => {
        await api.del(`${shareLinksKey(id)}/${encodeURIComponent(linkId)}`);
        await mutate(shareLinksKey(id));
      },
    };
  }, [mutate]);
}
