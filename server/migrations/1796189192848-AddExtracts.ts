import type { MigrationInterface, QueryRunner } from 'typeorm';

export class AddExtracts1796189192848 implements MigrationInterface {
  name = 'AddExtracts1796189192848';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE \`cluster_code\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`program_id\` int UNSIGNED NOT NULL, \`value_hash\` binary(32) NOT NULL, UNIQUE INDEX \`uq_cluster_code_program_hash\` (\`program_id\`, \`value_hash\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`extract_source\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`program_id\` int UNSIGNED NOT NULL, \`name\` varchar(120) NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_extract_source_program_name\` (\`program_id\`, \`name\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`extract\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`program_id\` int UNSIGNED NOT NULL, \`source_id\` int UNSIGNED NULL, \`period\` char(7) NOT NULL, \`status\` enum ('uploaded', 'validating', 'awaiting-decision', 'loading', 'accepted', 'rejected', 'failed', 'superseded') NOT NULL, \`format\` enum ('csv', 'xlsx') NOT NULL, \`file_name\` varchar(255) NOT NULL, \`byte_size\` bigint UNSIGNED NOT NULL, \`sha256\` char(64) NOT NULL, \`sheet\` varchar(100) NULL, \`delimiter\` varchar(1) NULL, \`columns\` json NOT NULL, \`header_fingerprint\` char(64) NOT NULL, \`mapping\` json NULL, \`mapping_origin\` enum ('saved', 'entered') NULL, \`slots\` json NULL, \`report\` json NULL, \`rows_read\` int UNSIGNED NULL, \`rows_accepted\` int UNSIGNED NULL, \`rows_rejected\` int UNSIGNED NULL, \`problem_code\` varchar(60) NULL, \`problem_message\` varchar(1000) NULL, \`progress\` json NULL, \`attempts\` smallint UNSIGNED NOT NULL DEFAULT '0', \`uploaded_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`uploaded_by_user_id\` int UNSIGNED NULL, \`uploaded_by_label\` varchar(200) NOT NULL, \`decided_at\` datetime(3) NULL, \`decided_by_user_id\` int UNSIGNED NULL, \`decided_by_label\` varchar(200) NULL, \`decision_note\` varchar(500) NULL, \`accepted_at\` datetime(3) NULL, \`superseded_by_id\` int UNSIGNED NULL, \`superseded_at\` datetime(3) NULL, \`observations_purged_at\` datetime(3) NULL, \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), INDEX \`idx_extract_status\` (\`status\`), INDEX \`idx_extract_program_uploaded\` (\`program_id\`, \`uploaded_at\`), INDEX \`idx_extract_program_sha256\` (\`program_id\`, \`sha256\`), INDEX \`idx_extract_program_period_status\` (\`program_id\`, \`period\`, \`status\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`extract_rejected_row\` (\`extract_id\` int UNSIGNED NOT NULL, \`line\` int UNSIGNED NOT NULL, \`column_name\` varchar(200) NULL, \`code\` varchar(60) NOT NULL, \`reason\` varchar(300) NOT NULL, \`value\` varchar(100) NULL, PRIMARY KEY (\`extract_id\`, \`line\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`observation\` (\`extract_id\` int UNSIGNED NOT NULL, \`row_no\` int UNSIGNED NOT NULL, \`subject_hash\` binary(32) NOT NULL, \`score\` double NOT NULL, \`take_up\` tinyint UNSIGNED NULL, \`cluster_code\` int UNSIGNED NULL, \`o1\` double NULL, \`o2\` double NULL, \`o3\` double NULL, \`o4\` double NULL, \`o5\` double NULL, \`o6\` double NULL, \`o7\` double NULL, \`o8\` double NULL, \`c1\` double NULL, \`c2\` double NULL, \`c3\` double NULL, \`c4\` double NULL, \`c5\` double NULL, \`c6\` double NULL, \`c7\` double NULL, \`c8\` double NULL, PRIMARY KEY (\`extract_id\`, \`row_no\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`saved_mapping\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`program_id\` int UNSIGNED NOT NULL, \`source_id\` int UNSIGNED NOT NULL, \`header_fingerprint\` char(64) NOT NULL, \`columns\` json NOT NULL, \`mapping\` json NOT NULL, \`saved_by_label\` varchar(200) NOT NULL, \`saved_by_user_id\` int UNSIGNED NULL, \`saved_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), INDEX \`idx_saved_mapping_program_fingerprint\` (\`program_id\`, \`header_fingerprint\`), UNIQUE INDEX \`uq_saved_mapping_source_fingerprint\` (\`source_id\`, \`header_fingerprint\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`ALTER TABLE \`program\` ADD \`max_rejected_share\` decimal(5,4) NOT NULL DEFAULT '0.0200'`);
    await queryRunner.query(`ALTER TABLE \`program\` ADD \`retention_months\` smallint UNSIGNED NOT NULL DEFAULT '36'`);
    await queryRunner.query(`ALTER TABLE \`extract_source\` ADD CONSTRAINT \`fk_extract_source_program\` FOREIGN KEY (\`program_id\`) REFERENCES \`program\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
    await queryRunner.query(`ALTER TABLE \`extract\` ADD CONSTRAINT \`fk_extract_program\` FOREIGN KEY (\`program_id\`) REFERENCES \`program\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
    await queryRunner.query(`ALTER TABLE \`extract\` ADD CONSTRAINT \`fk_extract_source\` FOREIGN KEY (\`source_id\`) REFERENCES \`extract_source\`(\`id\`) ON DELETE SET NULL ON UPDATE NO ACTION`);
    await queryRunner.query(`ALTER TABLE \`saved_mapping\` ADD CONSTRAINT \`fk_saved_mapping_source\` FOREIGN KEY (\`source_id\`) REFERENCES \`extract_source\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE \`saved_mapping\` DROP FOREIGN KEY \`fk_saved_mapping_source\``);
    await queryRunner.query(`ALTER TABLE \`extract\` DROP FOREIGN KEY \`fk_extract_source\``);
    await queryRunner.query(`ALTER TABLE \`extract\` DROP FOREIGN KEY \`fk_extract_program\``);
    await queryRunner.query(`ALTER TABLE \`extract_source\` DROP FOREIGN KEY \`fk_extract_source_program\``);
    await queryRunner.query(`ALTER TABLE \`program\` DROP COLUMN \`retention_months\``);
    await queryRunner.query(`ALTER TABLE \`program\` DROP COLUMN \`max_rejected_share\``);
    await queryRunner.query(`DROP INDEX \`uq_saved_mapping_source_fingerprint\` ON \`saved_mapping\``);
    await queryRunner.query(`DROP INDEX \`idx_saved_mapping_program_fingerprint\` ON \`saved_mapping\``);
    await queryRunner.query(`DROP TABLE \`saved_mapping\``);
    await queryRunner.query(`DROP TABLE \`observation\``);
    await queryRunner.query(`DROP TABLE \`extract_rejected_row\``);
    await queryRunner.query(`DROP INDEX \`idx_extract_program_period_status\` ON \`extract\``);
    await queryRunner.query(`DROP INDEX \`idx_extract_program_sha256\` ON \`extract\``);
    await queryRunner.query(`DROP INDEX \`idx_extract_program_uploaded\` ON \`extract\``);
    await queryRunner.query(`DROP INDEX \`idx_extract_status\` ON \`extract\``);
    await queryRunner.query(`DROP TABLE \`extract\``);
    await queryRunner.query(`DROP INDEX \`uq_extract_source_program_name\` ON \`extract_source\``);
    await queryRunner.query(`DROP TABLE \`extract_source\``);
    await queryRunner.query(`DROP INDEX \`uq_cluster_code_program_hash\` ON \`cluster_code\``);
    await queryRunner.query(`DROP TABLE \`cluster_code\``);
  }
}
