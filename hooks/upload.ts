import { api } from './api';

/** A picked photo: a File on the web (the native apps have no picker wired yet). */
export type UploadFile = Blob & { name: string };

export type UploadOptions = {
  /** Called with the share sent so far, 0 … 1 (where the platform can tell). */
  onProgress?: (fraction: number) => void;
  signal?: AbortSignal;
};

/**
 * Native fallback: the same request through the one fetch wrapper, without progress (React
 * Native's fetch has none); the screen shows an indeterminate "Uploading…". The web build uses
 * upload.web.ts.
 */
export function uploadForm<T>(path: string, form: FormData, _options: UploadOptions = {}): Promise<T> {
  return api<T>(path, { method: 'POST', form });
}
