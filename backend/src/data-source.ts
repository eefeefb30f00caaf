import { createDataSource } from './lib/db';

// The data source TypeORM's command line uses (migration:generate, migration:run, migration:show).
const url = process.env.DATABASE_URL ?? `postgres://coppice@127.0.0.1:${process.env.PGPORT ?? 55432}/coppice`;
export default createDataSource(url);
