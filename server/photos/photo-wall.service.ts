import { Enrollment, Photo, Report, User, type Trial } from '../../db/models';
import type { Storage } from '../storage/storage';
import { SIGNED_URL_SECONDS } from '../storage/storage';
import type { loadTrial } from '../trials/trials.service';

export type WallFilter = { stage?: Photo['stage']; view?: Photo['view']; sizeId?: string };

/** Columns of the wall, left to right: how a fit is usually looked at, whole figure first. */
export const VIEW_ORDER: readonly Photo['view'][] = ['front', 'side', 'back', 'detail'];

type LoadedTrial = Awaited<ReturnType<typeof loadTrial>>;

/**
 * The trial's photos for its staff, ordered by the tester's size in grading order, then by view
 * (front, side, back, detail), tester and time, each with a thumbnail link that works for a few
 * minutes. The caller has passed the studio's access check before this runs; links are signed here,
 * after it, and never stored.
 */
export async function trialPhotoWall(trial: LoadedTrial | Trial, filter: WallFilter, storage: Storage) {
  const photos = await Photo.findAll({
    where: { ...(filter.stage ? { stage: filter.stage } : {}), ...(filter.view ? { view: filter.view } : {}) },
    include: [
      {
        model: Enrollment,
        as: 'enrollment',
        required: true,
        // Testers still in the trial: one who was declined or left is not on the wall.
        where: { trialId: trial.id, status: ['active', 'finished'], ...(filter.sizeId ? { sizeId: filter.sizeId } : {}) },
        include: [{ model: User, as: 'user', attributes: ['id', 'name'] }],
      },
    ],
  });
  const enrollmentIds = [...new Set(photos.map((p) => p.enrollmentId))];
  const reports = enrollmentIds.length ? await Report.findAll({ where: { enrollmentId: enrollmentIds } }) : [];
  const draftOf = new Map(reports.map((r) => [`${r.enrollmentId}:${r.stage}`, r.content.draftVersion ?? null]));
  const sizes = new Map((trial.pattern?.sizes ?? []).map((s) => [s.id, s]));
  const variants = new Map((trial.pattern?.variants ?? []).map((v) => [v.id, v.name]));

  const rows = photos.map((photo) => {
    const enrollment = (photo as Photo & { enrollment: Enrollment & { user?: User } }).enrollment;
    const size = sizes.get(enrollment.sizeId);
    return {
      photo,
      row: {
        id: photo.id,
        enrollmentId: enrollment.id,
        tester: { name: enrollment.user?.name ?? '' },
        // A size since removed from the chart sorts last rather than vanishing.
        size: { id: enrollment.sizeId, label: size?.label ?? '?', order: size?.position ?? Number.MAX_SAFE_INTEGER },
        variant: enrollment.variantId ? (variants.get(enrollment.variantId) ?? null) : null,
        stage: photo.stage,
        view: photo.view,
        consent: photo.consent,
        draftVersion: draftOf.get(`${enrollment.id}:${photo.stage}`) ?? null,
        width: photo.width,
        height: photo.height,
        createdAt: photo.createdAt,
      },
    };
  });
  rows.sort(
    (a, b) =>
      a.row.size.order - b.row.size.order ||
      VIEW_ORDER.indexOf(a.row.view) - VIEW_ORDER.indexOf(b.row.view) ||
      a.row.tester.name.localeCompare(b.row.tester.name) ||
      a.row.createdAt.getTime() - b.row.createdAt.getTime(),
  );
  return Promise.all(
    rows.map(async ({ photo, row }) => ({
      ...row,
      thumbUrl: await storage.signedUrl('photos', photo.thumbKey, `${photo.view}-${photo.id.slice(0, 8)}-thumb.jpg`),
      expiresInSeconds: SIGNED_URL_SECONDS,
    })),
  );
}
