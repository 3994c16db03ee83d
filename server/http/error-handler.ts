import type { ErrorRequestHandler } from 'express';
import { AppError, ServiceUnavailable } from '../errors';
import { logger } from '../logger';
import { isConnectionLost, isOutOfRangeValue, isUnstorableText } from '../db/pg-errors';

function isDatabaseDown(err: unknown): boolean {
  if (typeof err !== 'object' || err === null) return false;
  const e = err as { code?: string; name?: string; message?: string };
  if (isConnectionLost(err)) return true;
  if (e.name === 'KnexTimeoutError') return true;
  const m = e.message ?? '';
  return /Connection terminated|connect ECONNREFUSED|timeout exceeded when trying to connect|^timeout expired$|Client has encountered a connection error/i.test(
    m,
  );
}

/**
 * Waiting too long for a pooled connection: the database may be unreachable, or merely busy with a
 * burst of requests. Either way the caller gets a quick 503 rather than a hung request.
 */
function isPoolTimeout(err: unknown): boolean {
  if (typeof err !== 'object' || err === null) return false;
  const e = err as { name?: string; message?: string };
  return (
    e.name === 'KnexTimeoutError' ||
    /timeout exceeded when trying to connect/i.test(e.message ?? '')
  );
}

/**
 * A compressed body that does not decompress (gzip, deflate or br): zlib's codes are Z_* and
 * brotli's ERR_*; body-parser marks them as the client's fault (status 400).
 */
export function isUndecodableBody(err: unknown): boolean {
  const e = err as { status?: number; code?: unknown; errno?: unknown } | null;
  return (
    e?.status === 400 &&
    typeof e.errno === 'number' &&
    typeof e.code === 'string' &&
    /^(Z_|ERR_)/.test(e.code)
  );
}

/** Maps Express and library errors onto our error model. */
function toAppError(err: unknown): AppError {
  if (err instanceof AppError) return err;
  const e = err as {
    type?: string;
    status?: number;
    code?: string;
    message?: string;
    field?: string;
  };
  if (e?.type === 'entity.too.large')
    return new AppError(413, 'too_large', 'The request body is too large.');
  if (e?.type === 'entity.parse.failed')
    return new AppError(400, 'invalid_json', 'The request body is not valid JSON.');
  if (e?.type === 'charset.unsupported' || e?.type === 'encoding.unsupported')
    return new AppError(415, 'unsupported_type', 'Send JSON in UTF-8.');
  if (isUndecodableBody(err))
    return new AppError(
      400,
      'invalid_body',
      'The request body could not be decompressed: it does not match its Content-Encoding.',
    );
  if (e?.code === 'LIMIT_FILE_SIZE')
    return new AppError(413, 'too_large', 'The file is larger than the limit for this upload.');
  if (typeof e?.code === 'string' && e.code.startsWith('LIMIT_'))
    return new AppError(
      400,
      'invalid_upload',
      `Upload refused: ${e.message ?? e.code}.`,
      e.field ? [{ field: e.field, message: e.message ?? '' }] : [],
    );
  // A request body busboy could not read (a malformed multipart header, a cut-off form). multer
  // marks every error of the upload it aborted with storageErrors; disk errors carry an errno code.
  if (Array.isArray((err as { storageErrors?: unknown } | null)?.storageErrors) && !e?.code) {
    const why = e.message ?? 'malformed form data';
    return new AppError(400, 'invalid_upload', `The upload could not be read: ${why}.`);
  }
  // Text PostgreSQL cannot store (the NUL character): the whole change is rolled back.
  if (isUnstorableText(err)) {
    return new AppError(
      400,
      'invalid_text',
      'The request contains a character that cannot be stored (such as \\u0000); remove it and try again.',
    );
  }
  // A value the column cannot hold (a day like 2027-02-30, a number past the column's range) that
  // slipped past a schema: the change is rolled back and the caller told, not a 500.
  if (isOutOfRangeValue(err)) {
    return new AppError(
      400,
      'invalid_value',
      'A value is out of range or not a real date (in the request or the shop settings); nothing was changed.',
    );
  }
  if (isPoolTimeout(err)) {
    return new ServiceUnavailable(
      'The server is busy or the database is slow to answer. Try again in a moment.',
    );
  }
  if (isDatabaseDown(err)) return new ServiceUnavailable();
  if (e?.status === 404) return new AppError(404, 'not_found', 'Not found.');
  return new AppError(500, 'internal', 'Something went wrong on the server. It has been logged.');
}

export const errorHandler: ErrorRequestHandler = (err, req, res, next) => {
  const appError = toAppError(err);
  if (appError.status >= 500) {
    (req.log ?? logger).error({ err }, 'request failed');
  } else if (isUndecodableBody(err)) {
    // Bad input, not a server fault: a warning with the reason, no stack (ASVS 4.0.3 V7.4.1).
    (req.log ?? logger).warn(
      { code: (err as { code: string }).code, encoding: req.headers['content-encoding'] },
      'request body could not be decompressed',
    );
  }
  // Part of the answer is already out (a streamed export): Express's own handler cuts the
  // connection, so the client sees a failed download rather than waiting forever.
  if (res.headersSent) return next(err);
  const retryAfter = (appError as { retryAfterSeconds?: number }).retryAfterSeconds;
  if (retryAfter !== undefined) res.setHeader('Retry-After', String(retryAfter));
  else if (appError.status === 503) res.setHeader('Retry-After', '2');
  res.status(appError.status).json({
    error: {
      code: appError.code,
      message: appError.message,
      details: appError.details,
      ...appError.extra,
    },
  });
};
