import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import type pg from 'pg';
import { batched } from './batch';

const PgStore = connectPgSimple(session);

/**
 * The PostgreSQL session store (connect-pg-simple) with its hottest call, reading a session on
 * every request, batched: concurrent requests share one `sid = ANY(...)` query instead of one
 * round trip each. Every request still reads the session as stored at that moment (sign-out and
 * expiry take effect at once, on every app process); writes are unchanged.
 */
export class BatchedPgStore extends PgStore {
  private readonly readSessions: (sid: string) => Promise<session.SessionData | null>;

  constructor(options: { pool: pg.Pool; tableName: string; pruneSessionInterval: number }) {
    super({ ...options, createTableIfMissing: false, disableTouch: true });
    const table = `"${options.tableName.replace(/"/g, '""')}"`;
    this.readSessions = batched(async (sids: string[]) => {
      const result = await options.pool.query<{ sid: string; sess: session.SessionData | string }>(
        `SELECT sid, sess FROM ${table} WHERE sid = ANY($1::text[]) AND expire >= to_timestamp($2)`,
        [sids, Math.ceil(Date.now() / 1000)],
      );
      const found = new Map<string, session.SessionData>();
      for (const row of result.rows) {
        if (typeof row.sess !== 'string') {
          found.set(row.sid, row.sess);
          continue;
        }
        // One unreadable session must not fail the others of its batch: it is ended, as
        // connect-pg-simple does, and its request is treated as signed out.
        try {
          found.set(row.sid, JSON.parse(row.sess));
        } catch {
          this.destroy(row.sid);
        }
      }
      return sids.map((sid) => found.get(sid) ?? null);
    });
  }

  override get(sid: string, callback: (error: unknown, session?: session.SessionData | null) => void): void {
    this.readSessions(sid).then(
      (found) => callback(null, found),
      (error: unknown) => callback(error),
    );
  }
}
