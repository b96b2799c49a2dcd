import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Suites of checks and their runs. Suites go with their project, checks with their suite
 * and with their path, runs with their suite, results with their run. A result keeps its
 * check's id and name without a foreign key, so the history outlives a deleted check.
 */
export class Suites1764892900000 implements MigrationInterface {
  name = 'Suites1764892900000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE \`suites\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`project_id\` int UNSIGNED NOT NULL,
      \`name\` varchar(120) NOT NULL,
      \`description\` varchar(500) NOT NULL DEFAULT '',
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      UNIQUE INDEX \`IDX_suites_project_name\` (\`project_id\`, \`name\`),
      PRIMARY KEY (\`id\`),
      CONSTRAINT \`FK_suites_project\` FOREIGN KEY (\`project_id\`) REFERENCES \`projects\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
    await q.query(`CREATE TABLE \`checks\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`suite_id\` int UNSIGNED NOT NULL,
      \`path_id\` int UNSIGNED NOT NULL,
      \`name\` varchar(120) NOT NULL,
      \`revision\` int UNSIGNED NOT NULL,
      \`follow\` enum('latest', 'pinned') NOT NULL DEFAULT 'latest',
      \`probes\` mediumtext NOT NULL,
      \`sweeps\` mediumtext NOT NULL,
      \`expected\` longtext NOT NULL,
      \`tolerance_point\` double NOT NULL,
      \`tolerance_t\` double NOT NULL,
      \`match_kinds\` tinyint NOT NULL DEFAULT 1,
      \`match_winding\` tinyint NOT NULL DEFAULT 1,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      UNIQUE INDEX \`IDX_checks_suite_name\` (\`suite_id\`, \`name\`),
      PRIMARY KEY (\`id\`),
      CONSTRAINT \`FK_checks_suite\` FOREIGN KEY (\`suite_id\`) REFERENCES \`suites\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION,
      CONSTRAINT \`FK_checks_path\` FOREIGN KEY (\`path_id\`) REFERENCES \`paths\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
    await q.query(`CREATE TABLE \`runs\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`suite_id\` int UNSIGNED NOT NULL,
      \`number\` int UNSIGNED NOT NULL,
      \`verdict\` enum('passed', 'failed') NOT NULL,
      \`passed\` int UNSIGNED NOT NULL,
      \`failed\` int UNSIGNED NOT NULL,
      \`trigger_kind\` enum('screen', 'api') NOT NULL,
      \`user_id\` int UNSIGNED NULL,
      \`by_name\` varchar(120) NULL,
      \`started_at\` datetime(3) NOT NULL,
      \`finished_at\` datetime(3) NOT NULL,
      UNIQUE INDEX \`IDX_runs_suite_number\` (\`suite_id\`, \`number\`),
      PRIMARY KEY (\`id\`),
      CONSTRAINT \`FK_runs_suite\` FOREIGN KEY (\`suite_id\`) REFERENCES \`suites\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION,
      CONSTRAINT \`FK_runs_user\` FOREIGN KEY (\`user_id\`) REFERENCES \`users\` (\`id\`) ON DELETE SET NULL ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
    await q.query(`CREATE TABLE \`run_results\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`run_id\` int UNSIGNED NOT NULL,
      \`position\` int UNSIGNED NOT NULL,
      \`check_id\` int UNSIGNED NOT NULL,
      \`check_name\` varchar(120) NOT NULL,
      \`path_id\` int UNSIGNED NOT NULL,
      \`revision\` int UNSIGNED NOT NULL,
      \`verdict\` enum('passed', 'failed') NOT NULL,
      \`difference_count\` int UNSIGNED NOT NULL,
      \`differences\` longtext NOT NULL,
      \`error\` varchar(500) NULL,
      \`duration_ms\` double NOT NULL,
      INDEX \`IDX_run_results_check_run\` (\`check_id\`, \`run_id\`),
      INDEX \`IDX_run_results_run_position\` (\`run_id\`, \`position\`),
      PRIMARY KEY (\`id\`),
      CONSTRAINT \`FK_run_results_run\` FOREIGN KEY (\`run_id\`) REFERENCES \`runs\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
    await q.query(`CREATE TABLE \`suite_watchers\` (
      \`suite_id\` int UNSIGNED NOT NULL,
      \`user_id\` int UNSIGNED NOT NULL,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      PRIMARY KEY (\`suite_id\`, \`user_id\`),
      CONSTRAINT \`FK_suite_watchers_suite\` FOREIGN KEY (\`suite_id\`) REFERENCES \`suites\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION,
      CONSTRAINT \`FK_suite_watchers_user\` FOREIGN KEY (\`user_id\`) REFERENCES \`users\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
  }

  async down(q: QueryRunner): Promise<void> {
    for (const table of ['suite_watchers', 'run_results', 'runs', 'checks', 'suites']) await q.query(`DROP TABLE \`${table}\``)
  }
}
