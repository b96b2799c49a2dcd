import { mount } from '@vue/test-utils'
import { afterEach, describe, expect, it } from 'vitest'
import type { FontPreview } from '../../shared/api'
import FontImportDialog from '../../src/components/FontImportDialog.vue'
import { useLibraryStore } from '../../src/stores/library'
import { errorResponse, isolateClientState, jsonResponse, stubFetch } from './fetch-stub'
import { PROJECT_ID, pathItem, pathPage } from './library-fixtures'
import { createTestApp, settle } from './mount-app'

const previewRoute = `POST /api/v1/projects/${PROJECT_ID}/imports/font/preview`
const importRoute = `POST /api/v1/projects/${PROJECT_ID}/paths/import`

// The shape of the server's answer. The metrics are DejaVu Sans's head/hhea values (2048 units per
// em, ascender 1901, descender −483; from memory); the outlines are invented, not the font's glyphs.
const preview: FontPreview = {
  fileName: 'DejaVuSans.ttf',
  font: { family: 'DejaVu Sans', format: 'TTF', outlines: 'quadratic', unitsPerEm: 2048, ascender: 1901, descender: -483, glyphCount: 6253 },
  glyphs: [
    {
      name: 'H (U+0048)',
      codePoint: 0x48,
      glyphName: 'H',
      data: 'M201 -1493 L403 -1493 L403 0 L201 0 Z',
      advanceWidth: 1540,
      warnings: [],
      segments: 4,
      counts: { line: 4, quadratic: 0, cubic: 0, arc: 0 },
      bbox: [201, -1493, 403, 0],
      diagnostics: [],
    },
    {
      name: 'o (U+006F)',
      codePoint: 0x6f,
      glyphName: null,
      data: 'M100 -500 Q600 -1000 1100 -500 Q600 0 100 -500 Z',
      advanceWidth: 1253,
      warnings: [],
      segments: 2,
      counts: { line: 0, quadratic: 2, cubic: 0, arc: 0 },
      bbox: [100, -750, 1100, -250],
      diagnostics: [],
    },
  ],
  missing: [0x2603],
}

function mountDialog() {
  const app = createTestApp()
  useLibraryStore().setProject(PROJECT_ID)
  const emitted: number[] = []
  mount(FontImportDialog, {
    props: { projectId: PROJECT_ID, modelValue: true, onImported: (count: number) => emitted.push(count) },
    global: { plugins: [app.pinia, app.router, app.vuetify] },
  })
  return { emitted }
}

const byTestId = (id: string) => document.querySelector<HTMLElement>(`[data-testid="${id}"]`)

async function chooseFontAndText(text: string): Promise<void> {
  const input = document.querySelector<HTMLInputElement>('input[data-testid="font-file-input"]')!
  Object.defineProperty(input, 'files', {
    value: [new File([new Uint8Array([0, 1, 0, 0])], 'DejaVuSans.ttf', { type: 'font/ttf' })],
    configurable: true,
  })
  input.dispatchEvent(new Event('change'))
  const field = byTestId('font-text-input')!.querySelector('input')!
  field.value = text
  field.dispatchEvent(new Event('input'))
  await settle()
  byTestId('font-preview-button')!.click()
  await settle()
}

isolateClientState()
afterEach(() => {
  document.body.innerHTML = ''
})

describe('FontImportDialog', () => {
  it('shows the font’s metrics and glyphs, and imports them in font units with their metrics', async () => {
    const { calls } = stubFetch({
      [previewRoute]: () => jsonResponse(200, preview),
      [importRoute]: () => jsonResponse(201, { created: [pathItem(40, 'H (U+0048)'), pathItem(41, 'o (U+006F)')] }),
      [`GET /api/v1/projects/${PROJECT_ID}/paths`]: () => jsonResponse(200, pathPage([])),
    })
    const { emitted } = mountDialog()
    await settle()
    await chooseFontAndText('Ho☃')

    const upload = calls.find((call) => `${call.method} ${call.pathname}` === previewRoute)!
    expect(upload.form!.get('text')).toBe('Ho☃')
    const info = byTestId('font-info')!.textContent!
    for (const fact of ['DejaVu Sans', 'TTF', 'quadratic', '2048', '1901', '-483']) expect(info).toContain(fact)
    expect(byTestId('font-missing')?.textContent).toContain('U+2603')
    const glyphs = [...byTestId('font-preview-list')!.querySelectorAll('svg.rc-thumbnail path')].map((path) => path.getAttribute('d'))
    expect(glyphs).toEqual([preview.glyphs[0].data, preview.glyphs[1].data])

    byTestId('font-import-confirm')!.click()
    await settle()
    const post = calls.find((call) => `${call.method} ${call.pathname}` === importRoute)
    const metrics = { unitsPerEm: 2048, ascender: 1901, descender: -483, family: 'DejaVu Sans' }
    expect(post?.body).toEqual({
      origin: 'font',
      paths: [
        {
          name: 'H (U+0048)',
          data: preview.glyphs[0].data,
          fillRule: 'nonzero',
          sourceFile: 'DejaVuSans.ttf',
          units: 'font units',
          metadata: { ...metrics, advanceWidth: 1540, codePoint: 0x48, glyphName: 'H' },
        },
        {
          name: 'o (U+006F)',
          data: preview.glyphs[1].data,
          fillRule: 'nonzero',
          sourceFile: 'DejaVuSans.ttf',
          units: 'font units',
          metadata: { ...metrics, advanceWidth: 1253, codePoint: 0x6f, glyphName: null },
        },
      ],
    })
    expect(emitted).toEqual([2])
  })

  it('shows the server’s refusal of a broken font in words', async () => {
    stubFetch({
      [previewRoute]: () => errorResponse(422, 'invalid_font', 'This file is not a font Rootcast can read (TTF, OTF, WOFF, WOFF2).'),
    })
    mountDialog()
    await settle()
    await chooseFontAndText('R')
    expect(byTestId('font-preview-error')?.textContent).toContain('This file is not a font Rootcast can read')
    expect((byTestId('font-import-confirm') as HTMLButtonElement).disabled).toBe(true)
  })
})
