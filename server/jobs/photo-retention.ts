import { Op } from 'sequelize';
import { Enrollment, Photo, Studio, Trial } from '../../db/models';
import { resolveStudioSettings } from '../domain/studio-settings';
import type { Storage } from '../storage/storage';

const DAY = 86_400_000;

export type RetentionResult = { trials: number; photos: number; failed: number };

/**
 * Removes the photos of released trials once the studio's keeping period (days after the
 * release) has passed: the stored objects first, then the rows. A trial whose objects the store
 * would not remove keeps its rows and is tried again on the next run. The clock is a parameter.
 */
export async function sweepPhotoRetention(storage: Storage, now: Date = new Date()): Promise<RetentionResult> {
  const result: RetentionResult = { trials: 0, photos: 0, failed: 0 };
  const trials = await Trial.findAll({ where: { releasedAt: { [Op.ne]: null }, photosRemovedAt: null }, include: [{ model: Studio, as: 'studio' }] });
  for (const trial of trials) {
    const days = resolveStudioSettings(trial.studio?.settings).photoRetentionDays;
    if (days === null || trial.releasedAt!.getTime() + days * DAY > now.getTime()) continue;
    const photos = await Photo.findAll({ include: [{ model: Enrollment, as: 'enrollment', required: true, where: { trialId: trial.id }, attributes: [] }] });
    let failed = false;
    for (const photo of photos) {
      try {
        await storage.remove('photos', photo.fullKey);
        await storage.remove('photos', photo.thumbKey);
        await photo.destroy();
        result.photos += 1;
      } catch (error) {
        failed = true;
        result.failed += 1;
        console.error(`[jobs] photo ${photo.id} of trial ${trial.id} not removed:`, error instanceof Error ? error.message : error);
      }
    }
    if (!failed) {
      await trial.update({ photosRemovedAt: now });
      result.trials += 1;
    }
  }
  return result;
}
