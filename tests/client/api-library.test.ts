import { describe, expect, it } from 'vitest'
import { fileNameFromDisposition, setCsrfToken } from '../../src/api/http'
import { importPaths, previewFontFile, previewSvgFiles } from '../../src/api/library'
import { isolateClientState, jsonResponse, stubFetch } from './fetch-stub'
import { PROJECT_ID } from './library-fixtures'

isolateClientState()

const fontInfo = {
  family: 'DejaVu Sans',
  format: 'TTF',
  outlines: 'quadratic',
  unitsPerEm: 2048,
  ascender: 1901,
  descender: -483,
  glyphCount: 6253,
}

describe('multipart uploads', () => {
  it('sends SVG files as multipart field `files`, with the CSRF token and no Content-Type of its own', async () => {
    const { calls } = stubFetch({
      [`POST /api/v1/projects/${PROJECT_ID}/imports/svg/preview`]: () => jsonResponse(200, { files: [] }),
    })
    setCsrfToken('csrf-4410')
    const pin = new File(['<svg/>'], 'map-pin.svg', { type: 'image/svg+xml' })
    const lift = new File(['<svg></svg>'], 'lift.svg', { type: 'image/svg+xml' })
    await previewSvgFiles(PROJECT_ID, [pin, lift])

    const [call] = calls
    expect(call.headers['x-csrf-token']).toBe('csrf-4410')
    // The browser writes multipart/form-data with its boundary only when we set no Content-Type.
    expect(call.headers['content-type']).toBeUndefined()
    expect(call.body).toBeUndefined()
    const sent = call.form!.getAll('files') as File[]
    expect(sent.map((file) => file.name)).toEqual(['map-pin.svg', 'lift.svg'])
  })

  it('sends a font as field `file` with either `text` or `range`', async () => {
    const { calls } = stubFetch({
      [`POST /api/v1/projects/${PROJECT_ID}/imports/font/preview`]: () =>
        jsonResponse(200, { fileName: 'DejaVuSans.ttf', font: fontInfo, glyphs: [], missing: [] }),
    })
    const font = new File([new Uint8Array([0, 1, 0, 0])], 'DejaVuSans.ttf', { type: 'font/ttf' })
    const byRange = await previewFontFile(PROJECT_ID, font, { range: 'U+0041-U+005A' })
    await previewFontFile(PROJECT_ID, font, { text: 'Harbour' })

    expect(byRange.font.unitsPerEm).toBe(2048)
    expect((calls[0].form!.get('file') as File).name).toBe('DejaVuSans.ttf')
    expect(calls[0].form!.get('range')).toBe('U+0041-U+005A')
    expect(calls[0].form!.has('text')).toBe(false)
    expect(calls[1].form!.get('text')).toBe('Harbour')
    expect(calls[1].form!.has('range')).toBe(false)
  })

  it('still sends JSON with its Content-Type on the import that commits a preview', async () => {
    const { calls } = stubFetch({ [`POST /api/v1/projects/${PROJECT_ID}/paths/import`]: () => jsonResponse(201, { created: [] }) })
    await importPaths(PROJECT_ID, { origin: 'svg', paths: [{ name: 'pin', data: 'M0 0 L4 4', fillRule: 'evenodd', sourceFile: 'map-pin.svg' }] })
    expect(calls[0].headers['content-type']).toBe('application/json')
    expect(calls[0].form).toBeUndefined()
  })
})

describe('fileNameFromDisposition', () => {
  it('reads a quoted and a bare filename', () => {
    expect(fileNameFromDisposition('attachment; filename="wayfinding icons.svg"')).toBe('wayfinding icons.svg')
    expect(fileNameFromDisposition('attachment; filename=bundle.json')).toBe('bundle.json')
  })

  it('prefers filename* (RFC 6266 section 5, its second example)', () => {
    expect(fileNameFromDisposition(`attachment; filename="EURO rates"; filename*=utf-8''%e2%82%ac%20rates`)).toBe('€ rates')
  })

  it('gives null without a header or a name', () => {
    expect(fileNameFromDisposition(null)).toBeNull()
    expect(fileNameFromDisposition('attachment')).toBeNull()
  })
})
