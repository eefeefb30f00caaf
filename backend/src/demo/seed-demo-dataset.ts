import type { Config } from '../lib/config';
import { logger } from '../lib/logger';
import { listDatasets, mapDataset, uploadDataset } from '../modules/datasets/datasets.service';
import { generateQuillfernExport, QUILLFERN_MAPPING } from './quillfern';
import { quillfernCsv } from './quillfern-csv';

export const DEMO_DATASET_NAME = 'Quillfern Community Care staff export (invented demo data)';
const DEMO_UPLOADER = { id: null, email: 'analyst@quillfern.example' };

/** Uploads and maps the invented demo export once, through the same path as an analyst's upload. */
export async function seedDemoDataset(config: Pick<Config, 'employeeIdSecret'>): Promise<string | null> {
  const existing = await listDatasets();
  if (existing.some((dataset) => dataset.name === DEMO_DATASET_NAME)) return null;
  const csv = quillfernCsv(generateQuillfernExport({ rows: 2400 }));
  const dataset = await uploadDataset({
    bytes: new Uint8Array(Buffer.from(csv, 'utf8')),
    name: DEMO_DATASET_NAME,
    user: DEMO_UPLOADER,
    config,
  });
  await mapDataset(dataset.id, QUILLFERN_MAPPING, DEMO_UPLOADER);
  logger.info({ datasetId: dataset.id, rows: dataset.rowCount }, 'demo dataset seeded');
  return dataset.id;
}
