// A landlord's tenancy reference as the database compares it.

/**
 * The key of a tenancy reference as MariaDB compares it (utf8mb4_unicode_ci: neither case nor accents
 * count), so that "t-1" in a file is the "T-1" held, and a file holding both has a repeat rather than
 * a clash at the unique key.
 */
export const referenceKey = (reference: string): string => reference.normalize("NFKD").replace(/\p{M}/gu, "").toLowerCase();
