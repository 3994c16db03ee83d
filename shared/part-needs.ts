// What a cylinder needs from the shelf before it is cut, and how the pages say what is missing.
// The rule itself (what is free, which step is empty, which cylinder waits) is one database view
// that every count reads (migrations: step_free_parts, cylinder_part_needs); this module holds
// the names and the wording so every page says it the same way.

/** A bored cylinder takes a new piston and a new ring set of its step. */
export const NEEDED_PARTS = ['piston', 'rings'] as const;
export type NeededPart = (typeof NEEDED_PARTS)[number];

const ONE: Record<NeededPart, string> = { piston: 'a piston', rings: 'a ring set' };
const NONE: Record<NeededPart, string> = { piston: 'no free piston', rings: 'no free ring set' };

/** Keeps the order piston, rings and drops repeats, whatever order the database gave. */
export function orderedParts(parts: readonly string[]): NeededPart[] {
  return NEEDED_PARTS.filter((p) => parts.includes(p));
}

/** "a piston", "a ring set", "a piston and a ring set"; empty when nothing is missing. */
export function waitingForWords(parts: readonly NeededPart[]): string {
  return orderedParts(parts)
    .map((p) => ONE[p])
    .join(' and ');
}

/** "no free piston", "no free ring set", "no free piston and no free ring set". */
export function emptyStepWords(parts: readonly NeededPart[]): string {
  return orderedParts(parts)
    .map((p) => NONE[p])
    .join(' and ');
}
