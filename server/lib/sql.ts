/** Escapes LIKE wildcards so user text matches literally: `%${escapeLike(q)}%`. */
export const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);
