import { crc32, deflateSync } from 'node:zlib';
import { gps, orientation, parse } from 'exifr';
import sharp from 'sharp';
import { checkDraftFile, checkPhotoFile, detectFileType } from '@/server/files/content-check';
import { PHOTO_FULL_MAX_SIDE, PHOTO_THUMB_MAX_SIDE, processPhoto } from '@/server/files/photo-pipeline';
import { BLUE, jpegWithGpsAndOrientation, RED, tinyPdf } from '../../support/sample-files';

/** A PNG chunk: length, type, data, CRC-32 over type and data (PNG spec, chunk layout — from memory). */
function pngChunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'latin1'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

/**
 * A decompression bomb: a few dozen bytes of valid PNG whose IHDR declares 50 000 × 50 000 pixels
 * (2.5 gigapixels, ~7.5 GB as RGB). PNG signature 89 50 4E 47 0D 0A 1A 0A per the PNG spec;
 * IHDR = width, height, bit depth 8, colour type 2 (RGB), compression, filter, interlace 0.
 */
function pngBomb(): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(50_000, 0);
  ihdr.writeUInt32BE(50_000, 4);
  ihdr.set([8, 2, 0, 0, 0], 8);
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    pngChunk('IHDR', ihdr),
    pngChunk('IDAT', deflateSync(Buffer.alloc(1 + 3 * 50_000))), // one row of black, the rest missing
    pngChunk('IEND', Buffer.alloc(0)),
  ]);
}


async function solidImage(format: 'png' | 'webp', width = 30, height = 20): Promise<Buffer> {
  const image = sharp({ create: { width, height, channels: 3, background: { r: 40, g: 120, b: 60 } } });
  return (format === 'png' ? image.png() : image.webp()).toBuffer();
}

/** The colour channel that dominates the pixel at (x, y) — JPEG is lossy, so exact values vary. */
async function dominantAt(jpeg: Buffer, x: number, y: number): Promise<'red' | 'green' | 'blue'> {
  const { data, info } = await sharp(jpeg).raw().toBuffer({ resolveWithObject: true });
  const i = (y * info.width + x) * info.channels;
  const [r, g, b] = [data[i], data[i + 1], data[i + 2]];
  if (r >= g && r >= b) return 'red';
  return g >= b ? 'green' : 'blue';
}

describe('processPhoto', () => {
  it('drops every EXIF tag, GPS included, from the photo and its thumbnail and applies the orientation', async () => {
    const upload = await jpegWithGpsAndOrientation();
    // The fixture really carries what we remove, read with the same reader as the outputs.
    await expect(gps(upload)).resolves.toMatchObject({ latitude: 45.5, longitude: 10.25 });
    await expect(orientation(upload)).resolves.toBe(6);

    const { full, thumb } = await processPhoto(upload, 'fit-front.jpg');

    for (const out of [full, thumb]) {
      expect(out.mime).toBe('image/jpeg');
      // JPEG starts with SOI FF D8 followed by a marker FF (JPEG / ITU T.81 — from memory).
      expect([...out.buffer.subarray(0, 3)]).toEqual([0xff, 0xd8, 0xff]);
      await expect(gps(out.buffer)).resolves.toBeUndefined();
      // `true`: every segment exifr knows (TIFF/EXIF, GPS, XMP, ICC, IPTC …) — none is left.
      await expect(parse(out.buffer, true)).resolves.toBeUndefined();
      const meta = await sharp(out.buffer).metadata();
      expect(meta.exif).toBeUndefined();
      expect(meta.orientation).toBeUndefined();
    }
    // 40 × 20 with Orientation 6 is a portrait photo: 20 × 40, the left (red) half now on top.
    expect(full).toMatchObject({ width: 20, height: 40 });
    expect(thumb).toMatchObject({ width: 20, height: 40 });
    expect(await dominantAt(full.buffer, 10, 5)).toBe('red');
    expect(await dominantAt(full.buffer, 10, 35)).toBe('blue');
  });

  it('caps the photo at its longest side and makes a smaller thumbnail, keeping the proportions', async () => {
    const big = await sharp({ create: { width: 3000, height: 1500, channels: 3, background: RED } }).jpeg().toBuffer();
    const { full, thumb } = await processPhoto(big);
    expect(full).toMatchObject({ width: PHOTO_FULL_MAX_SIDE, height: PHOTO_FULL_MAX_SIDE / 2 });
    expect(thumb).toMatchObject({ width: PHOTO_THUMB_MAX_SIDE, height: PHOTO_THUMB_MAX_SIDE / 2 });
    expect(await sharp(thumb.buffer).metadata()).toMatchObject({ format: 'jpeg', width: PHOTO_THUMB_MAX_SIDE });
  });

  it('turns a PNG and a WebP into JPEGs, a transparent background into white', async () => {
    for (const format of ['png', 'webp'] as const) {
      const { full } = await processPhoto(await solidImage(format));
      expect(full).toMatchObject({ width: 30, height: 20, mime: 'image/jpeg' });
      await expect(detectFileType(full.buffer)).resolves.toEqual({ mime: 'image/jpeg', ext: 'jpg' });
    }
    const clear = await sharp({ create: { width: 10, height: 10, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } } }).png().toBuffer();
    const { data } = await sharp((await processPhoto(clear)).full.buffer).raw().toBuffer({ resolveWithObject: true });
    expect(Math.min(...data)).toBeGreaterThan(245);
  });

  it('refuses a decompression bomb by its declared size, before decoding it', async () => {
    const bomb = pngBomb();
    expect(bomb.length).toBeLessThan(1000);
    // It is a genuine PNG by content, so the content check alone would let it through.
    await expect(checkPhotoFile(bomb, 'bomb.png')).resolves.toEqual({ mime: 'image/png', ext: 'png' });
    await expect(processPhoto(bomb, 'bomb.png')).rejects.toMatchObject({
      status: 413,
      code: 'image_too_large',
      message: expect.stringMatching(/^bomb\.png is 50000 × 50000 pixels/),
    });
  });

  it('refuses a damaged JPEG with a 415 naming the file', async () => {
    const whole = await sharp({ create: { width: 200, height: 200, channels: 3, background: BLUE } }).jpeg().toBuffer();
    const cut = whole.subarray(0, Math.floor(whole.length / 2));
    await expect(processPhoto(cut, 'side.jpg')).rejects.toMatchObject({
      status: 415,
      code: 'unsupported_file',
      message: expect.stringContaining('side.jpg could not be read'),
    });
  });
});

