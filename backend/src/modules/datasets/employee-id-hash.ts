import { createHmac } from 'node:crypto';

/** The keyed hash that replaces an employee ID before anything is stored: HMAC-SHA256, hex. */
export function hashEmployeeId(secret: string, id: string): string {
  return createHmac('sha256', secret).update(id.trim(), 'utf8').digest('hex');
}
