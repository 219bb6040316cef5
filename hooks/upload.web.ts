import { ApiError } from './api';
import type { UploadOptions } from './upload';

export type { UploadFile, UploadOptions } from './upload';

function errorFrom(status: number, text: string): ApiError {
  let error: { code?: string; message?: string; fields?: Record<string, string> } | undefined;
  try {
    error = (JSON.parse(text) as { error?: typeof error }).error;
  } catch {
    // A proxy's HTML page or nothing at all: fall back to the status below.
  }
  if (!error && status === 413) return new ApiError(413, 'file_too_large', 'The file is too large.');
  return new ApiError(status, error?.code ?? 'error', error?.message ?? `The server answered ${status}.`, error?.fields);
}

/**
 * Sends a multipart form with XMLHttpRequest, because fetch reports no upload progress. Answers
 * as api() does: the parsed JSON on 2xx, an ApiError with the server's code, message and fields
 * otherwise. The session cookie rides along (same origin).
 */
export function uploadForm<T>(path: string, form: FormData, { onProgress, signal }: UploadOptions = {}): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', path);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable && event.total > 0) onProgress?.(event.loaded / event.total);
    };
    xhr.onload = () => {
      if (xhr.status >= 200 && xhr.status < 300) {
        try {
          resolve(JSON.parse(xhr.responseText) as T);
        } catch {
          reject(new ApiError(xhr.status, 'bad_response', 'The server’s answer could not be read.'));
        }
        return;
      }
      reject(errorFrom(xhr.status, xhr.responseText));
    };
    // A server that refuses early (e.g. too large) may close the connection mid-upload: the
    // browser then reports a network error with no answer to read.
    xhr.onerror = () => reject(new ApiError(0, 'offline', 'The upload did not reach Basted. Check your connection and try again.'));
    xhr.onabort = () => reject(new ApiError(0, 'aborted', 'The upload was stopped.'));
    signal?.addEventListener('abort', () => xhr.abort());
    xhr.send(form);
  });
}
