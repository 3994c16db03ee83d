// Uploads are refused by their declared size before a byte of the body is read: a 413 for a
// 60 MB photo costs nothing, where letting multer read up to its per-file limit first held 20 MB
// of memory per refused request. A body without a Content-Length (chunked) still meets multer's
// own limits while it streams.
import type { RequestHandler } from 'express';
import { PayloadTooLarge } from '../errors';

export function refuseLargerThan(maxBytes: number, what: string): RequestHandler {
  return (req, res, next) => {
    const declared = Number(req.headers['content-length']);
    if (Number.isFinite(declared) && declared > maxBytes) {
      // The rest of the body is not read: the connection closes after the answer.
      res.setHeader('Connection', 'close');
      req.on('error', () => undefined);
      next(
        new PayloadTooLarge(
          `${what} is larger than the limit of ${Math.floor(maxBytes / (1024 * 1024))} MB.`,
        ),
      );
      return;
    }
    next();
  };
}
