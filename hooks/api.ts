/**
 * The one way the app talks to the API: same-origin JSON (the session cookie rides along),
 * and every non-2xx answer turned into an ApiError carrying the server's code and per-field
 * messages.
 */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
    /** The whole answer, for the few callers that read more than the error (a 409 carries the current record). */
    readonly body?: unknown,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

type Options = {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  /** Sent as JSON. */
  body?: unknown;
  /** Sent as it is, e.g. a CSV file's text, with its own content type. */
  text?: { content: string; type: string };
  /** Sent as multipart form data (file uploads); the browser sets the boundary. */
  form?: FormData;
  /** Lets the request outlive the page (sent while the tab is hidden or closed). */
  keepalive?: boolean;
};

export async function api<T>(path: string, { method = 'GET', body, text, form, keepalive }: Options = {}): Promise<T> {
  let res: Response;
  try {
    res = await fetch(path, {
      method,
      credentials: 'same-origin',
      headers: {
        Accept: 'application/json',
        ...(form ? {} : text ? { 'Content-Type': text.type } : body !== undefined ? { 'Content-Type': 'application/json' } : {}),
      },
      body: form ?? (text ? text.content : body === undefined ? undefined : JSON.stringify(body)),
      ...(keepalive ? { keepalive: true } : {}),
    });
  } catch {
    throw new ApiError(0, 'offline', 'Basted cannot be reached. Check your connection and try again.');
  }
  if (res.status === 204) return undefined as T;
  const data = await res.json().catch(() => null);
  if (!res.ok) {
    const error = (data as { error?: { code?: string; message?: string; fields?: Record<string, string> } } | null)?.error;
    throw new ApiError(res.status, error?.code ?? 'error', error?.message ?? `The server answered ${res.status}.`, error?.fields, data);
  }
  return data as T;
}

/** SWR's fetcher: keys are API paths. */
export const fetcher = <T>(path: string) => api<T>(path);
