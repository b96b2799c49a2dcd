/**
 * A run as JUnit XML, the report format CI servers read (Jenkins, GitLab, GitHub actions
 * that publish test results): one <testsuite> for the suite, one <testcase> per check, a
 * <failure> for a check whose hits differ and an <error> for one that could not be
 * computed. Element and attribute names follow the Ant JUnit report format as CI servers
 * parse it (common practice; the layout here is from memory of the Ant task's output).
 */
import type { CheckResult, RunDetail } from '../../shared/api/suites'
import { describeCheckOutcome } from '../../shared/checks/compare-hits'

/** Differences written out in one failure's text; the run's JSON has them all. */
const DIFFERENCES_WRITTEN = 200

/** Characters XML 1.0 does not allow at all (controls other than tab, newline, return; U+FFFE, U+FFFF; lone surrogates). */
const NOT_XML = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g

/** Text for an attribute value in double quotes: markup characters and line breaks escaped. */
function attr(value: string | number): string {
  return String(value)
    .replace(NOT_XML, '\uFFFD')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;')
    .replace(/\t/g, '&#9;')
    .replace(/\n/g, '&#10;')
    .replace(/\r/g, '&#13;')
}

/** Text for element content. */
function text(value: string): string {
  return value.replace(NOT_XML, '\uFFFD').replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;')
}

const seconds = (ms: number) => (ms / 1000).toFixed(3)

/** A dot separates the levels of a JUnit class name, so a dot inside a name would add a level. */
const classPart = (name: string) => name.replace(/\./g, '_')

function hitText(h: NonNullable<CheckResult['differences'][number]['expected']>): string {
  return `(${h.point[0]}, ${h.point[1]}) on segment ${h.segment} at t ${h.t}, ${h.kind}, winding ${h.winding}`
}

function failureBody(r: CheckResult): string {
  const lines = r.differences.slice(0, DIFFERENCES_WRITTEN).map((d) => {
    const parts = [`${d.lineLabel}: ${d.kind}`]
    if (d.expected) parts.push(`expected ${hitText(d.expected)}`)
    if (d.actual) parts.push(`got ${hitText(d.actual)}`)
    if (d.distance !== null) parts.push(`distance ${d.distance}, |Δt| ${d.tError}`)
    return parts.join('; ')
  })
  if (r.differenceCount > lines.length) lines.push(`… and ${r.differenceCount - lines.length} more differences`)
  lines.push(`Revision ${r.revision}. Open on the canvas: ${r.canvasUrl}`)
  return lines.join('\n')
}

/**
 * The JUnit XML of one run. Times are in seconds; the timestamp is the run's start in UTC
 * without a zone designator, as the Ant format writes it. Everything from people (project,
 * suite and check names) is escaped.
 */
export function writeJunitXml(run: RunDetail, names: { project: string; suite: string }): string {
  const errors = run.results.filter((r) => r.error !== null).length
  const failures = run.failed - errors
  const time = seconds(new Date(run.finishedAt).getTime() - new Date(run.startedAt).getTime())
  const tests = run.results.length
  const classname = `rootcast.${classPart(names.project)}.${classPart(names.suite)}`
  const out = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<testsuites name="${attr(`Rootcast · ${names.project} · ${names.suite} · run ${run.number}`)}" tests="${tests}" failures="${failures}" errors="${errors}" time="${time}">`,
    `  <testsuite name="${attr(names.suite)}" tests="${tests}" failures="${failures}" errors="${errors}" skipped="0" time="${time}" timestamp="${run.startedAt.slice(0, 19)}">`,
    '    <properties>',
    `      <property name="rootcast.run.url" value="${attr(run.url)}"/>`,
    `      <property name="rootcast.run.number" value="${run.number}"/>`,
    `      <property name="rootcast.run.trigger" value="${run.trigger}"/>`,
    '    </properties>',
  ]
  for (const r of run.results) {
    const open = `    <testcase classname="${attr(classname)}" name="${attr(r.checkName)}" time="${seconds(r.durationMs)}"`
    if (r.verdict === 'passed') {
      out.push(`${open}/>`)
      continue
    }
    const element = r.error !== null ? 'error' : 'failure'
    const type = r.error !== null ? 'CheckError' : 'HitMismatch'
    out.push(`${open}>`)
    out.push(`      <${element} message="${attr(describeCheckOutcome(r))}" type="${type}">${text(failureBody(r))}</${element}>`)
    out.push('    </testcase>')
  }
  out.push('  </testsuite>', '</testsuites>', '')
  return out.join('\n')
}
