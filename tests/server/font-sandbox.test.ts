import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { describe, expect, it } from 'vitest'
import { importGlyphsIsolated } from '../../server/services/import/font-sandbox'

// DejaVu Sans from the npm package dejavu-fonts-ttf.
const ttf = readFileSync(createRequire(import.meta.url).resolve('dejavu-fonts-ttf/ttf/DejaVuSans.ttf'))

describe('reading uploaded fonts in a separate process', () => {
  it('returns the glyphs the reader found', async () => {
    const r = await importGlyphsIsolated(ttf, { text: 'Hx' }, 10)
    expect(r.ok).toBe(true)
    if (r.ok) expect(r.glyphs.map((g) => g.codePoint)).toEqual([0x48, 0x78])
  })

  it('answers a refusal, and keeps this process alive, when the reader dies', async () => {
    // A limit of 0 is a malformed call: the reader throws and its process exits non-zero.
    const r = await importGlyphsIsolated(ttf, { text: 'H' }, 0)
    expect(r).toMatchObject({ ok: false, code: 'invalid_font', message: expect.stringMatching(/could not be read safely \(the reader exited with 1\)/) })
  })
})
