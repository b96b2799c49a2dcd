import type { MigrationInterface, QueryRunner } from 'typeorm'

/**
 * Invitations by e-mail: the SHA-256 of each link's secret (unique), never the secret; they
 * go with their team; the inviter and the accepting account are kept as long as they exist.
 * (users.last_active_at, shown on the Members tab, has been there since the first migration.)
 */
export class Invitations1764979200000 implements MigrationInterface {
  name = 'Invitations1764979200000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE \`invitations\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`team_id\` int UNSIGNED NOT NULL,
      \`email\` varchar(254) NOT NULL,
      \`role\` enum ('owner', 'editor', 'viewer') NOT NULL,
      \`token_hash\` char(64) NOT NULL,
      \`invited_by_id\` int UNSIGNED NULL,
      \`expires_at\` datetime(3) NOT NULL,
      \`accepted_at\` datetime(3) NULL,
      \`accepted_by_id\` int UNSIGNED NULL,
      \`revoked_at\` datetime(3) NULL,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      \`last_sent_at\` datetime(3) NOT NULL,
      UNIQUE INDEX \`IDX_invitations_hash\` (\`token_hash\`),
      INDEX \`IDX_invitations_team_email\` (\`team_id\`, \`email\`),
      PRIMARY KEY (\`id\`),
      CONSTRAINT \`FK_invitations_team\` FOREIGN KEY (\`team_id\`) REFERENCES \`teams\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION,
      CONSTRAINT \`FK_invitations_invited_by\` FOREIGN KEY (\`invited_by_id\`) REFERENCES \`users\` (\`id\`) ON DELETE SET NULL ON UPDATE NO ACTION,
      CONSTRAINT \`FK_invitations_accepted_by\` FOREIGN KEY (\`accepted_by_id\`) REFERENCES \`users\` (\`id\`) ON DELETE SET NULL ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE `invitations`')
  }
}
