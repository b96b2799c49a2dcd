import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Audits and their chunk aggregates. An audit goes with its project, its chunks with the
 * audit; the primary key (audit_id, chunk) keeps a chunk that is written twice one row.
 */
export class Audits1764893000000 implements MigrationInterface {
  name = 'Audits1764893000000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE \`audits\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`project_id\` int UNSIGNED NOT NULL,
      \`name\` varchar(120) NOT NULL,
      \`status\` enum ('queued', 'running', 'completed', 'cancelling', 'cancelled', 'failed') NOT NULL DEFAULT 'queued',
      \`options\` text NOT NULL,
      \`selection\` text NOT NULL,
      \`targets\` mediumtext NOT NULL,
      \`path_count\` int UNSIGNED NOT NULL,
      \`chunk_size\` int UNSIGNED NOT NULL,
      \`chunk_count\` int UNSIGNED NOT NULL,
      \`chunks_done\` int UNSIGNED NOT NULL DEFAULT 0,
      \`created_by\` int UNSIGNED NULL,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      \`started_at\` datetime(3) NULL,
      \`finished_at\` datetime(3) NULL,
      \`report\` mediumtext NULL,
      \`error\` varchar(1000) NULL,
      INDEX \`IDX_audits_project_created\` (\`project_id\`, \`created_at\`),
      PRIMARY KEY (\`id\`),
      CONSTRAINT \`FK_audits_project\` FOREIGN KEY (\`project_id\`) REFERENCES \`projects\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION,
      CONSTRAINT \`FK_audits_created_by\` FOREIGN KEY (\`created_by\`) REFERENCES \`users\` (\`id\`) ON DELETE SET NULL ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
    await q.query(`CREATE TABLE \`audit_chunks\` (
      \`audit_id\` int UNSIGNED NOT NULL,
      \`chunk\` int UNSIGNED NOT NULL,
      \`aggregate\` mediumtext NOT NULL,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      PRIMARY KEY (\`audit_id\`, \`chunk\`),
      CONSTRAINT \`FK_audit_chunks_audit\` FOREIGN KEY (\`audit_id\`) REFERENCES \`audits\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE `audit_chunks`')
    await q.query('DROP TABLE `audits`')
  }
}
