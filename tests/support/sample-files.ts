import sharp from 'sharp';
import { assemblePdf } from '../../db/seeders/minimal-pdf';

/** Sample files for upload tests, built in code so the repository holds no binaries. */

// piexifjs ships no type declarations; the few calls used here are typed by hand.
type PiexifIfd = Record<number, unknown>;
type Piexif = {
  ImageIFD: Record<string, number>;
  ExifIFD: Record<string, number>;
  GPSIFD: Record<string, number>;
  dump(exif: { '0th'?: PiexifIfd; Exif?: PiexifIfd; GPS?: PiexifIfd }): string;
  insert(exif: string, jpeg: string): string;
};
// eslint-disable-next-line @typescript-eslint/no-require-imports
const piexif = require('piexifjs') as Piexif;

export const RED = { r: 220, g: 0, b: 0 };
export const BLUE = { r: 0, g: 0, b: 220 };

/**
 * A 40 × 20 JPEG, left half red and right half blue, carrying an Exif GPS IFD (latitude and
 * longitude with their N/E references, tags 1–4 of the Exif standard's GPS IFD — from memory) and
 * Orientation 6 in IFD0 ("rotate 90° clockwise to display", Exif/TIFF tag 0x0112 — from memory).
 * The position is invented.
 */
export async function jpegWithGpsAndOrientation(): Promise<Buffer> {
  const plain = await sharp({ create: { width: 40, height: 20, channels: 3, background: RED } })
    .composite([{ input: { create: { width: 20, height: 20, channels: 3, background: BLUE } }, left: 20, top: 0 }])
    .jpeg({ quality: 95 })
    .toBuffer();
  const exif = piexif.dump({
    '0th': { [piexif.ImageIFD.Orientation]: 6, [piexif.ImageIFD.Make]: 'Example Camera' },
    Exif: { [piexif.ExifIFD.DateTimeOriginal]: '2024:05:01 10:00:00' },
    GPS: {
      [piexif.GPSIFD.GPSLatitudeRef]: 'N',
      [piexif.GPSIFD.GPSLatitude]: [[45, 1], [30, 1], [0, 1]],
      [piexif.GPSIFD.GPSLongitudeRef]: 'E',
      [piexif.GPSIFD.GPSLongitude]: [[10, 1], [15, 1], [0, 1]],
    },
  });
  // piexifjs works on "binary" strings, one character per byte.
  return Buffer.from(piexif.insert(exif, plain.toString('binary')), 'binary');
}

/** The smallest useful PDF: a catalog and a page tree with one empty A4 page (see assemblePdf). */
export function tinyPdf(): Buffer {
  return assemblePdf(['<< /Type /Catalog /Pages 2 0 R >>', '<< /Type /Pages /Kids [3 0 R] /Count 1 >>', '<< /Type /Page /Parent 2 0 R /MediaBox [0 0 595 842] >>']);
}
