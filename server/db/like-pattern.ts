// Searching text with LIKE: the user's own % and _ are taken literally, never as wildcards.

/** A LIKE pattern that matches `text` anywhere, with the user's % and _ taken literally. */
export function containsPattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}
