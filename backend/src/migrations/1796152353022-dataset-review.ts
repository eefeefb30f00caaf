import type { MigrationInterface, QueryRunner } from 'typeorm';

export class DatasetReview1796152353022 implements MigrationInterface {
  name = 'DatasetReview1796152353022';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            CREATE TABLE "dataset_approvals" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "dataset_id" uuid NOT NULL,
                "decision" character varying(20) NOT NULL,
                "comment" character varying(1000),
                "policy_version" integer NOT NULL,
                "mapped_at" TIMESTAMP WITH TIME ZONE NOT NULL,
                "decided_by_id" uuid,
                "decided_by_email" character varying(320) NOT NULL,
                "decided_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_97c341e4098c82ff4225c855582" PRIMARY KEY ("id")
            )
        `);
    await queryRunner.query(`
            CREATE INDEX "IDX_f2003d4fbe3807dd2fa0714329" ON "dataset_approvals" ("dataset_id", "decided_at")
        `);
    await queryRunner.query(`
            CREATE TABLE "proxy_decisions" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "dataset_id" uuid NOT NULL,
                "feature" character varying(200) NOT NULL,
                "blocked_field" character varying(200) NOT NULL,
                "decision" character varying(10) NOT NULL,
                "reason" character varying(500) NOT NULL,
                "cramers_v" double precision NOT NULL,
                "policy_version" integer NOT NULL,
                "decided_by_id" uuid,
                "decided_by_email" character varying(320) NOT NULL,
                "decided_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                CONSTRAINT "PK_a79d314e5c49c32e2085ad95a16" PRIMARY KEY ("id")
            )
        `);
    await queryRunner.query(`
            CREATE INDEX "IDX_3c68f46af39f513c53df4f687c" ON "proxy_decisions" ("dataset_id", "feature", "blocked_field")
        `);
    await queryRunner.query(`
            ALTER TABLE "dataset_approvals"
            ADD CONSTRAINT "FK_4ca585ce2ee703aa2da0e788867" FOREIGN KEY ("dataset_id") REFERENCES "datasets"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `);
    await queryRunner.query(`
            ALTER TABLE "proxy_decisions"
            ADD CONSTRAINT "FK_86a804c1d9bb24a4a767b361963" FOREIGN KEY ("dataset_id") REFERENCES "datasets"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            ALTER TABLE "proxy_decisions" DROP CONSTRAINT "FK_86a804c1d9bb24a4a767b361963"
        `);
    await queryRunner.query(`
            ALTER TABLE "dataset_approvals" DROP CONSTRAINT "FK_4ca585ce2ee703aa2da0e788867"
        `);
    await queryRunner.query(`
            DROP INDEX "public"."IDX_3c68f46af39f513c53df4f687c"
        `);
    await queryRunner.query(`
            DROP TABLE "proxy_decisions"
        `);
    await queryRunner.query(`
            DROP INDEX "public"."IDX_f2003d4fbe3807dd2fa0714329"
        `);
    await queryRunner.query(`
            DROP TABLE "dataset_approvals"
        `);
  }
}
