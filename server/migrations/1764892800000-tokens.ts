import type { MigrationInterface, QueryRunner } from 'typeorm'

/** Personal API tokens: the SHA-256 of each secret (unique), never the secret; they go with their person. */
export class Tokens1764892800000 implements MigrationInterface {
  name = 'Tokens1764892800000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE \`api_tokens\` (
      \`id\` int UNSIGNED NOT NULL AUTO_INCREMENT,
      \`user_id\` int UNSIGNED NOT NULL,
      \`name\` varchar(80) NOT NULL,
      \`token_hash\` char(64) NOT NULL,
      \`prefix\` varchar(10) NOT NULL,
      \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      \`expires_at\` datetime(3) NOT NULL,
      \`last_used_at\` datetime(3) NULL,
      \`revoked_at\` datetime(3) NULL,
      UNIQUE INDEX \`IDX_api_tokens_hash\` (\`token_hash\`),
      INDEX \`IDX_api_tokens_user_created\` (\`user_id\`, \`created_at\`),
      PRIMARY KEY (\`id\`),
      CONSTRAINT \`FK_api_tokens_user\` FOREIGN KEY (\`user_id\`) REFERENCES \`users\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE `api_tokens`')
  }
}
