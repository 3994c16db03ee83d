// Text checks every schema builds on. Each one refuses an over-long value before any pattern looks
// at it: zod runs a string's later checks even after its length check failed, unless that check
// aborts, and a pattern over a megabyte of text can hold the server's only thread for seconds.
import * as z from './zod';

/** A length limit that stops the checks after it when it fails. */
export function atMost(max: number, message = `at most ${max} characters`) {
  return { message, abort: true };
}

/** Carriage returns and line feeds (and the other line separators) end a single-line value. */
const LINE_BREAK = /[\r\n\u2028\u2029\u0085]/;

export function hasLineBreak(text: string): boolean {
  return LINE_BREAK.test(text);
}

/** A one-line text (a name, a title): trimmed, at most `max` characters, no line breaks. */
export function singleLine(max: number, notText?: string) {
  return z.string(notText ? { error: notText } : undefined).check(
    z.trim(),
    z.maxLength(max, atMost(max)),
    z.refine((v) => !hasLineBreak(v), 'must be one line (no line breaks)'),
  );
}

// RFC 5321 §4.5.3.1.3: a path holds at most 256 octets, so an address at most 254 characters.
export const MAX_EMAIL_LENGTH = 254;

// One plain address, local@domain: letters, digits and . _ % + ' - before the @, a dotted domain
// with a top-level part of letters after it. Deliberately narrower than RFC 5322 (no display
// names, quotes, comments or lists): what a mail header must carry for exactly one recipient.
// The pattern has no nested repetition, so its run time grows linearly with the (bounded) length.
const ONE_ADDRESS =
  /^[a-z0-9_%+'-]+(?:\.[a-z0-9_%+'-]+)*@[a-z0-9](?:[a-z0-9-]*[a-z0-9])?(?:\.[a-z0-9](?:[a-z0-9-]*[a-z0-9])?)*\.[a-z]{2,63}$/i;

/** True when the text is exactly one plain e-mail address (no name, list or brackets). */
export function isOneEmailAddress(text: string): boolean {
  return text.length <= MAX_EMAIL_LENGTH && ONE_ADDRESS.test(text);
}

/** One e-mail address, trimmed and lower-cased; the length is checked before the pattern. */
export function emailAddress(max: number = MAX_EMAIL_LENGTH) {
  return z
    .string({ error: 'must be an e-mail address' })
    .check(
      z.trim(),
      z.toLowerCase(),
      z.maxLength(max, atMost(max)),
      z.refine(isOneEmailAddress, 'is not one e-mail address (like orders@example.test)'),
    );
}
