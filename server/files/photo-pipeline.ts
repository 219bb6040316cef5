import sharp, { type Sharp } from 'sharp';
import { AppError } from '../errors';
import { displayName } from './content-check';

/**
 * The most pixels a photo may declare. Phone cameras top out around 108–200 megapixels (from
 * memory); 120 MP admits the 108 MP sensors, while an image declaring more is refused before any
 * pixel is decoded — a few kilobytes of PNG can declare 50 000 × 50 000 pixels (a decompression
 * bomb) that would take gigabytes to decode. sharp's own default (0x3FFF², about 268 MP) is looser.
 */
export const PHOTO_MAX_PIXELS = 120_000_000;
/** The stored photo's longest side: enough to judge fit and drag lines on a large screen. */
export const PHOTO_FULL_MAX_SIDE = 2400;
/** The thumbnail's longest side: a photo-wall tile at twice the density of a 240 px column. */
export const PHOTO_THUMB_MAX_SIDE = 480;
/** JPEG quality for both outputs: no visible loss on fabric texture at a fraction of the bytes. */
export const PHOTO_JPEG_QUALITY = 85;

export type EncodedImage = { buffer: Buffer; width: number; height: number; mime: 'image/jpeg' };
export type ProcessedPhoto = { full: EncodedImage; thumb: EncodedImage };

const DECODABLE = new Set(['jpeg', 'png', 'webp']);

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
      `${name} is ${meta.width} × ${meta.height} pixels; a photo may have at most ${PHOTO_MAX_PIXELS / 1_000_000} megapixels.`,
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
