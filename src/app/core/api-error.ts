import { HttpErrorResponse } from '@angular/common/http';
import type { ErrorBody, ErrorDetail } from '../../../shared/api/common';

/** The server's error body, when the failure carried one. */
export function apiErrorBody(error: unknown): ErrorBody | null {
  if (!(error instanceof HttpErrorResponse)) return null;
  const body: unknown = error.error;
  if (typeof body !== 'object' || body === null || !('error' in body)) return null;
  const inner: unknown = body.error;
  if (typeof inner !== 'object' || inner === null) return null;
  const { code, message, details } = inner as Record<string, unknown>;
  if (typeof message !== 'string') return null;
  return {
    error: {
      code: typeof code === 'string' ? code : 'unknown',
      message,
      details: Array.isArray(details) ? details.filter(isDetail) : [],
    },
  };
}

/**
 * Words for a field path, for a person: "lines.0.quantity" reads "Quantity on line 1". A form may
 * name its own fields (keys are paths with each index written as "*": "lines.*.quantity").
 */
export function fieldLabel(path: string, labels: Readonly<Record<string, string>> = {}): string {
  const parts = path.split('.');
  const pattern = parts.map((p) => (/^\d+$/.test(p) ? '*' : p)).join('.');
  const index = [...parts].reverse().find((p) => /^\d+$/.test(p));
  const lineNo = index === undefined ? '' : ` on line ${Number(index) + 1}`;
  const own = labels[path] ?? labels[pattern];
  if (own) return labels[path] ? own : own + lineNo;
  const name = [...parts].reverse().find((p) => !/^\d+$/.test(p));
  if (!name) return index === undefined ? '' : `Line ${Number(index) + 1}`;
  return words(name) + lineNo;
}

/** "maxCutPerPass" → "Max cut per pass"; "customer_email" → "Customer email". */
function words(name: string): string {
  const spaced = name
    .replace(/[_-]+/g, ' ')
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .toLowerCase()
    .trim();
  return spaced.charAt(0).toUpperCase() + spaced.slice(1);
}

/**
 * One detail as a sentence: the field's name in words, then the reason once ("Quantity on line 1
 * must be at least 1."). A reason written as a whole sentence keeps its own capital after a colon.
 */
export function detailSentence(
  detail: ErrorDetail,
  labels: Readonly<Record<string, string>> = {},
): string {
  const message = detail.message.trim();
  const sentence = /[.!?]$/.test(message) ? message : `${message}.`;
  const where = detail.field
    ? fieldLabel(detail.field, labels)
    : detail.line !== undefined
      ? `Line ${detail.line}`
      : '';
  if (!where) return sentence;
  return /^[a-z]/.test(sentence) ? `${where} ${sentence}` : `${where}: ${sentence}`;
}

/**
 * The server's summary, unless it only repeats its first detail with the raw path ("lines.0.quantity:
 * must be at least 1"), which the details already say in words.
 */
function ownSummary(body: ErrorBody): string {
  const { message, details = [] } = body.error;
  const first = details[0];
  const repeats = details.some((d) => {
    const text = d.message.trim().replace(/[.!?]$/, '');
    return text.length > 0 && message.includes(text) && (!d.field || message.includes(d.field));
  });
  if (first && repeats) return '';
  return message;
}

/**
 * A sentence a person can act on, from any failed request: the server's own message with its
 * details in words, each said once ("Check the form. E-mail: Already in use."), or a plain account
 * of what went wrong.
 */
export function apiErrorMessage(
  error: unknown,
  labels: Readonly<Record<string, string>> = {},
): string {
  const body = apiErrorBody(error);
  if (body) {
    const details = [...new Set((body.error.details ?? []).map((d) => detailSentence(d, labels)))];
    return [ownSummary(body), ...details].filter(Boolean).join(' ');
  }
  if (error instanceof HttpErrorResponse) {
    if (error.status === 0) {
      return 'The server could not be reached. Check the connection and try again.';
    }
    if (error.status >= 500) {
      return `The server could not finish this (error ${error.status}). Try again in a moment.`;
    }
    return `The request was refused (error ${error.status}${error.statusText ? ` ${error.statusText}` : ''}).`;
  }
  if (error instanceof Error && error.message) {
    return error.message;
  }
  return 'Something went wrong. Try again.';
}

/** The server's messages per form field, for showing each one under its own input. */
export function apiFieldErrors(error: unknown): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const detail of apiErrorBody(error)?.error.details ?? []) {
    if (detail.field && !(detail.field in fields)) {
      fields[detail.field] = sentenceOf(detail.message);
    }
  }
  return fields;
}

/** A field's reason as it reads under the field: capitalised, with a full stop. */
function sentenceOf(message: string): string {
  const text = message.trim();
  const ended = /[.!?]$/.test(text) ? text : `${text}.`;
  return ended.charAt(0).toUpperCase() + ended.slice(1);
}

/**
 * What is left to say above a form once its field errors sit under their fields: the server's own
 * summary when it says more than the details, plus every detail no field of the form shows.
 */
export function apiUnplacedMessage(
  error: unknown,
  placed: (field: string) => boolean,
  labels: Readonly<Record<string, string>> = {},
): string {
  const body = apiErrorBody(error);
  if (!body) return apiErrorMessage(error, labels);
  const details = body.error.details ?? [];
  const rest = details.filter((d) => !d.field || !placed(d.field));
  if (details.length > 0 && rest.length === 0) {
    const summary = ownSummary(body);
    return summary && !details.some((d) => d.field && summary.includes(d.field))
      ? summary
      : 'Check the marked fields.';
  }
  const sentences = [...new Set(rest.map((d) => detailSentence(d, labels)))];
  return [ownSummary(body), ...sentences].filter(Boolean).join(' ');
}

function isDetail(value: unknown): value is ErrorDetail {
  return (
    typeof value === 'object' &&
    value !== null &&
    typeof (value as { message?: unknown }).message === 'string'
  );
}
