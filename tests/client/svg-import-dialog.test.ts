import { mount } from '@vue/test-utils'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { UPLOAD_LIMITS, type SvgPreview } from '../../shared/api'
import { setCsrfToken } from '../../src/api/http'
import SvgImportDialog from '../../src/components/SvgImportDialog.vue'
import { useLibraryStore } from '../../src/stores/library'
import { isolateClientState, jsonResponse, stubFetch } from './fetch-stub'
import { PROJECT_ID, pathItem, pathPage } from './library-fixtures'
import { createTestApp, settle } from './mount-app'

const previewRoute = `POST /api/v1/projects/${PROJECT_ID}/imports/svg/preview`
const importRoute = `POST /api/v1/projects/${PROJECT_ID}/paths/import`
const listRoute = `GET /api/v1/projects/${PROJECT_ID}/paths`

/** A marker that appears only in the raw uploaded file, never in the server's parsed answer. */
const RAW_MARKER = 'raw-upload-marker-7c1'
const rawSvg = `<svg xmlns="http://www.w3.org/2000/svg" id="${RAW_MARKER}"><script>window.${RAW_MARKER.replace(/-/g, '_')}=1</script><path id="arrow-left" d="M20 12H4m6-6-6 6 6 6"/></svg>`

// The server's answer for two files: invented drawings; the refusal wording is our own.
const preview: SvgPreview = {
  files: [
    {
      fileName: 'arrows.svg',
      ok: true,
      warnings: ['A <script> element was ignored.'],
      paths: [
        {
          name: 'arrow-left',
          data: 'M20 12 L4 12 M10 6 L4 12 L10 18',
          fillRule: 'evenodd',
          element: 'path',
          warnings: [],
          segments: 3,
          counts: { line: 3, quadratic: 0, cubic: 0, arc: 0 },
          bbox: [4, 6, 20, 18],
          diagnostics: [
            { kind: 'open-subpath', segment: null, subpath: 0, t: null, point: [20, 12], message: 'Subpath 1 is not closed.' },
          ],
        },
        {
          name: 'rect 2',
          data: 'M2 2 L22 2 L22 22 L2 22 Z',
          fillRule: 'nonzero',
          element: 'rect',
          warnings: ['The rectangle had a negative width and was skipped in part.'],
          segments: 4,
          counts: { line: 4, quadratic: 0, cubic: 0, arc: 0 },
          bbox: [2, 2, 22, 22],
          diagnostics: [],
        },
      ],
    },
    {
      fileName: 'entity-bomb.svg',
      ok: false,
      code: 'doctype',
      message: 'This file declares a DOCTYPE. Rootcast refuses DOCTYPE and ENTITY declarations.',
      warnings: [],
      paths: [],
    },
  ],
}

function chooseFiles(files: File[]): void {
  const input = document.querySelector<HTMLInputElement>('input[data-testid="svg-file-input"]')
  expect(input).not.toBeNull()
  Object.defineProperty(input!, 'files', { value: files, configurable: true })
  input!.dispatchEvent(new Event('change'))
}

function mountDialog() {
  const app = createTestApp()
  useLibraryStore().setProject(PROJECT_ID)
  const emitted: number[] = []
  const wrapper = mount(SvgImportDialog, {
    props: { projectId: PROJECT_ID, modelValue: true, onImported: (count: number) => emitted.push(count) },
    global: { plugins: [app.pinia, app.router, app.vuetify] },
  })
  return { wrapper, emitted }
}

const byTestId = (id: string) => document.querySelector<HTMLElement>(`[data-testid="${id}"]`)

isolateClientState()
beforeEach(() => setCsrfToken('csrf-svg-1'))
afterEach(() => {
  document.body.innerHTML = ''
})

