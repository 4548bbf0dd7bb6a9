import type { MigrationInterface, QueryRunner } from 'typeorm';

export class AddDesignsRunsResultsMail1796182794875 implements MigrationInterface {
  name = 'AddDesignsRunsResultsMail1796182794875';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE \`caveat_acknowledgement\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`program_id\` int UNSIGNED NOT NULL, \`design_id\` int UNSIGNED NOT NULL, \`scope_key\` varchar(40) NOT NULL, \`outcome_key\` varchar(64) NOT NULL, \`caveat_code\` varchar(64) NOT NULL, \`result_id\` int UNSIGNED NOT NULL, \`comment\` text NOT NULL, \`acknowledged_by_user_id\` int UNSIGNED NULL, \`acknowledged_by_label\` varchar(200) NOT NULL, \`acknowledged_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`idx_caveat_acknowledgement_scope\` (\`design_id\`, \`scope_key\`, \`outcome_key\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`evaluation_design\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`program_id\` int UNSIGNED NOT NULL, \`name\` varchar(200) NOT NULL, \`primary_of_program_id\` int UNSIGNED NULL, \`current_version\` int UNSIGNED NOT NULL, \`locked_at\` datetime(3) NULL, \`locked_by_user_id\` int UNSIGNED NULL, \`locked_by_label\` varchar(200) NULL, \`locked_version\` int UNSIGNED NULL, \`lock_note\` text NULL, \`periods_seen_before_lock\` json NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_evaluation_design_primary\` (\`primary_of_program_id\`), INDEX \`idx_evaluation_design_program\` (\`program_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`design_deviation\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`design_id\` int UNSIGNED NOT NULL, \`from_version\` int UNSIGNED NOT NULL, \`to_version\` int UNSIGNED NOT NULL, \`reason\` text NOT NULL, \`changed\` json NOT NULL, \`recorded_by_user_id\` int UNSIGNED NULL, \`recorded_by_label\` varchar(200) NOT NULL, \`recorded_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`idx_design_deviation_design\` (\`design_id\`, \`to_version\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`design_version\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`design_id\` int UNSIGNED NOT NULL, \`version\` int UNSIGNED NOT NULL, \`settings\` json NOT NULL, \`reason\` text NULL, \`created_by_user_id\` int UNSIGNED NULL, \`created_by_label\` varchar(200) NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_design_version_design_version\` (\`design_id\`, \`version\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`email_message\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`kind\` enum ('director-summary') NOT NULL, \`user_id\` int UNSIGNED NULL, \`subscription_id\` int UNSIGNED NULL, \`to_address\` varchar(254) NOT NULL, \`subject\` varchar(300) NOT NULL, \`message_id\` varchar(200) NOT NULL, \`status\` enum ('sent', 'failed') NOT NULL, \`error\` text NULL, \`program_ids\` json NOT NULL, \`html\` mediumtext NOT NULL, \`text\` mediumtext NOT NULL, \`sent_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_email_message_message_id\` (\`message_id\`), INDEX \`idx_email_message_sent\` (\`sent_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`estimate_result\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`program_id\` int UNSIGNED NOT NULL, \`design_id\` int UNSIGNED NOT NULL, \`design_version_id\` int UNSIGNED NOT NULL, \`design_version\` int UNSIGNED NOT NULL, \`scope_key\` varchar(40) NOT NULL, \`scope_kind\` enum ('cohort', 'window') NOT NULL, \`first_period\` char(7) NOT NULL, \`last_period\` char(7) NOT NULL, \`outcome_key\` varchar(64) NOT NULL, \`status\` enum ('ok', 'not-estimable') NOT NULL, \`scope\` json NOT NULL, \`figures\` json NOT NULL, \`caveats\` json NOT NULL, \`provenance\` json NOT NULL, \`input_signature\` char(64) NOT NULL, \`run_id\` int UNSIGNED NOT NULL, \`computed_at\` datetime(3) NOT NULL, \`stale\` tinyint NOT NULL DEFAULT 0, \`stale_reason\` varchar(300) NULL, \`pre_registered\` tinyint NOT NULL DEFAULT 0, INDEX \`idx_estimate_result_program\` (\`program_id\`, \`scope_kind\`, \`last_period\`), UNIQUE INDEX \`uq_estimate_result_scope\` (\`design_id\`, \`scope_key\`, \`outcome_key\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`estimate_result_detail\` (\`result_id\` int UNSIGNED NOT NULL, \`diagnostics\` json NULL, \`bins\` json NOT NULL, PRIMARY KEY (\`result_id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`recompute_run\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`program_id\` int UNSIGNED NOT NULL, \`queued_program_id\` int UNSIGNED NULL, \`design_id\` int UNSIGNED NULL, \`trigger\` enum ('extract-accepted', 'nightly', 'on-demand', 'design-changed') NOT NULL, \`requested_by_user_id\` int UNSIGNED NULL, \`requested_by_label\` varchar(200) NOT NULL, \`status\` enum ('queued', 'running', 'succeeded', 'up-to-date', 'failed') NOT NULL, \`attempts\` smallint UNSIGNED NOT NULL DEFAULT '0', \`max_attempts\` smallint UNSIGNED NOT NULL, \`next_attempt_at\` datetime(3) NOT NULL, \`requested_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`started_at\` datetime(3) NULL, \`finished_at\` datetime(3) NULL, \`duration_ms\` int UNSIGNED NULL, \`progress_done\` int UNSIGNED NOT NULL DEFAULT '0', \`progress_total\` int UNSIGNED NOT NULL DEFAULT '0', \`progress_current\` varchar(40) NULL, \`results_written\` int UNSIGNED NOT NULL DEFAULT '0', \`error_code\` varchar(64) NULL, \`error_message\` text NULL, UNIQUE INDEX \`uq_recompute_run_queued\` (\`queued_program_id\`), INDEX \`idx_recompute_run_status\` (\`status\`, \`next_attempt_at\`), INDEX \`idx_recompute_run_program_requested\` (\`program_id\`, \`requested_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`CREATE TABLE \`summary_subscription\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`user_id\` int UNSIGNED NOT NULL, \`paused\` tinyint NOT NULL DEFAULT 0, \`schedule\` json NOT NULL, \`program_ids\` json NOT NULL, \`attach_annex\` tinyint NOT NULL DEFAULT 0, \`last_due_at\` datetime(3) NULL, \`last_sent_at\` datetime(3) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_summary_subscription_user\` (\`user_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
    await queryRunner.query(`ALTER TABLE \`evaluation_design\` ADD CONSTRAINT \`fk_evaluation_design_program\` FOREIGN KEY (\`program_id\`) REFERENCES \`program\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
    await queryRunner.query(`ALTER TABLE \`design_deviation\` ADD CONSTRAINT \`fk_design_deviation_design\` FOREIGN KEY (\`design_id\`) REFERENCES \`evaluation_design\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
    await queryRunner.query(`ALTER TABLE \`design_version\` ADD CONSTRAINT \`fk_design_version_design\` FOREIGN KEY (\`design_id\`) REFERENCES \`evaluation_design\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
    await queryRunner.query(`ALTER TABLE \`estimate_result\` ADD CONSTRAINT \`fk_estimate_result_design\` FOREIGN KEY (\`design_id\`) REFERENCES \`evaluation_design\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
    await queryRunner.query(`ALTER TABLE \`estimate_result_detail\` ADD CONSTRAINT \`fk_estimate_result_detail_result\` FOREIGN KEY (\`result_id\`) REFERENCES \`estimate_result\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
    await queryRunner.query(`ALTER TABLE \`recompute_run\` ADD CONSTRAINT \`fk_recompute_run_program\` FOREIGN KEY (\`program_id\`) REFERENCES \`program\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
    await queryRunner.query(`ALTER TABLE \`summary_subscription\` ADD CONSTRAINT \`fk_summary_subscription_user\` FOREIGN KEY (\`user_id\`) REFERENCES \`app_user\`(\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE \`summary_subscription\` DROP FOREIGN KEY \`fk_summary_subscription_user\``);
    await queryRunner.query(`ALTER TABLE \`recompute_run\` DROP FOREIGN KEY \`fk_recompute_run_program\``);
    await queryRunner.query(`ALTER TABLE \`estimate_result_detail\` DROP FOREIGN KEY \`fk_estimate_result_detail_result\``);
    await queryRunner.query(`ALTER TABLE \`estimate_result\` DROP FOREIGN KEY \`fk_estimate_result_design\``);
    await queryRunner.query(`ALTER TABLE \`design_version\` DROP FOREIGN KEY \`fk_design_version_design\``);
    await queryRunner.query(`ALTER TABLE \`design_deviation\` DROP FOREIGN KEY \`fk_design_deviation_design\``);
    await queryRunner.query(`ALTER TABLE \`evaluation_design\` DROP FOREIGN KEY \`fk_evaluation_design_program\``);
    await queryRunner.query(`DROP INDEX \`uq_summary_subscription_user\` ON \`summary_subscription\``);
    await queryRunner.query(`DROP TABLE \`summary_subscription\``);
    await queryRunner.query(`DROP INDEX \`idx_recompute_run_program_requested\` ON \`recompute_run\``);
    await queryRunner.query(`DROP INDEX \`idx_recompute_run_status\` ON \`recompute_run\``);
    await queryRunner.query(`DROP INDEX \`uq_recompute_run_queued\` ON \`recompute_run\``);
    await queryRunner.query(`DROP TABLE \`recompute_run\``);
    await queryRunner.query(`DROP TABLE \`estimate_result_detail\``);
    await queryRunner.query(`DROP INDEX \`uq_estimate_result_scope\` ON \`estimate_result\``);
    await queryRunner.query(`DROP INDEX \`idx_estimate_result_program\` ON \`estimate_result\``);
    await queryRunner.query(`DROP TABLE \`estimate_result\``);
    await queryRunner.query(`DROP INDEX \`idx_email_message_sent\` ON \`email_message\``);
    await queryRunner.query(`DROP INDEX \`uq_email_message_message_id\` ON \`email_message\``);
    await queryRunner.query(`DROP TABLE \`email_message\``);
    await queryRunner.query(`DROP INDEX \`uq_design_version_design_version\` ON \`design_version\``);
    await queryRunner.query(`DROP TABLE \`design_version\``);
    await queryRunner.query(`DROP INDEX \`idx_design_deviation_design\` ON \`design_deviation\``);
    await queryRunner.query(`DROP TABLE \`design_deviation\``);
    await queryRunner.query(`DROP INDEX \`idx_evaluation_design_program\` ON \`evaluation_design\``);
    await queryRunner.query(`DROP INDEX \`uq_evaluation_design_primary\` ON \`evaluation_design\``);
    await queryRunner.query(`DROP TABLE \`evaluation_design\``);
    await queryRunner.query(`DROP INDEX \`idx_caveat_acknowledgement_scope\` ON \`caveat_acknowledgement\``);
    await queryRunner.query(`DROP TABLE \`caveat_acknowledgement\``);
  }
}
