import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Accounts, teams, projects, paths with revisions, and the session store's table. */
export class Initial1764633600000 implements MigrationInterface {
  name = 'Initial1764633600000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE \`users\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`email\` varchar(254) NOT NULL,
      \`display_name\` varchar(120) NOT NULL,
      \`password_hash\` varchar(100) NOT NULL,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      \`last_active_at\` datetime(3) NULL,
      UNIQUE INDEX \`IDX_users_email\` (\`email\`),
      PRIMARY KEY (\`id\`)
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
    await q.query(`CREATE TABLE \`teams\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`name\` varchar(120) NOT NULL,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      PRIMARY KEY (\`id\`)
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
    await q.query(`CREATE TABLE \`memberships\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`team_id\` int UNSIGNED NOT NULL,
      \`user_id\` int UNSIGNED NOT NULL,
      \`role\` enum ('owner', 'editor', 'viewer') NOT NULL,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      UNIQUE INDEX \`IDX_memberships_team_user\` (\`team_id\`, \`user_id\`),
      PRIMARY KEY (\`id\`),
      CONSTRAINT \`FK_memberships_team\` FOREIGN KEY (\`team_id\`) REFERENCES \`teams\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION,
      CONSTRAINT \`FK_memberships_user\` FOREIGN KEY (\`user_id\`) REFERENCES \`users\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
    await q.query(`CREATE TABLE \`projects\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`team_id\` int UNSIGNED NOT NULL,
      \`name\` varchar(120) NOT NULL,
      \`description\` text NOT NULL,
      \`created_by_id\` int UNSIGNED NULL,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      INDEX \`IDX_projects_team_name\` (\`team_id\`, \`name\`),
      PRIMARY KEY (\`id\`),
      CONSTRAINT \`FK_projects_team\` FOREIGN KEY (\`team_id\`) REFERENCES \`teams\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION,
      CONSTRAINT \`FK_projects_created_by\` FOREIGN KEY (\`created_by_id\`) REFERENCES \`users\` (\`id\`) ON DELETE SET NULL ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
    await q.query(`CREATE TABLE \`paths\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`project_id\` int UNSIGNED NOT NULL,
      \`name\` varchar(200) NOT NULL,
      \`fill_rule\` enum ('nonzero', 'evenodd') NOT NULL DEFAULT 'nonzero',
      \`origin\` enum ('drawn', 'svg', 'font') NOT NULL DEFAULT 'drawn',
      \`units\` varchar(20) NOT NULL DEFAULT 'px',
      \`current_revision_id\` int UNSIGNED NULL,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      INDEX \`IDX_paths_project_name\` (\`project_id\`, \`name\`),
      PRIMARY KEY (\`id\`),
      CONSTRAINT \`FK_paths_project\` FOREIGN KEY (\`project_id\`) REFERENCES \`projects\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
    await q.query(`CREATE TABLE \`revisions\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`path_id\` int UNSIGNED NOT NULL,
      \`number\` int UNSIGNED NOT NULL,
      \`data\` mediumtext NOT NULL,
      \`message\` varchar(500) NOT NULL DEFAULT '',
      \`author_id\` int UNSIGNED NULL,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      UNIQUE INDEX \`IDX_revisions_path_number\` (\`path_id\`, \`number\`),
      PRIMARY KEY (\`id\`),
      CONSTRAINT \`FK_revisions_path\` FOREIGN KEY (\`path_id\`) REFERENCES \`paths\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION,
      CONSTRAINT \`FK_revisions_author\` FOREIGN KEY (\`author_id\`) REFERENCES \`users\` (\`id\`) ON DELETE SET NULL ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
    // Layout of express-mysql-session's own schema.sql; the store is told not to create it.
    await q.query(`CREATE TABLE \`sessions\` (
      \`session_id\` varchar(128) CHARACTER SET utf8mb4 COLLATE utf8mb4_bin NOT NULL,
      \`expires\` int UNSIGNED NOT NULL,
      \`data\` mediumtext CHARACTER SET utf8mb4 COLLATE utf8mb4_bin,
      PRIMARY KEY (\`session_id\`)
    ) ENGINE=InnoDB`)
  }

  async down(q: QueryRunner): Promise<void> {
    for (const table of ['sessions', 'revisions', 'paths', 'projects', 'memberships', 'teams', 'users']) {
      await q.query(`DROP TABLE \`${table}\``)
    }
  }
}
