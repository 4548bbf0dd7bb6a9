import type { MigrationInterface, QueryRunner } from 'typeorm';

export class AddProgramWords1796187181992 implements MigrationInterface {
  name = 'AddProgramWords1796187181992';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE \`program\` ADD \`population_label\` varchar(60) NOT NULL DEFAULT 'applicants'`);
    await queryRunner.query(`ALTER TABLE \`program\` ADD \`take_up_phrase\` varchar(100) NOT NULL DEFAULT 'take part'`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE \`program\` DROP COLUMN \`take_up_phrase\``);
    await queryRunner.query(`ALTER TABLE \`program\` DROP COLUMN \`population_label\``);
  }
}
