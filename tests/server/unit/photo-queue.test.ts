import sharp from 'sharp';
import { AppError } from '../../../server/errors';
import { PHOTO_PROCESSING_CONCURRENCY, PHOTO_QUEUE_MAX, photoQueue, processPhotoBounded } from '../../../server/files/photo-pipeline';

describe('photo processing under a burst of uploads', () => {
  it(`processes at most ${PHOTO_PROCESSING_CONCURRENCY} photos at once and turns away uploads beyond ${PHOTO_QUEUE_MAX} waiting with 503`, async () => {
    // 2000 × 1500 photos: enough work that the burst overlaps.
    const photo = await sharp({ create: { width: 2000, height: 1500, channels: 3, background: { r: 120, g: 90, b: 60 } } }).jpeg().toBuffer();
    let busiest = 0;
    const sampler = setInterval(() => {
      busiest = Math.max(busiest, photoQueue().active);
    }, 2);
    try {
      const burst = Array.from({ length: PHOTO_QUEUE_MAX + 4 }, () => processPhotoBounded(photo, 'burst.jpg'));
      const settled = await Promise.allSettled(burst);
      const done = settled.filter((s) => s.status === 'fulfilled');
      const refused = settled.flatMap((s) => (s.status === 'rejected' ? [s.reason as AppError] : []));
      expect(done).toHaveLength(PHOTO_QUEUE_MAX);
      expect(refused.map((e) => [e.status, e.code])).toEqual(Array(4).fill([503, 'unavailable']));
      expect(busiest).toBeGreaterThan(0);
      expect(busiest).toBeLessThanOrEqual(PHOTO_PROCESSING_CONCURRENCY);
      expect(photoQueue()).toEqual({ active: 0, waiting: 0 });
    } finally {
      clearInterval(sampler);
    }
  });
});
