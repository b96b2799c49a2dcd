/**
 * The lines of a check in the order its expected hits are kept: probes first, then each
 * sweep's lines, labelled for people and counted without being built.
 */
import { describe, expect, it } from 'vitest'
import { countCheckLines, listCheckLines } from '../../shared/checks/check-lines'
import type { Probe } from '../../shared/geometry'

const probes: Probe[] = [
  { type: 'segment', from: [1, 2], to: [3, 4] },
  { type: 'ray', origin: [0, 7], direction: [1, 0] },
]
// Angle 0: lines along +x stepping down in +y; angle 90: along +y stepping towards −x.
const sweeps = [
  { angle: 0, spacing: 3, count: 2, origin: [0, 1] as const },
  { angle: 90, spacing: 0.5, count: 3, origin: [6, 0] as const },
]

describe('listCheckLines', () => {
  it('keeps the probes as they are, then adds each sweep line as a line probe', () => {
    const lines = listCheckLines(probes, sweeps)
    expect(lines.map((l) => l.label)).toEqual(['probe 1', 'probe 2', 'sweep 1, line 1', 'sweep 1, line 2', 'sweep 2, line 1', 'sweep 2, line 2', 'sweep 2, line 3'])
    expect(lines.slice(0, 2).map((l) => l.probe)).toEqual(probes)
    expect(lines.slice(2).map((l) => l.probe)).toEqual([
      { type: 'line', origin: [0, 1], direction: [1, 0] },
      { type: 'line', origin: [0, 4], direction: [1, 0] },
      { type: 'line', origin: [6, 0], direction: [0, 1] },
      { type: 'line', origin: [5.5, 0], direction: [0, 1] },
      { type: 'line', origin: [5, 0], direction: [0, 1] },
    ])
  })

  it('counts the same lines without building them', () => {
    expect(countCheckLines(probes, sweeps)).toBe(7)
    expect(countCheckLines([], [{ count: 2000 }, { count: 3001 }])).toBe(5001)
    expect(listCheckLines([], [])).toEqual([])
  })
})
