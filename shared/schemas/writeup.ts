/**
 * Content of a write-up. Provisional: the write-up editor extends it (images, wire run
 * blocks, parts list); `body` stays the Markdown text.
 */
import { z } from 'zod';

export const MAX_WRITEUP_BODY = 200_000;

export const writeupContentSchema = z.strictObject({
  body: z
    .string()
    .max(MAX_WRITEUP_BODY, { error: `must be at most ${MAX_WRITEUP_BODY} characters` })
    .default(''),
  summary: z.string().max(500, { error: 'must be at most 500 characters' }).optional(),
});

export type WriteupContent = z.infer<typeof writeupContentSchema>;