describe('SvgImportDialog', () => {
  it('states the upload limits', async () => {
    stubFetch({})
    mountDialog()
    await settle()
    expect(byTestId('svg-import-dialog')?.textContent).toContain('Up to 20 files at once, at most 2 MB each.')
  })

  it('previews, lets the reader choose, and imports the chosen paths as JSON', async () => {
    const { calls } = stubFetch({
      [previewRoute]: () => jsonResponse(200, preview),
      [importRoute]: () => jsonResponse(201, { created: [pathItem(31, 'arrow-left')] }),
      [listRoute]: () => jsonResponse(200, pathPage([pathItem(31, 'arrow-left')])),
    })
    const { emitted } = mountDialog()
    await settle()
    chooseFiles([
      new File([rawSvg], 'arrows.svg', { type: 'image/svg+xml' }),
      new File(['<!DOCTYPE svg>'], 'entity-bomb.svg', { type: 'image/svg+xml' }),
    ])
    await settle()

    const upload = calls.find((call) => `${call.method} ${call.pathname}` === previewRoute)
    expect((upload!.form!.getAll('files') as File[]).map((file) => file.name)).toEqual(['arrows.svg', 'entity-bomb.svg'])
    const list = byTestId('svg-preview-list')!
    expect(list.textContent).toContain('2 paths found')
    // Both found paths are drawn from the returned data; each keeps its fill rule.
    const drawn = [...list.querySelectorAll('svg.rc-thumbnail path')].map((path) => [path.getAttribute('d'), path.getAttribute('fill-rule')])
    expect(drawn).toEqual([
      ['M20 12 L4 12 M10 6 L4 12 L10 18', 'evenodd'],
      ['M2 2 L22 2 L22 22 L2 22 Z', 'nonzero'],
    ])
    expect(list.textContent).toContain('Open subpath')
    expect(list.textContent).toContain('Subpath 1 is not closed.')
    expect(list.textContent).toContain('The rectangle had a negative width and was skipped in part.')
    expect(list.textContent).toContain('A <script> element was ignored.')

    // Untick "rect 2", then import the one path left.
    byTestId('svg-path-check-0-1')!.querySelector('input')!.click()
    await settle()
    const confirm = byTestId('svg-import-confirm') as HTMLButtonElement
    expect(confirm.textContent).toContain('Import 1 path')
    confirm.click()
    await settle()

    const post = calls.find((call) => `${call.method} ${call.pathname}` === importRoute)
    expect(post?.headers['x-csrf-token']).toBe('csrf-svg-1')
    expect(post?.body).toEqual({
      origin: 'svg',
      paths: [{ name: 'arrow-left', data: 'M20 12 L4 12 M10 6 L4 12 L10 18', fillRule: 'evenodd', sourceFile: 'arrows.svg' }],
    })
    expect(emitted).toEqual([1])
    expect(calls.some((call) => `${call.method} ${call.pathname}` === listRoute)).toBe(true)
  })

  it('shows a refused file with its message and renders nothing from the raw SVG', async () => {
    stubFetch({ [previewRoute]: () => jsonResponse(200, preview) })
    mountDialog()
    await settle()
    chooseFiles([new File([rawSvg], 'arrows.svg', { type: 'image/svg+xml' }), new File(['<!DOCTYPE svg>'], 'entity-bomb.svg')])
    await settle()

    const refused = document.querySelectorAll('[data-testid="svg-file-refused"]')
    expect(refused).toHaveLength(1)
    expect(refused[0].textContent).toContain('entity-bomb.svg')
    expect(refused[0].textContent).toContain('This file declares a DOCTYPE. Rootcast refuses DOCTYPE and ENTITY declarations.')
    expect(refused[0].querySelector('[role="alert"]')).not.toBeNull()

    const html = document.body.innerHTML
    expect(html).not.toContain(RAW_MARKER)
    expect(document.querySelectorAll('img, object, iframe, embed, foreignObject, script')).toHaveLength(0)
    expect([...document.querySelectorAll('svg path')].map((path) => path.getAttribute('d'))).not.toContain('M20 12H4m6-6-6 6 6 6')
  })

  it('refuses a file over the size limit before uploading anything', async () => {
    const { calls } = stubFetch({ [previewRoute]: () => jsonResponse(200, { files: [] }) })
    mountDialog()
    await settle()
    chooseFiles([new File([new Uint8Array(UPLOAD_LIMITS.svgBytes + 1)], 'huge-map.svg')])
    await settle()
    expect(calls.filter((call) => call.method === 'POST')).toHaveLength(0)
    const refused = byTestId('svg-file-refused')!
    expect(refused.textContent).toContain('huge-map.svg')
    expect(refused.textContent).toContain('at most 2 MB per file can be uploaded')
    expect((byTestId('svg-import-confirm') as HTMLButtonElement).disabled).toBe(true)
  })

  it('shows progress while the upload is on its way, and the server’s error after', async () => {
    let answer: (() => void) | null = null
    const held = new Promise<void>((resolve) => {
      answer = resolve
    })
    stubFetch({
      [previewRoute]: async () => {
        await held
        return jsonResponse(413, { error: { code: 'limit', message: 'An SVG file may have at most 2 MB.' } })
      },
    })
    mountDialog()
    await settle()
    chooseFiles([new File([rawSvg], 'arrows.svg')])
    await settle()
    expect(byTestId('svg-preview-progress')).not.toBeNull()
    answer!()
    await settle()
    expect(byTestId('svg-preview-progress')).toBeNull()
    expect(byTestId('svg-preview-error')?.textContent).toContain('An SVG file may have at most 2 MB.')
  })
})
