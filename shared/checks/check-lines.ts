/**
 * The probe lines of a check, in the order its expected hits are kept: the probes first,
 * then each sweep's lines in order. Server (computing expected and actual hits) and client
 * (drawing a diff) number the lines the same way.
 */
import type { LineSweep, Probe } from '../geometry'
import { sweepLines } from '../geometry'

export interface CheckLine {
  readonly probe: Probe
  /** For people: "probe 2", "sweep 1, line 14" (counted from 1). */
  readonly label: string
}

/** How many lines a check's probes and sweeps make, without building them. */
export function countCheckLines(probes: readonly Probe[], sweeps: readonly Pick<LineSweep, 'count'>[]): number {
  return sweeps.reduce((sum, sweep) => sum + sweep.count, probes.length)
}

/**
 * The lines of a check: each probe as it is, then each sweep's lines as line probes (see
 * sweepLines). Index i of the result is line i of the check's expected hits.
 */
export function listCheckLines(probes: readonly Probe[], sweeps: readonly LineSweep[]): CheckLine[] {
  const lines: CheckLine[] = probes.map((probe, i) => ({ probe, label: `probe ${i + 1}` }))
  sweeps.forEach((sweep, k) => {
    sweepLines(sweep).forEach(({ origin, direction }, j) => {
      lines.push({ probe: { type: 'line', origin, direction }, label: `sweep ${k + 1}, line ${j + 1}` })
    })
  })
  return lines
}
