import type { MigrationInterface, QueryRunner } from 'typeorm'
import { analysePathData } from '../services/path-analysis'

/**
 * The library: tags, trash, source and font metadata on paths; normalised segments,
 * counts, bounds and diagnostics stored with every revision (existing revisions are
 * analysed by the geometry core here).
 */
export class Library1764720000000 implements MigrationInterface {
  name = 'Library1764720000000'

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE \`paths\`
      ADD \`source_file\` varchar(255) NULL,
      ADD \`metadata\` longtext NULL,
      ADD \`segment_count\` int UNSIGNED NOT NULL DEFAULT 0,
      ADD \`warning_count\` int UNSIGNED NOT NULL DEFAULT 0,
      ADD \`deleted_at\` datetime(3) NULL,
      ADD INDEX \`IDX_paths_project_deleted\` (\`project_id\`, \`deleted_at\`)`)
    await q.query(`ALTER TABLE \`revisions\`
      ADD \`segments\` mediumtext NULL,
      ADD \`segment_count\` int UNSIGNED NOT NULL DEFAULT 0,
      ADD \`count_line\` int UNSIGNED NOT NULL DEFAULT 0,
      ADD \`count_quadratic\` int UNSIGNED NOT NULL DEFAULT 0,
      ADD \`count_cubic\` int UNSIGNED NOT NULL DEFAULT 0,
      ADD \`count_arc\` int UNSIGNED NOT NULL DEFAULT 0,
      ADD \`bbox_min_x\` double NULL,
      ADD \`bbox_min_y\` double NULL,
      ADD \`bbox_max_x\` double NULL,
      ADD \`bbox_max_y\` double NULL,
      ADD \`diagnostics\` mediumtext NULL`)
    await q.query(`CREATE TABLE \`path_tags\` (
      \`path_id\` int UNSIGNED NOT NULL,
      \`tag\` varchar(40) NOT NULL,
      INDEX \`IDX_path_tags_tag\` (\`tag\`),
      PRIMARY KEY (\`path_id\`, \`tag\`),
      CONSTRAINT \`FK_path_tags_path\` FOREIGN KEY (\`path_id\`) REFERENCES \`paths\` (\`id\`) ON DELETE CASCADE ON UPDATE NO ACTION
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`)

    const revisions = (await q.query('SELECT id, data FROM revisions')) as Array<{ id: number; data: string }>
    for (const r of revisions) {
      const result = analysePathData(r.data)
      if (!result.ok) continue
      const a = result.analysis
      await q.query(
        `UPDATE revisions SET segments = ?, segment_count = ?, count_line = ?, count_quadratic = ?, count_cubic = ?, count_arc = ?,
           bbox_min_x = ?, bbox_min_y = ?, bbox_max_x = ?, bbox_max_y = ?, diagnostics = ? WHERE id = ?`,
        [JSON.stringify(a.path.segments), a.segments, a.counts.line, a.counts.quadratic, a.counts.cubic, a.counts.arc, ...(a.bbox ?? [null, null, null, null]), JSON.stringify(a.diagnostics), r.id],
      )
    }
    await q.query(`UPDATE paths p JOIN revisions r ON r.id = p.current_revision_id
      SET p.segment_count = r.segment_count, p.warning_count = JSON_LENGTH(COALESCE(r.diagnostics, '[]'))`)
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query('DROP TABLE `path_tags`')
    await q.query(`ALTER TABLE \`revisions\` DROP \`segments\`, DROP \`segment_count\`, DROP \`count_line\`, DROP \`count_quadratic\`,
      DROP \`count_cubic\`, DROP \`count_arc\`, DROP \`bbox_min_x\`, DROP \`bbox_min_y\`, DROP \`bbox_max_x\`, DROP \`bbox_max_y\`, DROP \`diagnostics\``)
    await q.query(`ALTER TABLE \`paths\` DROP INDEX \`IDX_paths_project_deleted\`, DROP \`source_file\`, DROP \`metadata\`,
      DROP \`segment_count\`, DROP \`warning_count\`, DROP \`deleted_at\``)
  }
}
