import { HttpErrorResponse } from '@angular/common/http';

/** One problem the server found in a request: a form field or a line of an uploaded file. */
export interface ApiErrorDetail {
  field?: string;
  line?: number;
  message: string;
}

/** The error body every /api route answers with. */
export interface ApiErrorBody {
  error: { code: string; message: string; details?: ApiErrorDetail[] };
}

/** The server's error body, when the failure carried one. */
export function apiErrorBody(error: unknown): ApiErrorBody | null {
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
 * A sentence a person can act on, from any failed request: the server's own message with its
 * details ("Check the form. email: Already in use."), or a plain account of what went wrong.
 */
export function apiErrorMessage(error: unknown): string {
  const body = apiErrorBody(error);
  if (body) {
    const details = (body.error.details ?? []).map(describeDetail);
    return [body.error.message, ...details].join(' ');
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
      fields[detail.field] = detail.message;
    }
  }
  return fields;
}

function describeDetail(detail: ApiErrorDetail): string {
  const where = detail.field ?? (detail.line !== undefined ? `Line ${detail.line}` : '');
  const sentence = /[.!?]$/.test(detail.message) ? detail.message : `${detail.message}.`;
  return where ? `${where}: ${sentence}` : sentence;
}

function isDetail(value: unknown): value is ApiErrorDetail {
  return (
    typeof value === 'object' &&
    value !== null &&
    typeof (value as { message?: unknown }).message === 'string'
  );
}
