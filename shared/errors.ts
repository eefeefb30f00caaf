import { z } from 'zod';

/** The JSON error body of every failed API call. */
export const apiErrorSchema = z.object({
  error: z.object({ code: z.string(), message: z.string(), details: z.unknown().optional() }),
});
export type ApiErrorBody = z.infer<typeof apiErrorSchema>;
