import { useMemo } from 'react';
import useSWR, { useSWRConfig } from 'swr';
import { api } from './api';
import { uploadForm, type UploadFile, type UploadOptions } from './upload';

export type PhotoStage = 'check-in' | 'final';
export type PhotoView = 'front' | 'side' | 'back' | 'detail';
export type PhotoConsent = 'staff-only' | 'may-share';

export type MyPhoto = { id: string; stage: PhotoStage; view: PhotoView; consent: PhotoConsent; width: number; height: number; createdAt: string };
export type WallPhoto = MyPhoto & {
  enrollmentId: string;
  tester: { name: string };
  size: { id: string; label: string; order: number };
  variant: string | null;
  draftVersion: number | null;
  thumbUrl: string;
  expiresInSeconds: number;
};
export type PhotoLink = { url: string; expiresInSeconds: number };
export type WallFilter = { stage?: PhotoStage; view?: PhotoView };

export const photoKeys = {
  mine: (enrollmentId: string) => `/api/me/enrollments/${enrollmentId}/photos`,
  one: (photoId: string) => `/api/me/photos/${photoId}`,
  link: (photoId: string, size: 'thumb' | 'full') => `/api/photos/${photoId}/link${size === 'thumb' ? '?size=thumb' : ''}`,
  wall: (studioId: string, trialId: string, filter: WallFilter = {}) => {
    const query = new URLSearchParams([...(filter.stage ? [['stage', filter.stage]] : []), ...(filter.view ? [['view', filter.view]] : [])]).toString();
    return `/api/studios/${studioId}/trials/${trialId}/photos${query ? `?${query}` : ''}`;
  },
};

// Signed links live five minutes on the server; fetch fresh ones a minute before they lapse.
const LINK_REFRESH_MS = 4 * 60_000;

export const useMyPhotos = (enrollmentId?: string) => useSWR<MyPhoto[]>(enrollmentId ? photoKeys.mine(enrollmentId) : null);

/** A short-lived link to a photo or its thumbnail (asked for with POST: the server checks access each time). */
export const usePhotoLink = (photoId: string | null | undefined, size: 'thumb' | 'full') =>
  useSWR<PhotoLink>(photoId ? photoKeys.link(photoId, size) : null, (key: string) => api<PhotoLink>(key, { method: 'POST' }), {
    refreshInterval: LINK_REFRESH_MS,
    revalidateOnFocus: false,
  });

/** The trial's photo wall for its staff; each row carries a signed thumbnail link, so it is refreshed before they lapse. */
export const useTrialPhotos = (studioId: string | null | undefined, trialId: string | undefined, filter: WallFilter) =>
  useSWR<WallPhoto[]>(studioId && trialId ? photoKeys.wall(studioId, trialId, filter) : null, { refreshInterval: LINK_REFRESH_MS });

/**
 * A tester's changes to their own photos, each keeping the list under photoKeys.mine up to date.
 * Bound to the SWR cache in use (useSWRConfig), so a screen and its tests see the same list.
 */
export function useMyPhotoActions(enrollmentId: string) {
  const { mutate } = useSWRConfig();
  const key = photoKeys.mine(enrollmentId);
  return useMemo(
    () => ({
      async upload(input: { file: UploadFile; stage: PhotoStage; view: PhotoView; consent: PhotoConsent }, options: UploadOptions = {}) {
        const form = new FormData();
        form.append('stage', input.stage);
        form.append('view', input.view);
        form.append('consent', input.consent);
        // The file goes last: the server reads the fields before the bytes.
        form.append('photo', input.file, input.file.name);
        const photo = await uploadForm<MyPhoto>(key, form, options);
        await mutate<MyPhoto[]>(key, (list) => [...(list ?? []).filter((p) => p.id !== photo.id), photo], { revalidate: false });
        return photo;
      },
      async setConsent(photoId: string, consent: PhotoConsent) {
        const photo = await api<MyPhoto>(photoKeys.one(photoId), { method: 'PATCH', body: { consent } });
        await mutate<MyPhoto[]>(key, (list) => (list ?? []).map((p) => (p.id === photoId ? photo : p)), { revalidate: false });
        return photo;
      },
      async remove(photoId: string) {
        await api(photoKeys.one(photoId), { method: 'DELETE' });
        await mutate<MyPhoto[]>(key, (list) => (list ?? []).filter((p) => p.id !== photoId), { revalidate: false });
      },
    }),
    [key, mutate],
  );
}
