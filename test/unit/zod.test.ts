// shared/zod.ts: the tree-shakable build must answer in the same words and with the same issues as
// zod's full ("classic") build of the same package, which the contracts used before. The classic
// build is the outside reference here; it is loaded only after the first check, because building
// any classic schema sets English for the whole process and would hide a missing locale.
import * as z from '../../shared/zod';

function issues(result: { success: boolean; error?: { issues: unknown[] } }) {
  return (result.error?.issues ?? []).map((i) => {
    const { code, path, message } = i as { code: string; path: unknown[]; message: string };
    return { code, path, message };
  });
}

describe('shared/zod', () => {
  it('when a check without its own message fails, then the message is English, not "Invalid input"', () => {
    const mini = issues(
      z.object({ name: z.string().check(z.maxLength(3)) }).safeParse({ name: 'abcd' }),
    );
    // Loaded here, after the mini check ran without it (see the comment at the top).
    // eslint-disable-next-line @typescript-eslint/no-require-imports
    const classic = require('zod') as typeof import('zod');
    const full = issues(
      classic.object({ name: classic.string().max(3) }).safeParse({ name: 'abcd' }),
    );
    expect(mini).toEqual(full);
    expect(mini[0]?.message).not.toBe('Invalid input');
  });

  it('when a transform refuses, then the issue is the one classic ctx.addIssue records', () => {
    const even = z.pipe(
      z.number(),
      z.transform((n, ctx) => (n % 2 === 0 ? n / 2 : z.refuse(ctx, 'must be even'))),
    );
    // eslint-disable-next-line @typescript-eslint/no-require-imports
    const classic = require('zod') as typeof import('zod');
    const reference = classic.number().transform((n, ctx) => {
      if (n % 2 === 0) return n / 2;
      ctx.addIssue({ code: 'custom', message: 'must be even' });
      return classic.NEVER;
    });
    const mini = z.object({ lines: z.array(z.object({ n: even })) });
    const full = classic.object({ lines: classic.array(classic.object({ n: reference })) });
    const input = { lines: [{ n: 4 }, { n: 3 }] };
    expect(issues(mini.safeParse(input))).toEqual(issues(full.safeParse(input)));
    expect(issues(mini.safeParse(input))).toEqual([
      { code: 'custom', path: ['lines', 1, 'n'], message: 'must be even' },
    ]);
    expect(mini.parse({ lines: [{ n: 4 }] })).toEqual(full.parse({ lines: [{ n: 4 }] }));
  });
});
