import { z } from 'zod';

/** Defaults of a fresh installation. k = 5 is common practice in HR reporting, no single source. */
export const POLICY_DEFAULTS = {
  k: 5,
  blockedFields: [] as string[],
  proxyThreshold: 0.5,
  retentionDays: 365,
};

export const POLICY_LIMITS = {
  k: { min: 2, max: 100 },
  proxyThreshold: { min: 0.1, max: 0.9 },
  retentionDays: { min: 30, max: 3650 },
  reason: { min: 3, max: 500 },
} as const;

const whole = (field: string, min: number, max: number) =>
  z
    .number({ error: `${field} must be a whole number from ${min} to ${max}` })
    .int(`${field} must be a whole number from ${min} to ${max}`)
    .min(min, `${field} must be at least ${min}`)
    .max(max, `${field} must be at most ${max}`);

/** The privacy officer's settings: the body of `PUT /api/policy` without the reason; unknown keys are refused. */
export const policySettingsSchema = z.strictObject({
  k: whole('k', POLICY_LIMITS.k.min, POLICY_LIMITS.k.max),
  blockedFields: z
    .array(
      z
        .string()
        .trim()
        .min(1, 'A blocked field needs a column name')
        .max(200, 'Column names are at most 200 characters'),
      {
        error: 'blockedFields must be a list of column names',
      },
    )
    .max(500, 'At most 500 blocked fields')
    .transform((fields) => [...new Set(fields)]),
  proxyThreshold: z
    .number({ error: 'proxyThreshold must be a number from 0.1 to 0.9' })
    .min(POLICY_LIMITS.proxyThreshold.min, 'proxyThreshold must be at least 0.1')
    .max(POLICY_LIMITS.proxyThreshold.max, 'proxyThreshold must be at most 0.9'),
  retentionDays: whole('retentionDays', POLICY_LIMITS.retentionDays.min, POLICY_LIMITS.retentionDays.max),
});
export type PolicySettings = z.infer<typeof policySettingsSchema>;

/** `PUT /api/policy`: the settings and a short reason, which the version history keeps. */
export const policyUpdateSchema = policySettingsSchema.extend({
  reason: z
    .string({ error: 'reason is required: say briefly why the policy changes' })
    .trim()
    .min(POLICY_LIMITS.reason.min, 'reason is required: say briefly why the policy changes')
    .max(POLICY_LIMITS.reason.max, 'reason is at most 500 characters'),
});
export type PolicyUpdate = z.infer<typeof policyUpdateSchema>;
export type PolicyUpdateInput = z.input<typeof policyUpdateSchema>;

/** One version of the privacy policy, as `GET /api/policy` returns the current one. */
export const policySchema = z.object({
  version: z.number().int(),
  k: z.number().int(),
  blockedFields: z.array(z.string()),
  proxyThreshold: z.number(),
  retentionDays: z.number().int(),
  reason: z.string(),
  authorEmail: z.string().nullable(),
  createdAt: z.string(),
});
export type Policy = z.infer<typeof policySchema>;

export const policyHistorySchema = z.array(policySchema);
