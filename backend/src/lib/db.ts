import { DataSource } from 'typeorm';
import { AuditEvent } from '../entities/audit-event.entity';
import { Dataset } from '../entities/dataset.entity';
import { DatasetApproval } from '../entities/dataset-approval.entity';
import { DatasetColumn } from '../entities/dataset-column.entity';
import { ModelRun } from '../entities/model-run.entity';
import { PolicyVersion } from '../entities/policy-version.entity';
import { ProxyDecision } from '../entities/proxy-decision.entity';
import { Publication } from '../entities/publication.entity';
import { TeamBriefRecord } from '../entities/team-brief.entity';
import { User } from '../entities/user.entity';
import { Foundation1796150136015 } from '../migrations/1796150136015-foundation';
import { PrivacyPolicy1796150959571 } from '../migrations/1796150959571-privacy-policy';
import { Datasets1796151046358 } from '../migrations/1796151046358-datasets';
import { DatasetReview1796152353022 } from '../migrations/1796152353022-dataset-review';
import { ModelRuns1796152505403 } from '../migrations/1796152505403-model-runs';
import { TeamBriefs1796152581702 } from '../migrations/1796152581702-team-briefs';

/** Every entity and migration, listed (not globbed) so they load the same under tsx and vitest. */
export const entities = [
  User,
  AuditEvent,
  PolicyVersion,
  Dataset,
  DatasetColumn,
  DatasetApproval,
  ProxyDecision,
  ModelRun,
  Publication,
  TeamBriefRecord,
];
export const migrations = [
  Foundation1796150136015,
  PrivacyPolicy1796150959571,
  Datasets1796151046358,
  DatasetReview1796152353022,
  ModelRuns1796152505403,
  TeamBriefs1796152581702,
];

export function createDataSource(url: string): DataSource {
  return new DataSource({
    type: 'postgres',
    url,
    entities,
    migrations,
    migrationsTableName: 'typeorm_migrations',
    synchronize: false,
    uuidExtension: 'pgcrypto',
    logging: false,
    extra: { max: 20, connectionTimeoutMillis: 5000 },
  });
}

let current: DataSource | null = null;

/** The process's data source, set once at start-up by the runtime. Only repositories call this. */
export function db(): DataSource {
  if (!current) throw new Error('The database is not initialised yet');
  return current;
}

export function setDataSource(dataSource: DataSource | null): void {
  current = dataSource;
}
