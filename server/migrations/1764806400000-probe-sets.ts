import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Probe sets: saved probes and sweeps over a path revision, named uniquely per project.
 * They go with their project and with their path (purging a path removes its sets).
 */
export class ProbeSets1764806400000 implements MigrationInterface {
  name = 'ProbeSets1764806400000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE \`probe_sets\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`project_id\` int UNSIGNED NOT NULL,
      \`path_id\` int UNSIGNED NOT NULL,
      \`revision\` int UNSIGNED NOT NULL,
      \`name\` varchar(120) NOT NULL,
      \`description\` varchar(500) NOT NULL DEFAULT '',
      \`probes\` mediumtext NOT NULL,
      \`sweeps\` mediumtext NOT NULL,
      \`author_id\` int UNSIGNED NULL,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      UNIQUE INDEX \`IDX_probe_sets_project_name\` (\`project_id\`, \`name\`),
      PRIMARY KEY (\`id\`),
      CONSTRAINT \`FK_probe_sets_project\` FOREIGN KEY (\`project_id\`) REFERENCES \`projects\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION,
      CONSTRAINT \`FK_probe_sets_path\` FOREIGN KEY (\`path_id\`) REFERENCES \`paths\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION,
      CONSTRAINT \`FK_probe_sets_author\` FOREIGN KEY (\`author_id\`) REFERENCES \`users\` (\`id\`) ON DELETE SET NULL ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE `probe_sets`')
  }
}
