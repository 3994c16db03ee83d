// The one way this codebase reaches zod: its tree-shakable build (`zod/mini`), so the client's
// bundles carry only the parts the contracts use. Mini sets no wording of its own, so English is
// set here once, before any schema runs; without it a failed check would say only "Invalid input".
// Every file takes zod from here: `import * as z from '../zod'` (types: `import type * as z`).
import * as z from 'zod/mini';
import { en } from 'zod/locales';

z.config(en());

export * from 'zod/mini';

/**
 * Refuses the value inside a `z.transform`, with the reason: `return z.refuse(ctx, 'why')`. Mini's
 * transform gets the parse payload itself, which has no `addIssue`; the issue is the one zod's own
 * `addIssue` would record.
 */
export function refuse(payload: z.core.ParsePayload, message: string): never {
  payload.issues.push({ code: 'custom', message, input: payload.value });
  return z.NEVER;
}
