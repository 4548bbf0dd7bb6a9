import type { MigrationInterface, QueryRunner } from 'typeorm';

export class AddAuditTrail1796181110234 implements MigrationInterface {
  name = 'AddAuditTrail1796181110234';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE \`audit_event\` (\`id\` bigint UNSIGNED NOT NULL AUTO_INCREMENT, \`occurred_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`actor_user_id\` int UNSIGNED NULL, \`actor_label\` varchar(200) NOT NULL, \`action\` enum ('auth.sign-in', 'auth.sign-out', 'auth.sign-in-refused', 'grant.add', 'grant.revoke', 'user.update', 'program.create', 'program.update', 'extract.upload', 'extract.accept', 'extract.reject', 'extract.supersede', 'extract.restore', 'observations.purge', 'mapping.save', 'design.create', 'design.version', 'design.lock', 'design.deviation', 'run.trigger', 'caveat.acknowledge', 'annex.download', 'export.download', 'email.send', 'subscription.update') NOT NULL, \`program_id\` int UNSIGNED NULL, \`subject_type\` varchar(40) NULL, \`subject_id\` varchar(64) NULL, \`details\` json NOT NULL, INDEX \`idx_audit_event_time\` (\`occurred_at\`), INDEX \`idx_audit_event_program_time\` (\`program_id\`, \`occurred_at\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX \`idx_audit_event_program_time\` ON \`audit_event\``);
    await queryRunner.query(`DROP INDEX \`idx_audit_event_time\` ON \`audit_event\``);
    await queryRunner.query(`DROP TABLE \`audit_event\``);
  }
}
