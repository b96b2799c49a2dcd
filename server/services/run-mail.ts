import type { DataSource } from 'typeorm'
import type { RunDetail } from '../../shared/api/suites'
import { describeCheckOutcome } from '../../shared/checks/compare-hits'
import type { Mailer, MailMessage } from './mail.service'

/** Failed checks listed in one message; the run's page has the rest. */
const FAILED_CHECKS_LISTED = 50

/** The mail a watcher gets when a run fails: the verdict per failed check and the links. */
export function composeRunFailureMail(to: string, names: { project: string; suite: string }, run: RunDetail): MailMessage {
  const failed = run.results.filter((r) => r.verdict === 'failed')
  const how = run.trigger === 'api' ? 'through the API' : 'from the Suites screen'
  const lines = [
    `Run ${run.number} of the suite “${names.suite}” in the project “${names.project}” failed: ${run.failed} of ${run.passed + run.failed} checks failed.`,
    `Started ${how}${run.by ? ` by ${run.by}` : ''} at ${run.startedAt}.`,
    '',
    'Failed checks:',
  ]
  for (const r of failed.slice(0, FAILED_CHECKS_LISTED)) {
    lines.push(`- ${r.checkName} (revision ${r.revision}): failed, ${describeCheckOutcome(r)}`)
    lines.push(`  Open on the canvas: ${r.canvasUrl}`)
  }
  if (failed.length > FAILED_CHECKS_LISTED) lines.push(`- and ${failed.length - FAILED_CHECKS_LISTED} more`)
  lines.push('', `The run: ${run.url}`, '', 'You get this mail because you watch this suite in Rootcast; stop watching it on the Suites screen.')
  return { to: [to], subject: `Rootcast: suite “${names.suite}” failed (run ${run.number})`, text: lines.join('\n') }
}

/**
 * Mails each watcher of the run's suite who is still a member of its team, one message
 * each (watchers do not see one another's addresses). Rejects when a message cannot be sent.
 */
export async function mailRunFailure(ds: DataSource, mailer: Mailer, run: RunDetail): Promise<void> {
  const rows = (await ds.query(
    `SELECT u.email AS email, s.name AS suite, pr.name AS project
    FROM suite_watchers w JOIN suites s ON s.id = w.suite_id JOIN projects pr ON pr.id = s.project_id
    JOIN users u ON u.id = w.user_id JOIN memberships m ON m.team_id = pr.team_id AND m.user_id = u.id
    WHERE w.suite_id = ? ORDER BY u.email`,
    [run.suiteId],
  )) as Array<{ email: string; suite: string; project: string }>
  for (const row of rows) await mailer.send(composeRunFailureMail(row.email, row, run))
}
