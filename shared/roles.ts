import { z } from 'zod';

/** The three roles of Coppice. The backend enforces them; the frontend only shapes navigation. */
export const roleSchema = z.enum(['analyst', 'privacy_officer', 'manager']);
export type Role = z.infer<typeof roleSchema>;
export const ROLES = roleSchema.options;

export const ROLE_LABELS: Record<Role, string> = {
  analyst: 'HR analyst',
  privacy_officer: 'Privacy officer',
  manager: 'Department manager',
};

export const meSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  roles: z.array(roleSchema),
});
export type Me = z.infer<typeof meSchema>;
