import { z } from 'zod';

/** A figure about too few employees to show. */
export const withheldSchema = z.object({ withheld: z.literal(true) }).strict();
const orWithheld = <T extends z.ZodType>(schema: T) => z.union([schema, withheldSchema]);

export const proxyDecisionKindSchema = z.enum(['block', 'accept']);

/** `POST /api/datasets/:id/proxies/decisions`: block the allowed field too, or accept it with a reason. */
export const proxyDecisionSchema = z.strictObject({
  feature: z
    .string()
    .trim()
    .min(1, 'feature names the allowed column')
    .max(200, 'feature is at most 200 characters'),
  blockedField: z
    .string()
    .trim()
    .min(1, 'blockedField names the blocked column')
    .max(200, 'blockedField is at most 200 characters'),
  decision: proxyDecisionKindSchema,
  reason: z
    .string({ error: 'reason is required: say why' })
    .trim()
    .min(3, 'reason is required: say why')
    .max(500, 'reason is at most 500 characters'),
});
export type ProxyDecisionBody = z.infer<typeof proxyDecisionSchema>;

export const proxyRowSchema = z.object({
  feature: z.string(),
  blockedField: z.string(),
  cramersV: z.number(),
  normalisedMutualInformation: z.number(),
  chiSquare: z.number(),
  dof: z.number().int(),
  n: z.number().int(),
  /** quantile bins used where the column is a number or a date; null for categories */
  featureBins: z.number().int().nullable(),
  blockedFieldBins: z.number().int().nullable(),
  strength: z.enum(['negligible', 'small', 'medium', 'large']),
  flagged: z.boolean(),
  decision: z
    .object({
      decision: proxyDecisionKindSchema,
      reason: z.string(),
      by: z.string().nullable(),
      at: z.string(),
    })
    .nullable(),
});
export type ProxyRowView = z.infer<typeof proxyRowSchema>;

/** `GET /api/datasets/:id/proxies`. */
export const proxyReportSchema = z.object({
  datasetId: z.string(),
  policyVersion: z.number().int(),
  threshold: z.number(),
  /** quantile bins for numbers and dates */
  bins: z.number().int(),
  rows: z.array(proxyRowSchema),
});
export type ProxyReportView = z.infer<typeof proxyReportSchema>;

/** `POST /api/datasets/:id/approval`: approve for modelling, or send back to the analyst with a comment. */
export const approvalSchema = z
  .strictObject({
    decision: z.enum(['approve', 'send-back']).default('approve'),
    comment: z.string().trim().max(1000, 'comment is at most 1000 characters').optional(),
  })
  .refine((body) => body.decision === 'approve' || (body.comment?.length ?? 0) >= 3, {
    path: ['comment'],
    message: 'comment is required when sending back: tell the analyst what to change',
  });
export type ApprovalBody = z.infer<typeof approvalSchema>;

export const fairnessGroupSchema = z.object({
  group: z.string(),
  headcount: orWithheld(z.number()),
  leavers: orWithheld(z.number()),
  attritionRate: orWithheld(z.number()),
  meanPredictedRisk: orWithheld(z.number()),
  retentionRate: orWithheld(z.number()),
  retentionRatio: orWithheld(z.number().nullable()),
  reference: z.boolean(),
  flagged: z.boolean(),
  withheld: z.boolean(),
});
export type FairnessGroupView = z.infer<typeof fairnessGroupSchema>;

export const fairnessReportSchema = z.object({
  field: z.string(),
  rule: z.string(),
  bins: z.number().int().nullable(),
  k: z.number().int(),
  groups: z.array(fairnessGroupSchema),
});
export type FairnessReportView = z.infer<typeof fairnessReportSchema>;

/**
 * Where a dataset stands with the privacy officers:
 * not-mapped → awaiting-review → approved (or sent-back, then awaiting-review again after a new
 * mapping); approved → needs-review when the policy's k, blocked fields or proxy threshold change.
 */
export const approvalStateSchema = z.enum([
  'not-mapped',
  'awaiting-review',
  'sent-back',
  'approved',
  'needs-review',
]);
export type ApprovalState = z.infer<typeof approvalStateSchema>;

export const approvalDecisionSchema = z.object({
  decision: z.enum(['approved', 'sent-back']),
  comment: z.string().nullable(),
  policyVersion: z.number().int(),
  decidedBy: z.string(),
  decidedAt: z.string(),
});
export type ApprovalDecisionView = z.infer<typeof approvalDecisionSchema>;

/** `GET /api/datasets/:id/approval`. */
export const approvalStatusSchema = z.object({
  datasetId: z.string(),
  state: approvalStateSchema,
  /** plain-words reasons for the state (what changed, what is missing) */
  reasons: z.array(z.string()),
  currentPolicyVersion: z.number().int(),
  latest: approvalDecisionSchema.nullable(),
  history: z.array(approvalDecisionSchema),
});
export type ApprovalStatusView = z.infer<typeof approvalStatusSchema>;

/** A mapped dataset waiting for approval for modelling. */
export const datasetQueueItemSchema = z.object({
  kind: z.literal('dataset'),
  id: z.string(),
  name: z.string(),
  rowCount: z.number().int(),
  uploadedBy: z.string(),
  mappedAt: z.string().nullable(),
  state: approvalStateSchema,
  reasons: z.array(z.string()),
});
export type DatasetQueueItem = z.infer<typeof datasetQueueItemSchema>;

/** A model run whose publication an analyst requested and no privacy officer has decided yet. */
export const publicationQueueItemSchema = z.object({
  kind: z.literal('publication'),
  /** the model run's id */
  id: z.string(),
  datasetId: z.string(),
  datasetName: z.string().nullable(),
  /** who asked and when, from the audit trail (null only if that line cannot be found) */
  requestedBy: z.string().nullable(),
  requestedAt: z.string().nullable(),
  /** the analyst's note with the request, if any */
  note: z.string().nullable(),
  /** the privacy policy version the run was trained under */
  policyVersion: z.number().int(),
  /** the policy changed since the run was trained: it cannot be published, only sent back */
  needsReview: z.boolean(),
});
export type PublicationQueueItem = z.infer<typeof publicationQueueItemSchema>;

/** `GET /api/review-queue`: what waits for a privacy officer, datasets first, each group oldest first. */
export const reviewQueueItemSchema = z.discriminatedUnion('kind', [
  datasetQueueItemSchema,
  publicationQueueItemSchema,
]);
export type ReviewQueueItem = z.infer<typeof reviewQueueItemSchema>;
export const reviewQueueSchema = z.array(reviewQueueItemSchema);

/** `GET /api/models/:id/fairness` (privacy officers only). */
export const modelFairnessSchema = z.object({
  modelRunId: z.string(),
  datasetId: z.string(),
  policyVersion: z.number().int(),
  k: z.number().int(),
  reports: z.array(fairnessReportSchema),
});
export type ModelFairnessView = z.infer<typeof modelFairnessSchema>;
