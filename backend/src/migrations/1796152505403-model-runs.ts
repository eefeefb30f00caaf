import type { MigrationInterface, QueryRunner } from 'typeorm';

export class ModelRuns1796152505403 implements MigrationInterface {
  name = 'ModelRuns1796152505403';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            CREATE TABLE "model_runs" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "dataset_id" uuid NOT NULL,
                "dataset_name" character varying(200),
                "dataset_version" character varying(80),
                "data_window" jsonb,
                "status" character varying(20) NOT NULL,
                "progress" double precision NOT NULL DEFAULT '0',
                "phase" character varying(30),
                "settings" jsonb NOT NULL,
                "policy_version" integer NOT NULL,
                "k" integer NOT NULL,
                "features" jsonb NOT NULL,
                "excluded_features" jsonb NOT NULL,
                "result" jsonb,
                "error" text,
                "cancel_requested" boolean NOT NULL DEFAULT false,
                "attempts" integer NOT NULL DEFAULT '0',
                "worker_name" character varying(200),
                "needs_review" boolean NOT NULL DEFAULT false,
                "publication_state" character varying(20) NOT NULL DEFAULT 'draft',
                "publication_comment" text,
                "driver_actions" jsonb NOT NULL DEFAULT '{}',
                "created_by_id" uuid,
                "created_by_email" character varying(320) NOT NULL,
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                "started_at" TIMESTAMP WITH TIME ZONE,
                "finished_at" TIMESTAMP WITH TIME ZONE,
                "heartbeat_at" TIMESTAMP WITH TIME ZONE,
                CONSTRAINT "PK_8caa6d7d2a44d52b66e8edca8ae" PRIMARY KEY ("id")
            )
        `);
    await queryRunner.query(`
            CREATE INDEX "IDX_e6944672bfcdc98a49d5330a23" ON "model_runs" ("created_at")
        `);
    await queryRunner.query(`
            CREATE INDEX "IDX_97ab5f00f97e52c073c5a59232" ON "model_runs" ("dataset_id")
        `);
    await queryRunner.query(`
            ALTER TABLE "model_runs"
            ADD CONSTRAINT "FK_97ab5f00f97e52c073c5a592320" FOREIGN KEY ("dataset_id") REFERENCES "datasets"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            ALTER TABLE "model_runs" DROP CONSTRAINT "FK_97ab5f00f97e52c073c5a592320"
        `);
    await queryRunner.query(`
            DROP INDEX "public"."IDX_97ab5f00f97e52c073c5a59232"
        `);
    await queryRunner.query(`
            DROP INDEX "public"."IDX_e6944672bfcdc98a49d5330a23"
        `);
    await queryRunner.query(`
            DROP TABLE "model_runs"
        `);
  }
}
