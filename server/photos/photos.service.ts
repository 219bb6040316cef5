import { randomUUID } from 'node:crypto';
import { Op, type Transaction } from 'sequelize';
import { Enrollment, Membership, Photo, Trial, type User } from '../../db/models';
import { can } from '../domain/policy';
import { conflict, notFound, notYours, unavailable } from '../errors';
import { checkPhotoFile } from '../files/content-check';
import { processPhotoBounded } from '../files/photo-pipeline';
import { purgeSoon, scheduleDeletions, type StoredObject } from '../storage/object-deletions';
import type { Storage } from '../storage/storage';

export type PhotoInput = { stage: Photo['stage']; view: Photo['view']; consent: Photo['consent'] };

/** The caller's own active enrolment; someone else's is not found. */
export async function ownEnrollment(enrollmentId: string, user: User) {
  const enrollment = await Enrollment.findOne({ where: { id: enrollmentId, userId: user.id } });
  if (!enrollment) throw (await Enrollment.count({ where: { id: enrollmentId } })) ? notYours('enrolment') : notFound('enrollment');
  return enrollment;
}

/**
 * Checks the bytes are a photo, re-encodes them without any metadata (GPS included) with the
 * orientation applied, stores the result and a thumbnail, then writes the row. A store that
 * fails leaves no row; a row that fails removes what was stored.
 */
export async function addPhoto(enrollmentId: string, user: User, input: PhotoInput, file: { buffer: Buffer; name: string }, storage: Storage) {
  const enrollment = await ownEnrollment(enrollmentId, user);
  await assertMayAddPhoto(enrollment, input);
  await checkPhotoFile(file.buffer, file.name);
  const { full, thumb } = await processPhotoBounded(file.buffer, file.name);
  const id = randomUUID();
  const keys = { full: `photos/${id}.jpg`, thumb: `photos/${id}-thumb.jpg` };
  const stored: string[] = [];
  let photo: Photo;
  try {
    await storage.put('photos', keys.full, full.buffer, full.mime);
    stored.push(keys.full);
    await storage.put('photos', keys.thumb, thumb.buffer, thumb.mime);
    stored.push(keys.thumb);
    photo = await Photo.create({
      id,
      enrollmentId: enrollment.id,
      ...input,
      fullKey: keys.full,
      thumbKey: keys.thumb,
      width: full.width,
      height: full.height,
    });
  } catch (error) {
    await Promise.allSettled(stored.map((key) => storage.remove('photos', key)));
    throw error;
  }
  await replaceEarlier(photo, storage);
  return photo;
}

/** Detail photos one report may have (front, side and back are one each): enough for any fit question. */
export const DETAIL_PHOTOS_PER_REPORT = 12;

/**
 * Only a tester still in the trial adds photos (one who left or was declined does not), and a
 * report's detail photos are capped.
 */
async function assertMayAddPhoto(enrollment: Enrollment, input: PhotoInput) {
  if (enrollment.status !== 'active' && enrollment.status !== 'finished') {
    throw conflict('You are no longer in this trial, so you cannot add photos to it.');
  }
  if (input.view === 'detail') {
    const details = await Photo.count({ where: { enrollmentId: enrollment.id, stage: input.stage, view: 'detail' } });
    if (details >= DETAIL_PHOTOS_PER_REPORT) {
      throw conflict(`A report has at most ${DETAIL_PHOTOS_PER_REPORT} detail photos. Remove one to add another.`, { photo: `at most ${DETAIL_PHOTOS_PER_REPORT} detail photos` });
    }
  }
}

const objectsOf = (photos: Photo[]): StoredObject[] => photos.flatMap((p) => [{ bucket: 'photos' as const, key: p.fullKey }, { bucket: 'photos' as const, key: p.thumbKey }]);

/** Removes photo rows and records their stored objects for removal, in one transaction. */
async function dropPhotos(photos: Photo[], transaction: Transaction) {
  if (!photos.length) return;
  await scheduleDeletions(Photo.sequelize!, objectsOf(photos), transaction);
  await Photo.destroy({ where: { id: photos.map((p) => p.id) }, transaction });
}

