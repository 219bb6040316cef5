import pLimit from 'p-limit';
import sharp, { type Sharp } from 'sharp';
import { AppError, unavailable } from '../errors';
import { displayName } from './content-check';

/**
 * The most pixels a photo may declare: 50 megapixels. Phones take 12 MP photos by default and
 * offer 48 or 50 MP as their high-resolution mode (from memory; a few offer 108 or 200 MP modes,
 * whose photos are refused with a message asking for the normal setting). A fit photo is stored
 * at most 2400 px on its longest side (about 4 MP), so pixels beyond that are thrown away anyway,
 * while decoding them is what costs: a PNG of a few hundred kilobytes can declare 120 MP, and
 * measured here one 48 MP PNG took about 65 MB and 0.3–0.8 s on one libvips thread (a 120 MP one
 * 100 MB and 1.2 s). An image declaring more is refused before any pixel is decoded; sharp's own
 * default (0x3FFF², about 268 MP) is looser.
 */
export const PHOTO_MAX_PIXELS = 50_000_000;
/**
 * Photos processed at once, each on one libvips thread (sharp.concurrency(1) below): one per core
 * of the 2-core machines Basted runs on, so a burst of uploads queues instead of starving the
 * event loop and the database pool of CPU and memory.
 */
export const PHOTO_PROCESSING_CONCURRENCY = 2;
/** Uploads waiting for a turn beyond which a new one is turned away with 503 (try again shortly). */
export const PHOTO_QUEUE_MAX = 16;
/** The stored photo's longest side: enough to judge fit and drag lines on a large screen. */
export const PHOTO_FULL_MAX_SIDE = 2400;
/** The thumbnail's longest side: a photo-wall tile at twice the density of a 240 px column. */
export const PHOTO_THUMB_MAX_SIDE = 480;
/** JPEG quality for both outputs: no visible loss on fabric texture at a fraction of the bytes. */
export const PHOTO_JPEG_QUALITY = 85;

export type EncodedImage = { buffer: Buffer; width: number; height: number; mime: 'image/jpeg' };
export type ProcessedPhoto = { full: EncodedImage; thumb: EncodedImage };

const DECODABLE = new Set(['jpeg', 'png', 'webp']);

// One libvips thread per image and no operation cache: memory stays with the images in flight.
sharp.concurrency(1);
sharp.cache(false);
const turns = pLimit(PHOTO_PROCESSING_CONCURRENCY);

/** How many photos are being processed and how many wait (for tests and health checks). */
export const photoQueue = () => ({ active: turns.activeCount, waiting: turns.pendingCount });

/**
 * processPhoto, at most PHOTO_PROCESSING_CONCURRENCY at a time; when PHOTO_QUEUE_MAX uploads
 * already wait, refused at once with 503 rather than queued without end.
 */
export function processPhotoBounded(input: Buffer, fileName = ''): Promise<ProcessedPhoto> {
  if (turns.pendingCount >= PHOTO_QUEUE_MAX) {
    return Promise.reject(unavailable('Many photos are being processed just now. Please try again in a minute.'));
  }
  return turns(() => processPhoto(input, fileName));
}

/**
 * Re-encodes an uploaded photo (already checked as JPEG, PNG or WebP by content-check.ts) into a
 * stored JPEG and a thumbnail. Orientation from EXIF is applied to the pixels; no metadata is
 * carried over (sharp writes none unless asked with withMetadata / keepExif, which we never call),
 * so EXIF — GPS position, camera serial, time — and XMP are gone. Pure: bytes in, bytes out.
 * `name` only words the error messages.
 */
export async function processPhoto(input: Buffer, fileName = ''): Promise<ProcessedPhoto> {
  const name = fileName ? displayName(fileName) : 'The photo';
  // Read the header alone first: it gives the declared size without decoding any pixel.
  const meta = await sharp(input, { limitInputPixels: false }).metadata().catch(() => {
    throw unreadable(name);
  });
  if (!DECODABLE.has(meta.format)) throw unreadable(name);
  if (meta.width * meta.height > PHOTO_MAX_PIXELS) {
    throw new AppError(
      413,
      'image_too_large',
      `${name} is ${meta.width} × ${meta.height} pixels; a photo may have at most ${PHOTO_MAX_PIXELS / 1_000_000} megapixels. Take it at the camera's normal setting, or make it smaller.`,
    );
  }

  try {
    const full = await encode(
      sharp(input, {
        // Second guard, enforced by the decoder itself, in case the header and data disagree.
        limitInputPixels: PHOTO_MAX_PIXELS,
        // sharp's advice for untrusted input: abort on any decoder warning, not only on errors.
        failOn: 'warning',
      })
        // Same as .rotate() without an angle: turns the pixels as the EXIF Orientation tag says,
        // since the tag itself is dropped with the rest of the metadata.
        .autoOrient(),
      PHOTO_FULL_MAX_SIDE,
    );
    // The thumbnail comes from the clean, oriented output: cheaper than decoding the upload again.
    const thumb = await encode(sharp(full.buffer), PHOTO_THUMB_MAX_SIDE);
    return { full, thumb };
  } catch (error) {
    if (error instanceof Error && /pixel limit/i.test(error.message)) {
      throw new AppError(413, 'image_too_large', `${name} has too many pixels; a photo may have at most ${PHOTO_MAX_PIXELS / 1_000_000} megapixels.`);
    }
    // The only varying input is the upload, so a decoder failure means a damaged or odd file.
    throw unreadable(name);
  }
}

async function encode(image: Sharp, maxSide: number): Promise<EncodedImage> {
  const { data, info } = await image
    .resize({ width: maxSide, height: maxSide, fit: 'inside', withoutEnlargement: true })
    // JPEG has no transparency; without this a transparent PNG background would turn black.
    .flatten({ background: '#ffffff' })
    .jpeg({ quality: PHOTO_JPEG_QUALITY })
    .toBuffer({ resolveWithObject: true });
  return { buffer: data, width: info.width, height: info.height, mime: 'image/jpeg' };
}

function unreadable(name: string) {
  return new AppError(415, 'unsupported_file', `${name} could not be read as a JPEG, PNG or WebP image; it may be damaged.`);
}
