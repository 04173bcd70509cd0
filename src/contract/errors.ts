import { z } from 'zod';

/** The one JSON error shape every API route answers with. */
export const apiErrorSchema = z.object({
  error: z.string(),
  code: z.string(),
  details: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
});
export type ApiErrorBody = z.infer<typeof apiErrorSchema>;
