import type { z } from "zod";

/**
 * Marks a reply as one of the API contract's shapes (src/lib/contracts): the body must type-check
 * against the schema's input, so a route that drifts from the contract does not compile. Costs nothing
 * at run time; the server's contract test parses real replies with the same schemas.
 */
export const shaped = <S extends z.ZodType>(_schema: S, body: z.input<S>): z.input<S> => body;
