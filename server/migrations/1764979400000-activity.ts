import type { MigrationInterface, QueryRunner } from 'typeorm'

const REFUSE = "SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'The activity log is append-only: entries are never changed or deleted.'"

/**
 * The activity log: append-only. Triggers refuse UPDATE and DELETE on every row. No foreign
 * keys on team_id or project_id (a cascade would need DELETE, and entries outlive the project
 * they tell about); the actor's key goes NULL with the account (foreign-key actions do not
 * fire triggers in MariaDB), actor_name stays.
 */
export class Activity1764979400000 implements MigrationInterface {
  name = 'Activity1764979400000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE \`activity\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`team_id\` int UNSIGNED NULL,
      \`project_id\` int UNSIGNED NULL,
      \`actor_id\` int UNSIGNED NULL,
      \`actor_name\` varchar(120) NOT NULL,
      \`via\` enum ('session', 'token', 'link') NOT NULL,
      \`action\` varchar(24) NOT NULL,
      \`target_type\` varchar(24) NOT NULL,
      \`target_id\` int UNSIGNED NULL,
      \`target_name\` varchar(200) NOT NULL,
      \`summary\` varchar(500) NOT NULL,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      INDEX \`IDX_activity_team_created\` (\`team_id\`, \`created_at\`),
      INDEX \`IDX_activity_project_created\` (\`project_id\`, \`created_at\`),
      PRIMARY KEY (\`id\`),
      CONSTRAINT \`FK_activity_actor\` FOREIGN KEY (\`actor_id\`) REFERENCES \`users\` (\`id\`) ON DELETE SET NULL ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
    await q.query(`CREATE TRIGGER \`activity_no_update\` BEFORE UPDATE ON \`activity\` FOR EACH ROW ${REFUSE}`)
    await q.query(`CREATE TRIGGER \`activity_no_delete\` BEFORE DELETE ON \`activity\` FOR EACH ROW ${REFUSE}`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TRIGGER IF EXISTS `activity_no_delete`')
    await q.query('DROP TRIGGER IF EXISTS `activity_no_update`')
    await q.query('DROP TABLE `activity`')
  }
}
