import type { MigrationInterface, QueryRunner } from 'typeorm';

export class AddSignIn1796181746557 implements MigrationInterface {
  name = 'AddSignIn1796181746557';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE \`http_session\` (\`session_id\` varchar(128) COLLATE "utf8mb4_bin" NOT NULL, \`expires\` int UNSIGNED NOT NULL, \`data\` mediumtext COLLATE "utf8mb4_bin" NULL, INDEX \`idx_http_session_expires\` (\`expires\`), PRIMARY KEY (\`session_id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`app_user\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`email\` varchar(254) NOT NULL, \`display_name\` varchar(200) NOT NULL, \`name_id\` varchar(255) NULL, \`active\` tinyint NOT NULL DEFAULT 1, \`last_sign_in_at\` datetime(3) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_app_user_email\` (\`email\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`role_grant\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`user_id\` int UNSIGNED NOT NULL, \`role\` enum ('admin', 'analyst', 'manager', 'evaluator', 'director') NOT NULL, \`program_id\` int UNSIGNED NULL, \`source\` enum ('admin', 'group') NOT NULL, \`group_name\` varchar(255) NULL, \`granted_by_user_id\` int UNSIGNED NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`idx_role_grant_program\` (\`program_id\`), INDEX \`idx_role_grant_user\` (\`user_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`saml_request\` (\`id\` varchar(128) COLLATE "utf8mb4_bin" NOT NULL, \`created_at\` datetime(3) NOT NULL, INDEX \`idx_saml_request_created\` (\`created_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`used_assertion\` (\`id_hash\` char(64) NOT NULL, \`expires_at\` datetime(3) NOT NULL, INDEX \`idx_used_assertion_expires\` (\`expires_at\`), PRIMARY KEY (\`id_hash\`)) ENGINE=InnoDB`);
    await queryRunner.query(`ALTER TABLE \`role_grant\` ADD CONSTRAINT \`fk_role_grant_user\` FOREIGN KEY (\`user_id\`) REFERENCES \`app_user\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
    await queryRunner.query(`ALTER TABLE \`role_grant\` ADD CONSTRAINT \`fk_role_grant_program\` FOREIGN KEY (\`program_id\`) REFERENCES \`program\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE \`role_grant\` DROP FOREIGN KEY \`fk_role_grant_program\``);
    await queryRunner.query(`ALTER TABLE \`role_grant\` DROP FOREIGN KEY \`fk_role_grant_user\``);
    await queryRunner.query(`DROP INDEX \`idx_used_assertion_expires\` ON \`used_assertion\``);
    await queryRunner.query(`DROP TABLE \`used_assertion\``);
    await queryRunner.query(`DROP INDEX \`idx_saml_request_created\` ON \`saml_request\``);
    await queryRunner.query(`DROP TABLE \`saml_request\``);
    await queryRunner.query(`DROP INDEX \`idx_role_grant_user\` ON \`role_grant\``);
    await queryRunner.query(`DROP INDEX \`idx_role_grant_program\` ON \`role_grant\``);
    await queryRunner.query(`DROP TABLE \`role_grant\``);
    await queryRunner.query(`DROP INDEX \`uq_app_user_email\` ON \`app_user\``);
    await queryRunner.query(`DROP TABLE \`app_user\``);
    await queryRunner.query(`DROP INDEX \`idx_http_session_expires\` ON \`http_session\``);
    await queryRunner.query(`DROP TABLE \`http_session\``);
  }
}