/**
 * A report has one front, one side and one back photo: a new one replaces the earlier (its row
 * goes, and its stored objects with it, once the new one is safely stored). Details may be many.
 */
async function replaceEarlier(photo: Photo, storage: Storage) {
  if (photo.view === 'detail') return;
  const earlier = await Photo.findAll({ where: { enrollmentId: photo.enrollmentId, stage: photo.stage, view: photo.view, id: { [Op.ne]: photo.id } } });
  if (!earlier.length) return;
  await Photo.sequelize!.transaction((transaction) => dropPhotos(earlier, transaction));
  await purgeSoon(Photo.sequelize!, storage);
}

/**
 * Deleting a photo removes the stored objects as well as the row. When the store cannot be
 * reached the answer is 503 and nothing changes, so the tester can simply try again.
 */
export async function deletePhoto(photoId: string, user: User, storage: Storage) {
  const photo = await Photo.findByPk(photoId);
  if (!photo) throw notFound('photo');
  await ownEnrollment(photo.enrollmentId, user);
  try {
    await storage.check();
  } catch {
    throw unavailable('The file store cannot be reached just now, so the photo was not deleted. Please try again in a few minutes.');
  }
  await Photo.sequelize!.transaction((transaction) => dropPhotos([photo], transaction));
  await purgeSoon(Photo.sequelize!, storage);
}

/** The caller's own photo (through their enrolment); anyone else's is not found. */
export async function ownPhoto(photoId: string, user: User) {
  const photo = await Photo.findOne({ where: { id: photoId }, include: [{ model: Enrollment, as: 'enrollment', where: { userId: user.id }, required: true }] });
  if (!photo) throw (await Photo.count({ where: { id: photoId } })) ? notYours('photo') : notFound('photo');
  return photo;
}

/** The tester may widen or narrow who sees a photo at any time: it is their permission, not report content. */
export async function setPhotoConsent(photoId: string, user: User, consent: Photo['consent']) {
  const photo = await ownPhoto(photoId, user);
  return photo.update({ consent });
}

/**
 * A tester who withdraws takes their photos with them: the rows go in the caller's transaction
 * and the stored objects are recorded for removal in it (removed after the commit, or by the job
 * once a store that is down answers again).
 */
export async function removeEnrollmentPhotos(enrollmentId: string, transaction: Transaction) {
  const photos = await Photo.findAll({ where: { enrollmentId }, transaction, lock: transaction.LOCK.UPDATE });
  await dropPhotos(photos, transaction);
  return photos.length;
}

export async function myPhotos(enrollmentId: string, user: User) {
  await ownEnrollment(enrollmentId, user);
  return Photo.findAll({ where: { enrollmentId }, order: [['createdAt', 'ASC']] });
}

/**
 * A short-lived link to a photo (or its thumbnail): for the tester who took it and the staff of
 * the trial's studio (owner, coordinator, grader). Anyone else: not found.
 */
export async function photoLink(photoId: string, size: 'full' | 'thumb', user: User, storage: Storage) {
  const photo = await Photo.findByPk(photoId, { include: [{ model: Enrollment, as: 'enrollment', include: [{ model: Trial, as: 'trial' }] }] });
  const enrollment = (photo as (Photo & { enrollment?: Enrollment & { trial?: Trial } }) | null)?.enrollment;
  if (!photo || !enrollment?.trial) throw notFound('photo');
  const own = enrollment.userId === user.id;
  const membership = own ? null : await Membership.findOne({ where: { studioId: enrollment.trial.studioId, userId: user.id } });
  if (!own && !can(membership?.role, 'trials.read')) throw notYours('photo');
  const key = size === 'thumb' ? photo.thumbKey : photo.fullKey;
  return { url: await storage.signedUrl('photos', key, `${photo.view}-${photo.id.slice(0, 8)}.jpg`), expiresInSeconds: 300 };
}

export function serializePhoto(photo: Photo) {
  return { id: photo.id, stage: photo.stage, view: photo.view, consent: photo.consent, width: photo.width, height: photo.height, createdAt: photo.createdAt };
}
