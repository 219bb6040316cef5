import { AppError } from '../errors';

/**
 * Upload limits, enforced by multer in the routes that accept files (multer keeps each file in
 * memory, so the limit also bounds what one request can make the server hold).
 * Drafts: a pattern PDF carrying every size, layers and large-format (A0 / copy-shop) sheets runs
 * to tens of megabytes; 40 MB leaves room for that without letting one upload hold much memory.
 */
export const DRAFT_MAX_BYTES = 40 * 1024 * 1024;
/**
 * Photos: a phone photo is typically a few megabytes; 15 MB admits high-resolution ones. The photo
 * is re-encoded to a much smaller JPEG before it is stored (photo-pipeline.ts).
 */
export const PHOTO_MAX_BYTES = 15 * 1024 * 1024;

export type DetectedType = { mime: string; ext: string };

type FileTypeModule = typeof import('file-type');

let fileTypeModule: Promise<FileTypeModule> | undefined;

/**
 * file-type is ESM-only. Under jest 29 (babel-jest turning our modules into CommonJS) neither a
 * plain `import()` nor one hidden in `new Function('s', 'return import(s)')` works: both reach a vm
 * script without a dynamic-import callback ("A dynamic import callback was invoked without
 * --experimental-vm-modules"), and jest's own `require` / `createRequire` cannot resolve the
 * package (its exports offer only the `import` / `module-sync` conditions). Node's real `require`
 * can: since Node 20.19 (our engines floor) it loads ES modules synchronously. We reach it through
 * `process.getBuiltinModule`, which jest does not intercept, so the same code path runs under tsx in
 * the server and under jest. The package is stateless, so loading it outside jest's module
 * registry loses nothing.
 */
function loadFileType(): Promise<FileTypeModule> {
  fileTypeModule ??= Promise.resolve().then(() => {
    const { createRequire } = process.getBuiltinModule('node:module');
    // __filename: the server runs as CommonJS (tsx, no "type": "module" in package.json).
    return createRequire(__filename)('file-type') as FileTypeModule;
  });
  return fileTypeModule;
}

/** The file's type judged by its content (signature bytes), never by its name; null when unknown. */
export async function detectFileType(buffer: Uint8Array): Promise<DetectedType | null> {
  const { fileTypeFromBuffer } = await loadFileType();
  const found = await fileTypeFromBuffer(buffer);
  return found ? { mime: found.mime, ext: found.ext } : null;
}

const PDF: readonly string[] = ['application/pdf'];
const PHOTO: readonly string[] = ['image/jpeg', 'image/png', 'image/webp'];

/**
 * Accepts a draft file only when its content is a PDF (file-type looks for the "%PDF" header that
 * ISO 32000 puts at the start of every PDF). The declared type and the name are not trusted.
 */
export async function checkDraftFile(buffer: Uint8Array, name: string): Promise<DetectedType> {
  return accept(buffer, name, PDF, 'a PDF');
}

/**
 * Accepts a photo only when its content is JPEG, PNG or WebP — the formats every browser shows and
 * sharp decodes; anything else is refused before it reaches the image decoder.
 */
export async function checkPhotoFile(buffer: Uint8Array, name: string): Promise<DetectedType> {
  return accept(buffer, name, PHOTO, 'a JPEG, PNG or WebP photo');
}

async function accept(buffer: Uint8Array, name: string, allowed: readonly string[], wanted: string): Promise<DetectedType> {
  const label = displayName(name);
  if (buffer.length === 0) throw unsupported(`${label} is empty.`);
  const found = await detectFileType(buffer);
  if (found && allowed.includes(found.mime)) return found;
  const what = found ? `it looks like ${describe(found)}` : looksLikeText(buffer) ? 'it is plain text' : 'its content matches no file type we know';
  throw unsupported(`${label} is not ${wanted} (${what}).`);
}

function unsupported(message: string) {
  return new AppError(415, 'unsupported_file', message);
}

/** The uploader's file name as it appears in a message: control characters dropped, kept short. */
export function displayName(name: string): string {
  const clean = name.replace(/[\u0000-\u001f\u007f]/g, '').trim();
  if (!clean) return 'The file';
  return clean.length > 120 ? `${clean.slice(0, 117)}…` : clean;
}

const KNOWN: Record<string, string> = {
  'application/pdf': 'a PDF',
  'image/jpeg': 'a JPEG image',
  'image/png': 'a PNG image',
  'image/webp': 'a WebP image',
  'image/gif': 'a GIF image',
  'image/tiff': 'a TIFF image',
  'image/avif': 'an AVIF image',
  // iPhones store photos as HEIC; saying so tells the tester what to change (export as JPEG).
  'image/heic': 'a HEIC image — save it as JPEG first',
  'image/heif': 'a HEIF image — save it as JPEG first',
  'application/zip': 'a ZIP archive',
};

function describe(found: DetectedType): string {
  return KNOWN[found.mime] ?? `a ${found.ext.toUpperCase()} file (${found.mime})`;
}

/**
 * file-type recognises binary signatures only, so text gets no verdict from it. We call a file
 * plain text when its first few kilobytes are valid UTF-8 (ASCII included) without control
 * characters other than tab, line feed, form feed and carriage return.
 */
function looksLikeText(buffer: Uint8Array): boolean {
  const sample = buffer.subarray(0, 4096);
  const decoder = new TextDecoder('utf-8', { fatal: true });
  // The sample may end inside a multi-byte character: allow up to three bytes cut off at the end.
  for (let cut = 0; cut <= 3 && cut < sample.length; cut += 1) {
    try {
      const text = decoder.decode(sample.subarray(0, sample.length - cut));
      return !/[\u0000-\u0008\u000b\u000e-\u001f\u007f]/.test(text);
    } catch {
      // not valid UTF-8 up to here; try a shorter sample
    }
  }
  return false;
}
