import type { IncomingMessage, ServerResponse } from 'node:http';
import pino, { type DestinationStream, type Logger } from 'pino';
import { pinoHttp } from 'pino-http';

export type { Logger };

/** Path parts that are themselves secrets: the invitation and opt-out links carry their token there. */
const SECRET_SEGMENT_AFTER = new Set(['invitations', 'opt-out']);
/** Query parameters that carry secrets or the address a link leads to. */
const SECRET_QUERY = /^(token|code|sig|signature|key|next|x-amz-.*)$/i;

/**
 * The URL as it may appear in a log: the token segment of an invitation or opt-out link and any
 * secret query parameter (a reset or confirmation token) replaced by "[redacted]".
 */
export function redactUrl(url: string): string {
  const [path, query] = url.split('?', 2) as [string, string | undefined];
  const segments = path.split('/');
  const cleanPath = segments.map((s, i) => (i > 0 && SECRET_SEGMENT_AFTER.has(segments[i - 1]!) && s ? '[redacted]' : s)).join('/');
  if (query === undefined) return cleanPath;
  const params = query.split('&').map((pair) => {
    const [name] = pair.split('=', 1) as [string];
    return SECRET_QUERY.test(decodeURIComponentSafe(name)) ? `${name}=[redacted]` : pair;
  });
  return `${cleanPath}?${params.join('&')}`;
}

function decodeURIComponentSafe(value: string): string {
  try {
    return decodeURIComponent(value);
  } catch {
    return value;
  }
}

/**
 * What an error may say in a log: its kind, the database's error code and where it arose, and the
 * first words of its message — never the SQL or its parameters (a whole report, a password hash),
 * which Sequelize attaches to its errors.
 */
export function describeError(err: unknown): Record<string, unknown> {
  if (!(err instanceof Error)) return { message: String(err).slice(0, 200) };
  const original = (err as { original?: Record<string, unknown> }).original ?? (err as { parent?: Record<string, unknown> }).parent;
  return {
    type: err.name,
    message: err.message.slice(0, 200),
    ...(original
      ? {
          code: original.code,
          table: original.table,
          column: original.column,
          constraint: original.constraint,
          routine: original.routine,
        }
      : {}),
    stack: err.stack?.split('\n').slice(1, 6).join('\n'),
  };
}

/** One JSON line per event; `destination` lets tests read what would be written. */
export function createLogger(options: { level?: string; destination?: DestinationStream } = {}): Logger {
  return pino({ level: options.level ?? 'info', base: undefined }, options.destination);
}

/** The request log: method, redacted URL, status, time — no headers, so no cookie or token. */
export function requestLogger(logger: Logger) {
  return pinoHttp({
    logger,
    quietReqLogger: true,
    serializers: {
      req: (req: IncomingMessage & { originalUrl?: string }) => ({ method: req.method, url: redactUrl(req.originalUrl ?? req.url ?? '') }),
      res: (res: ServerResponse) => ({ statusCode: res.statusCode }),
      err: describeError,
    },
    customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info'),
  });
}