describe('checkPhotoFile', () => {
  it('accepts JPEG, PNG and WebP by their content whatever the name says', async () => {
    await expect(checkPhotoFile(await jpegWithGpsAndOrientation(), 'front.png')).resolves.toEqual({ mime: 'image/jpeg', ext: 'jpg' });
    await expect(checkPhotoFile(await solidImage('png'), 'back.jpg')).resolves.toEqual({ mime: 'image/png', ext: 'png' });
    await expect(checkPhotoFile(await solidImage('webp'), 'detail')).resolves.toEqual({ mime: 'image/webp', ext: 'webp' });
  });

  it('refuses a text file named .jpg, naming the file and what it is', async () => {
    const text = Buffer.from('Front view of the toile, size 14.\nSee the notes.\n', 'utf8');
    await expect(checkPhotoFile(text, 'fit-front.jpg')).rejects.toMatchObject({
      status: 415,
      code: 'unsupported_file',
      message: 'fit-front.jpg is not a JPEG, PNG or WebP photo (it is plain text).',
    });
  });

  it('refuses a PDF, an empty file and bytes of no known type', async () => {
    await expect(checkPhotoFile(tinyPdf(), 'side.jpg')).rejects.toMatchObject({ status: 415, message: 'side.jpg is not a JPEG, PNG or WebP photo (it looks like a PDF).' });
    await expect(checkPhotoFile(Buffer.alloc(0), 'back.jpg')).rejects.toMatchObject({ status: 415, message: 'back.jpg is empty.' });
    const noise = Buffer.from([0x00, 0xfe, 0x13, 0x37, 0x00, 0x9c, 0xff, 0x01, 0x80, 0x00, 0x7f, 0xee]);
    await expect(checkPhotoFile(noise, 'x.webp')).rejects.toMatchObject({ status: 415, message: expect.stringContaining('matches no file type we know') });
  });
});

describe('checkDraftFile', () => {
  it('accepts a real PDF whatever its name', async () => {
    // The fixture is well formed: startxref and every xref entry point at what they name.
    const pdf = tinyPdf().toString('latin1');
    const xrefAt = Number(/startxref\n(\d+)/.exec(pdf)?.[1]);
    expect(pdf.startsWith('xref\n', xrefAt)).toBe(true);
    const entries = [...pdf.matchAll(/^(\d{10}) 00000 n $/gm)].map((m) => Number(m[1]));
    expect(entries).toHaveLength(3);
    entries.forEach((offset, i) => expect(pdf.startsWith(`${i + 1} 0 obj\n`, offset)).toBe(true));

    await expect(checkDraftFile(tinyPdf(), 'draft-a4.pdf')).resolves.toEqual({ mime: 'application/pdf', ext: 'pdf' });
    await expect(checkDraftFile(tinyPdf(), 'draft-a0')).resolves.toEqual({ mime: 'application/pdf', ext: 'pdf' });
  });

  it('refuses a PNG named .pdf, saying what it looks like', async () => {
    await expect(checkDraftFile(await solidImage('png'), 'draft-a4.pdf')).rejects.toMatchObject({
      status: 415,
      code: 'unsupported_file',
      message: 'draft-a4.pdf is not a PDF (it looks like a PNG image).',
    });
  });

  it('refuses a text file named .pdf', async () => {
    await expect(checkDraftFile(Buffer.from('PDF coming soon\n'), 'instructions.pdf')).rejects.toMatchObject({
      status: 415,
      message: 'instructions.pdf is not a PDF (it is plain text).',
    });
  });
});
