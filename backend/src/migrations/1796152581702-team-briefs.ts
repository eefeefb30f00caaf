import type { MigrationInterface, QueryRunner } from 'typeorm';

export class TeamBriefs1796152581702 implements MigrationInterface {
  name = 'TeamBriefs1796152581702';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            CREATE TABLE "publications" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "model_run_id" uuid NOT NULL,
                "dataset_id" uuid NOT NULL,
                "status" character varying(20) NOT NULL,
                "policy_version" integer NOT NULL,
                "k" integer NOT NULL,
                "features" text array NOT NULL DEFAULT '{}',
                "published_by_id" uuid,
                "published_by_email" character varying(320),
                "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
                "published_at" TIMESTAMP WITH TIME ZONE,
                "team_count" integer,
                "withheld_team_count" integer,
                "ended_at" TIMESTAMP WITH TIME ZONE,
                "end_reason" text,
                CONSTRAINT "PK_2c4e732b044e09139d2f1065fae" PRIMARY KEY ("id")
            )
        `);
    await queryRunner.query(`
            CREATE INDEX "publications_dataset_status" ON "publications" ("dataset_id", "status")
        `);
    await queryRunner.query(`
            CREATE TABLE "team_briefs" (
                "id" uuid NOT NULL DEFAULT gen_random_uuid(),
                "publication_id" uuid NOT NULL,
                "name" character varying(300) NOT NULL,
                "department" character varying(300),
                "manager_email" character varying(320),
                "withheld" boolean NOT NULL,
                "headcount" integer,
                "summary" jsonb NOT NULL,
                "brief" jsonb NOT NULL,
                CONSTRAINT "PK_8bfe94c32a06e65ffed5c21464b" PRIMARY KEY ("id")
            )
        `);
    await queryRunner.query(`
            CREATE INDEX "team_briefs_publication" ON "team_briefs" ("publication_id")
        `);
    await queryRunner.query(`
            CREATE INDEX "team_briefs_manager" ON "team_briefs" ("manager_email")
        `);
    await queryRunner.query(`
            ALTER TABLE "publications"
            ADD CONSTRAINT "FK_9441c08f713c45229839f8ee23f" FOREIGN KEY ("dataset_id") REFERENCES "datasets"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `);
    await queryRunner.query(`
            ALTER TABLE "team_briefs"
            ADD CONSTRAINT "FK_c9cd2b88db8cf67cc7daa303d20" FOREIGN KEY ("publication_id") REFERENCES "publications"("id") ON DELETE CASCADE ON UPDATE NO ACTION
        `);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
            ALTER TABLE "team_briefs" DROP CONSTRAINT "FK_c9cd2b88db8cf67cc7daa303d20"
        `);
    await queryRunner.query(`
            ALTER TABLE "publications" DROP CONSTRAINT "FK_9441c08f713c45229839f8ee23f"
        `);
    await queryRunner.query(`
            DROP INDEX "public"."team_briefs_manager"
        `);
    await queryRunner.query(`
            DROP INDEX "public"."team_briefs_publication"
        `);
    await queryRunner.query(`
            DROP TABLE "team_briefs"
        `);
    await queryRunner.query(`
            DROP INDEX "public"."publications_dataset_status"
        `);
    await queryRunner.query(`
            DROP TABLE "publications"
        `);
  }
}
