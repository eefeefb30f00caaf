import { z } from 'zod';

/** Filters of `GET /api/audit` and its CSV export (query string). */
export const auditQuerySchema = z.object({
  /** part of the actor's e-mail, any case */
  actor: z.string().trim().max(320).optional(),
  /** an action, or the start of one ("policy." matches every policy action) */
  action: z.string().trim().max(80).optional(),
  objectType: z.string().trim().max(40).optional(),
  objectId: z.string().trim().max(80).optional(),
  from: z.iso.datetime({ offset: true, error: 'from must be a date and time (ISO 8601)' }).optional(),
  to: z.iso.datetime({ offset: true, error: 'to must be a date and time (ISO 8601)' }).optional(),
  page: z.coerce.number().int().min(1, 'page starts at 1').default(1),
  pageSize: z.coerce.number().int().min(1).max(200, 'pageSize is at most 200').default(50),
});
export type AuditQuery = z.infer<typeof auditQuerySchema>;
export type AuditQueryInput = z.input<typeof auditQuerySchema>;

export const auditEventSchema = z.object({
  id: z.string(),
  at: z.string(),
  actorEmail: z.string().nullable(),
  action: z.string(),
  objectType: z.string().nullable(),
  objectId: z.string().nullable(),
  details: z.record(z.string(), z.unknown()),
});
export type AuditEventView = z.infer<typeof auditEventSchema>;

export const auditPageSchema = z.object({
  items: z.array(auditEventSchema),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type AuditPage = z.infer<typeof auditPageSchema>;

/** Plain words for the actions Coppice records; unknown actions are shown as they are. */
export const AUDIT_ACTION_LABELS: Record<string, string> = {
  'auth.sign_in': 'Signed in',
  'auth.sign_out': 'Signed out',
  'policy.change': 'Changed the privacy policy',
  'audit.export': 'Exported the audit trail',
  'dataset.uploaded': 'Uploaded a dataset',
  'dataset.mapped': 'Mapped a dataset',
  'dataset.deleted': 'Deleted a dataset',
  'dataset.approved': 'Approved a dataset for modelling',
  'dataset.sent_back': 'Sent a dataset back',
  'dataset.proxy_blocked': 'Blocked a proxy field',
  'dataset.proxy_accepted': 'Accepted a proxy field',
};
