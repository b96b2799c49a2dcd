import type { FontPreview, SvgPreview } from '../../shared/api/library'
import { HttpError } from '../errors/http-error'
import { importGlyphsIsolated } from './import/font-sandbox'
import { importSvg } from './import/svg-import'
import { analysePathData } from './path-analysis'
import { UPLOAD_LIMITS } from '../../shared/api/library'

type Analysed = Pick<SvgPreview['files'][number]['paths'][number], 'segments' | 'counts' | 'bbox' | 'diagnostics'>

/** The core's view of an imported outline; data the core refuses becomes a warning, never a crash. */
function analyse(data: string, warnings: string[]): Analysed | null {
  if (data.trim() === '') return { segments: 0, counts: { line: 0, quadratic: 0, cubic: 0, arc: 0 }, bbox: null, diagnostics: [] }
  const r = analysePathData(data)
  if (r.ok) return { segments: r.analysis.segments, counts: r.analysis.counts, bbox: r.analysis.bbox, diagnostics: r.analysis.diagnostics }
  warnings.push(r.message)
  return null
}

/** Parses uploaded SVG files into candidate paths. Writes nothing. */
export function previewSvgFiles(files: Express.Multer.File[]): SvgPreview {
  if (!files.length) throw new HttpError(400, 'validation', 'Choose at least one SVG file.')
  const preview = {
    files: files.map((f) => {
      const r = importSvg(f.buffer, f.originalname)
      if (!r.ok) return { fileName: f.originalname, ok: false, code: r.code, message: r.message, warnings: [], paths: [] }
      const fileWarnings = [...r.warnings]
      const paths = r.paths.flatMap((p) => {
        const warnings = [...p.warnings]
        const a = analyse(p.data, warnings)
        if (!a) {
          fileWarnings.push(`${p.name}: left out (${warnings.at(-1)})`)
          return []
        }
        return [{ name: p.name, data: p.data, fillRule: p.fillRule, element: p.element, warnings, ...a }]
      })
      return { fileName: f.originalname, ok: true, warnings: fileWarnings, paths }
    }),
  }
  // When nothing at all could be read, the upload as a whole is bad input.
  const refused = preview.files.filter((f) => !f.ok)
  if (refused.length === preview.files.length) {
    const first = refused[0]
    const message = refused.length === 1 ? `${first.fileName}: ${first.message}` : `None of the ${refused.length} files could be read. ${first.fileName}: ${first.message}`
    throw new HttpError(400, first.code ?? 'invalid_svg', message, refused.map((f) => ({ fileName: f.fileName, code: f.code, message: f.message })))
  }
  return preview
}

function parseRange(range: string): [number, number] {
  const [a, b] = range.split('-').map((x) => parseInt(x.replace(/^U\+/i, ''), 16))
  const lo = a
  const hi = b ?? a
  if (!(lo <= hi)) throw new HttpError(400, 'validation', 'A range runs from the lower code point to the higher one.')
  if (hi - lo + 1 > UPLOAD_LIMITS.glyphs) throw new HttpError(413, 'limit', `At most ${UPLOAD_LIMITS.glyphs} glyphs per import.`)
  return [lo, hi]
}

/** Reads a font and the chosen glyphs as candidate paths. Writes nothing. */
export async function previewFont(file: Express.Multer.File | undefined, fields: { text?: string; range?: string }): Promise<FontPreview> {
  if (!file) throw new HttpError(400, 'validation', 'Choose a font file (TTF, OTF, WOFF or WOFF2).')
  if (!fields.text && !fields.range) throw new HttpError(400, 'validation', 'Type the characters to import, or give a Unicode range such as U+0041-U+005A.')
  const selection = fields.range ? { range: parseRange(fields.range) } : { text: fields.text }
  const r = await importGlyphsIsolated(file.buffer, selection, UPLOAD_LIMITS.glyphs)
  if (!r.ok) throw new HttpError(400, r.code, r.message)
  return {
    fileName: file.originalname,
    font: r.font,
    glyphs: r.glyphs.map((g) => {
      const warnings = [...g.warnings]
      const a = analyse(g.data, warnings) ?? { segments: 0, counts: { line: 0, quadratic: 0, cubic: 0, arc: 0 }, bbox: null, diagnostics: [] }
      return { name: g.name, codePoint: g.codePoint, glyphName: g.glyphName, data: g.data, advanceWidth: g.advanceWidth, warnings, ...a }
    }),
    missing: r.missing,
  }
}
