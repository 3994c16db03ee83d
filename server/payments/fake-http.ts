// Small pieces of the local payment stand-in's HTTP side: its error answer (the shape the SDK reads
// back as a typed error), reading a body, answering JSON or a page, and its ids.
import { randomBytes } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';

export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly code: string,
    readonly param?: string,
  ) {
    super(message);
  }
}

export const newId = (prefix: string) => `${prefix}_${randomBytes(12).toString('hex')}`;
export const nowSeconds = () => Math.floor(Date.now() / 1000);

export function readBody(req: IncomingMessage, limit = 256 * 1024): Promise<string> {
  return new Promise((resolve, reject) => {
    let size = 0;
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => {
      size += c.length;
      if (size > limit) reject(new ApiError(413, 'Request too large.', 'too_large'));
      else chunks.push(c);
    });
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
    req.on('error', reject);
  });
}

export function sendJson(res: ServerResponse, status: number, body: unknown): void {
  res.writeHead(status, { 'content-type': 'application/json', 'request-id': newId('req') });
  res.end(JSON.stringify(body));
}

export function sendHtml(res: ServerResponse, status: number, html: string): void {
  res.writeHead(status, {
    'content-type': 'text/html; charset=utf-8',
    'cache-control': 'no-store',
  });
  res.end(html);
}

export function positiveInt(text: string | undefined, param: string): number {
  if (text === undefined || !/^\d{1,12}$/.test(text) || Number(text) <= 0) {
    throw new ApiError(
      400,
      `Invalid positive integer: ${param}`,
      'parameter_invalid_integer',
      param,
    );
  }
  return Number(text);
}
