import type { MigrationInterface, QueryRunner } from 'typeorm';

export class InitialSchema1796180845907 implements MigrationInterface {
  name = 'InitialSchema1796180845907';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE \`program\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`slug\` varchar(64) NOT NULL, \`name\` varchar(200) NOT NULL, \`description\` text NOT NULL, \`score_label\` varchar(200) NOT NULL, \`score_unit\` varchar(60) NOT NULL, \`score_min\` double NOT NULL, \`score_max\` double NOT NULL, \`eligible_side\` enum ('at-or-above', 'at-or-below') NOT NULL, \`time_zone\` varchar(64) NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_program_slug\` (\`slug\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`cohort\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`program_id\` int UNSIGNED NOT NULL, \`period\` char(7) NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_cohort_program_period\` (\`program_id\`, \`period\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`covariate_definition\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`program_id\` int UNSIGNED NOT NULL, \`key\` varchar(64) NOT NULL, \`label\` varchar(200) NOT NULL, \`unit\` varchar(60) NOT NULL, \`kind\` enum ('binary', 'continuous') NOT NULL, \`position\` smallint UNSIGNED NOT NULL, UNIQUE INDEX \`uq_covariate_definition_program_key\` (\`program_id\`, \`key\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`cutoff_change\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`program_id\` int UNSIGNED NOT NULL, \`cutoff\` double NOT NULL, \`first_period\` char(7) NOT NULL, UNIQUE INDEX \`uq_cutoff_change_program_period\` (\`program_id\`, \`first_period\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`outcome_definition\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`program_id\` int UNSIGNED NOT NULL, \`key\` varchar(64) NOT NULL, \`label\` varchar(200) NOT NULL, \`unit\` varchar(60) NOT NULL, \`kind\` enum ('binary', 'continuous') NOT NULL, \`good_direction\` enum ('higher', 'lower') NOT NULL, \`position\` smallint UNSIGNED NOT NULL, UNIQUE INDEX \`uq_outcome_definition_program_key\` (\`program_id\`, \`key\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`ALTER TABLE \`cohort\` ADD CONSTRAINT \`fk_cohort_program\` FOREIGN KEY (\`program_id\`) REFERENCES \`program\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
    await queryRunner.query(`ALTER TABLE \`covariate_definition\` ADD CONSTRAINT \`fk_covariate_definition_program\` FOREIGN KEY (\`program_id\`) REFERENCES \`program\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
    await queryRunner.query(`ALTER TABLE \`cutoff_change\` ADD CONSTRAINT \`fk_cutoff_change_program\` FOREIGN KEY (\`program_id\`) REFERENCES \`program\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
    await queryRunner.query(`ALTER TABLE \`outcome_definition\` ADD CONSTRAINT \`fk_outcome_definition_program\` FOREIGN KEY (\`program_id\`) REFERENCES \`program\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE \`outcome_definition\` DROP FOREIGN KEY \`fk_outcome_definition_program\``);
    await queryRunner.query(`ALTER TABLE \`cutoff_change\` DROP FOREIGN KEY \`fk_cutoff_change_program\``);
    await queryRunner.query(`ALTER TABLE \`covariate_definition\` DROP FOREIGN KEY \`fk_covariate_definition_program\``);
    await queryRunner.query(`ALTER TABLE \`cohort\` DROP FOREIGN KEY \`fk_cohort_program\``);
    await queryRunner.query(`DROP INDEX \`uq_outcome_definition_program_key\` ON \`outcome_definition\``);
    await queryRunner.query(`DROP TABLE \`outcome_definition\``);
    await queryRunner.query(`DROP INDEX \`uq_cutoff_change_program_period\` ON \`cutoff_change\``);
    await queryRunner.query(`DROP TABLE \`cutoff_change\``);
    await queryRunner.query(`DROP INDEX \`uq_covariate_definition_program_key\` ON \`covariate_definition\``);
    await queryRunner.query(`DROP TABLE \`covariate_definition\``);
    await queryRunner.query(`DROP INDEX \`uq_cohort_program_period\` ON \`cohort\``);
    await queryRunner.query(`DROP TABLE \`cohort\``);
    await queryRunner.query(`DROP INDEX \`uq_program_slug\` ON \`program\``);
    await queryRunner.query(`DROP TABLE \`program\``);
  }
}
