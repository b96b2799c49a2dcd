import { mount } from '@vue/test-utils'
import { describe, expect, it } from 'vitest'
import BasePathThumbnail from '../../src/components/BasePathThumbnail.vue'
import { formatViewBox, measurePathHull, THUMBNAIL_MARGIN_RATIO } from '../../src/composables/usePathViewBox'
import { createAppVuetify } from '../../src/plugins/vuetify'

/** Expected values are sums of a few doubles of size ≤ 60, each rounding ≤ 60·2⁻⁵³ ≈ 7e-15: 1e-12 allows ~100 of them. */
const SUM_TOLERANCE = 1e-12

function expectBox(actual: ReturnType<typeof measurePathHull>, expected: [number, number, number, number]) {
  expect(actual).not.toBeNull()
  const { x, y, width, height } = actual!
  ;[x, y, width, height].forEach((value, i) => expect(Math.abs(value - expected[i])).toBeLessThan(SUM_TOLERANCE))
}

describe('measurePathHull (boxes worked out by hand from the path commands)', () => {
  it('boxes absolute lines', () => {
    expectBox(measurePathHull('M10 20 L30 60'), [10, 20, 20, 40])
  })

  it('follows H and V from the current point', () => {
    expectBox(measurePathHull('M2 3 H12 V8 Z'), [2, 3, 10, 5])
  })

  it('resolves relative commands', () => {
    expectBox(measurePathHull('m5 5 l10 0 l0 10 z'), [5, 5, 10, 10])
  })

  it('includes cubic control points (the hull, 8 high, not the curve, 6 high)', () => {
    // The curve's apex is at t = 1/2: y = 3/4 · (−8) = −6; the controls reach −8.
    expectBox(measurePathHull('M0 0 C0 -8 10 -8 10 0'), [0, -8, 10, 8])
  })

  it('turns an arc into cubics first: a half circle of radius 5 over (0,0)–(10,0)', () => {
    expectBox(measurePathHull('M0 0 A5 5 0 0 1 10 0'), [0, -5, 10, 5])
  })

  it('returns null for data with no drawable point', () => {
    expect(measurePathHull('garbage')).toBeNull()
    expect(measurePathHull('')).toBeNull()
  })
})

describe('formatViewBox', () => {
  it('adds the margin on every side', () => {
    const margin = 40 * THUMBNAIL_MARGIN_RATIO
    const numbers = formatViewBox({ x: 10, y: 20, width: 20, height: 40 }).split(' ').map(Number)
    const expected = [10 - margin, 20 - margin, 20 + 2 * margin, 40 + 2 * margin]
    numbers.forEach((value, i) => expect(Math.abs(value - expected[i])).toBeLessThan(SUM_TOLERANCE))
  })

  it('gives a single point a non-empty view', () => {
    expect(formatViewBox({ x: 4, y: 9, width: 0, height: 0 })).toBe('3.5 8.5 1 1')
  })
})

describe('BasePathThumbnail', () => {
  it('draws the path data with its fill rule inside a viewBox around it', () => {
    const wrapper = mount(BasePathThumbnail, {
      props: { data: 'M2 3 H12 V8 Z', fillRule: 'evenodd', label: 'Lift door' },
      global: { plugins: [createAppVuetify()] },
    })
    const svg = wrapper.get('svg')
    const path = wrapper.get('path')
    expect(path.attributes('d')).toBe('M2 3 H12 V8 Z')
    expect(path.attributes('fill-rule')).toBe('evenodd')
    expect(svg.attributes('aria-label')).toBe('Outline of Lift door')
    const [x, y, width, height] = (svg.attributes('viewBox') ?? '').split(' ').map(Number)
    expect(x).toBeLessThan(2)
    expect(y).toBeLessThan(3)
    expect(x + width).toBeGreaterThan(12)
    expect(y + height).toBeGreaterThan(8)
  })
})
