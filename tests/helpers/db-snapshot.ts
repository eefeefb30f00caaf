import type { TestCoppice } from './test-coppice';

/**
 * Row counts of every table of ours (sessions aside), for "nothing changed" checks: a refused
 * request must leave each count as it was.
 */
export async function rowCounts(coppice: Pick<TestCoppice, 'sql'>): Promise<Record<string, number>> {
  const tables = await coppice.sql<{ name: string }>(
    "SELECT tablename AS name FROM pg_tables WHERE schemaname = 'public' AND tablename NOT IN ('session', 'typeorm_migrations') ORDER BY 1",
  );
  const counts: Record<string, number> = {};
  for (const { name } of tables) {
    const [row] = await coppice.sql<{ n: string }>(`SELECT count(*) AS n FROM "${name}"`);
    counts[name] = Number(row.n);
  }
  return counts;
}
