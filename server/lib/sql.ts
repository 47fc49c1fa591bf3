/** Escapes LIKE wildcards so user text matches literally: `%${escapeLike(q)}%`. */
export const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/**
 * The LIKE patterns of a search over homes: as typed, and without spaces for postcodes ("ZQ1 2AB" and
 * "ZQ12AB" both find a home, whose postcode is compared without its spaces).
 */
export function searchPatterns(q: string): { like: string; compact: string } {
  return { like: `%${escapeLike(q)}%`, compact: `%${escapeLike(q.replace(/\s+/g, ""))}%` };
}
