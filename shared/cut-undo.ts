// Taking back "marked as cut". The mark locks the cylinder's readings and step and keeps the held
// piston with this bore, so it is confirmed before it is made; a slip can be taken back by the
// machinist who made it for a short while, and by the owner at any time with a reason.
import * as z from './zod';

import type { Role } from './session-types';
import { allows } from './access';

/** How long the machinist who marked the cut may take it back alone. */
export const CUT_UNDO_MINUTES = 10;

export const undoCutInput = z.strictObject({
  reason: z.optional(
    z
      .string({ error: 'must be text' })
      .check(z.trim(), z.maxLength(500, { message: 'at most 500 characters', abort: true })),
  ),
});
export type UndoCutInput = z.output<typeof undoCutInput>;

/** Who marked the cut and until when they may take it back alone (on the bore sheet). */
export interface CutUndoJson {
  cutBy: { id: string; name: string } | null;
  /** ISO time; after it only the owner may undo, with a reason. Null when not cut. */
  undoUntil: string | null;
}

export interface CutUndoFacts {
  cutAt: Date | null;
  cutBy: string | null;
  /** A honed bore or ring gap recorded after the cut. */
  measuredAfter: boolean;
}

export interface CutUndoActor {
  id: string;
  role: Role;
}

export type CutUndoRefusal =
  | { code: 'not_cut'; message: string }
  | { code: 'measured_after'; message: string }
  | { code: 'reason_needed'; message: string }
  | { code: 'not_allowed'; message: string };

/** The end of the short window in which the cutter may take the mark back alone. */
export function undoUntil(cutAt: Date): Date {
  return new Date(cutAt.getTime() + CUT_UNDO_MINUTES * 60_000);
}

/**
 * Why this person may not take the cut back now, or null when they may: the machinist who cut, in
 * the first minutes; the owner, at any time, with a reason (kept with the job).
 */
export function whyNoCutUndo(
  facts: CutUndoFacts,
  actor: CutUndoActor,
  reason: string,
  now: Date = new Date(),
): CutUndoRefusal | null {
  if (!facts.cutAt) return { code: 'not_cut', message: 'This cylinder is not marked as cut.' };
  if (facts.measuredAfter) {
    return {
      code: 'measured_after',
      message:
        'The honed bore or ring gap is already recorded for this cylinder, so the cut cannot be taken back.',
    };
  }
  const ownShortWindow = facts.cutBy === actor.id && now <= undoUntil(facts.cutAt);
  if (ownShortWindow) return null;
  if (allows(actor.role, 'undoAnyCut')) {
    return reason.trim().length >= 3
      ? null
      : {
          code: 'reason_needed',
          message: 'Say why the cut is taken back; the reason is kept with the job.',
        };
  }
  return {
    code: 'not_allowed',
    message: `Only the machinist who marked the cut may take it back, within ${CUT_UNDO_MINUTES} minutes; after that the owner may, with a reason.`,
  };
}
