import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Password reset links: the SHA-256 of each token (unique), never the token; they go with their person. */
export class PasswordResets1764979300000 implements MigrationInterface {
  name = 'PasswordResets1764979300000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE \`password_resets\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`user_id\` int UNSIGNED NOT NULL,
      \`token_hash\` char(64) NOT NULL,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      \`expires_at\` datetime(3) NOT NULL,
      \`used_at\` datetime(3) NULL,
      UNIQUE INDEX \`IDX_password_resets_hash\` (\`token_hash\`),
      INDEX \`IDX_password_resets_user\` (\`user_id\`),
      PRIMARY KEY (\`id\`),
      CONSTRAINT \`FK_password_resets_user\` FOREIGN KEY (\`user_id\`) REFERENCES \`users\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE `password_resets`')
  }
}
