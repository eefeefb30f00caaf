import type { MigrationInterface, QueryRunner } from 'typeorm';

export class Datasets1796151046358 implements MigrationInterface {
  name = 'Datasets1796151046358';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            CREATE TABLE "dataset_columns" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "dataset_id" uuid NOT NULL,
                "role" character varying(20) NOT NULL,
                "position" integer NOT NULL,
                "name" character varying(200) NOT NULL,
                "type" character varying(20) NOT NULL,
                "date_order" character varying(20),
                "values" jsonb NOT NULL,
                CONSTRAINT "PK_d7be492a5de7d5adc98729f7972" PRIMARY KEY ("id")
            )
        `);
    await queryRunner.query(`
            CREATE INDEX "IDX_fe9f96cad96fdad0166f51eedc" ON "dataset_columns" ("dataset_id", "role", "position")
        `);
    await queryRunner.query(`
            CREATE TABLE "datasets" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "name" character varying(200) NOT NULL,
                "status" character varying(20) NOT NULL,
                "row_count" integer NOT NULL,
                "format" character varying(10) NOT NULL,
                "uploaded_by_id" uuid,
                "uploaded_by_email" character varying(320) NOT NULL,
                "uploaded_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                "sheet_name" character varying(200),
                "sheet_names" jsonb NOT NULL DEFAULT '[]',
                "warnings" jsonb NOT NULL DEFAULT '[]',
                "profile" jsonb NOT NULL,
                "dropped_columns" jsonb NOT NULL DEFAULT '[]',
                "mapping" jsonb,
                "preview" jsonb,
                "mapped_at" TIMESTAMP WITH TIME ZONE,
                "row_numbers" jsonb NOT NULL,
                CONSTRAINT "PK_1bf831e43c559a240303e23d038" PRIMARY KEY ("id")
            )
        `);
    await queryRunner.query(`
            CREATE INDEX "IDX_b6763e4ef0620b605823ea0ff4" ON "datasets" ("uploaded_at")
        `);
    await queryRunner.query(`
            ALTER TABLE "dataset_columns"
            ADD CONSTRAINT "FK_104d490b43391abf1dfd00a6269" FOREIGN KEY ("dataset_id") REFERENCES "datasets"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            ALTER TABLE "dataset_columns" DROP CONSTRAINT "FK_104d490b43391abf1dfd00a6269"
        `);
    await queryRunner.query(`
            DROP INDEX "public"."IDX_b6763e4ef0620b605823ea0ff4"
        `);
    await queryRunner.query(`
            DROP TABLE "datasets"
        `);
    await queryRunner.query(`
            DROP INDEX "public"."IDX_fe9f96cad96fdad0166f51eedc"
        `);
    await queryRunner.query(`
            DROP TABLE "dataset_columns"
        `);
  }
}
