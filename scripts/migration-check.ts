import createDataSource from '../backend/src/data-source';

// Fails when the entities describe a schema the committed migrations do not create.
const dataSource = createDataSource;
await dataSource.initialize();
await dataSource.runMigrations({ transaction: 'each' });
const sql = await dataSource.driver.createSchemaBuilder().log();
await dataSource.destroy();
if (sql.upQueries.length > 0) {
  process.stderr.write(
    `The entities differ from the migrations; run \`npm run migration:generate -- <name>\`. Missing:\n${sql.upQueries
      .map((q) => `  ${q.query}`)
      .join('\n')}\n`,
  );
  process.exit(1);
}
process.stdout.write('Migrations match the entities.\n');
