import type { Diagnostic } from '../../shared/geometry'

/** Why each diagnostic matters when hits are counted, in one or two sentences. */
export const DIAGNOSTIC_EXPLANATIONS: Record<Diagnostic['kind'], string> = {
  cusp: 'The curve’s tangent vanishes here and the outline turns back on itself: a probe through the tip meets two branches at one point, so its hits can be tangent or counted twice by numeric methods.',
  loop: 'The cubic crosses itself: a probe through the loop meets the same segment up to three times, and the winding inside the loop differs from around it.',
  'zero-length-segment': 'A segment whose points all coincide: it draws nothing and was left out, but it shifts the segment numbers of tools that keep it.',
  'degenerate-contour': 'A contour with no extent: every command stays at one point, so it encloses nothing.',
  'straight-curve': 'A curve whose control points lie on one line: it draws a straight piece, and a probe along it overlaps instead of crossing.',
  'open-subpath': 'A subpath without Z: filling closes it with an implied line that probes meet too (reported as segment −1 in sweeps).',
  'coincident-points': 'Two points fall together, so the segment between them is degenerate or a handle has no length.',
}
