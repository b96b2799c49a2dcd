/**
 * Font file → glyph outlines for the Library, read with fontkit: TTF, OTF (CFF or CFF2
 * outlines), WOFF and WOFF2. Outlines are in font units with the y axis flipped once here
 * (y' = −y) so that glyphs read upright in the path's own y-down coordinates; TrueType's
 * quadratic outlines stay Q commands and CFF's cubic outlines C commands. Metadata are the
 * font's own numbers, not flipped (ascender > 0, descender < 0, as the font states them).
 * Nothing here throws for a bad file: truncated or garbage bytes give ok: false, invalid_font.
 *
 * fontkit trusts the file's counts, and a few of its paths can allocate without bound on
 * damaged data (which aborts the whole process, uncatchably) or loop forever. So: the cmap's
 * character set is never enumerated (code points are looked up one by one), WOFF is unwrapped
 * and WOFF2 checked with Node's native zlib and Brotli under a size cap, and TrueType composite
 * glyphs are walked with a budget before fontkit expands them.
 */
import { brotliDecompressSync, inflateSync } from 'node:zlib'
import * as fontkit from 'fontkit'
import type { Font, Glyph } from 'fontkit'
import { formatPathCommands } from './path-data-format'
import type { PathCommand } from './path-data-format'

export interface FontInfo {
  family: string
  format: 'TTF' | 'OTF' | 'WOFF' | 'WOFF2'
  outlines: 'quadratic' | 'cubic'
  unitsPerEm: number
  ascender: number
  descender: number
  glyphCount: number
}

export interface ImportedGlyph {
  /** The character and its code point, e.g. 'R (U+0052)'; blanks and marks by glyph name, e.g. 'space (U+0020)'. */
  name: string
  codePoint: number
  glyphName: string | null
  /** Path data in font units, y flipped (y' = −y); quadratic stays Q, cubic stays C; '' for a glyph without outline. */
  data: string
  advanceWidth: number
  warnings: string[]
}

/** Why a font or a selection was refused. */
export type FontRefusalCode = 'too_large' | 'invalid_font' | 'font_collection' | 'no_outlines' | 'invalid_selection' | 'too_many_glyphs'

export interface FontRefusal {
  ok: false
  code: FontRefusalCode
  message: string
}

export type FontInfoResult = { ok: true; font: FontInfo } | FontRefusal

export type FontImportResult = { ok: true; font: FontInfo; glyphs: ImportedGlyph[]; missing: number[] } | FontRefusal

/** Glyphs to import: the unique code points of `text` in order, or every code point of an inclusive range. */
export interface GlyphSelection {
  text?: string
  range?: readonly [number, number]
}

/** The limits of the font import (the upload route states maxBytes in the UI). */
export const FONT_IMPORT_LIMITS = {
  maxBytes: 10 * 1024 * 1024,
  maxGlyphs: 500,
  /** Widest Unicode range accepted in one call (one plane), so `missing` stays bounded. */
  maxRangeSpan: 0x10000,
} as const

/** Largest Unicode code point, U+10FFFF (The Unicode Standard). */
const MAX_CODE_POINT = 0x10ffff
/** unitsPerEm must be 16..16384 (OpenType specification, 'head' table). */
const UNITS_PER_EM_RANGE = [16, 16384] as const

/**
 * Decompressed font data a WOFF or WOFF2 file may declare: 64 MiB, three times the largest
 * fonts in common use (CJK families near 20 MB, common practice).
 */
const MAX_DECODED_BYTES = 64 * 1024 * 1024
/**
 * Budget of a TrueType composite glyph: nesting depth, components and points once expanded.
 * Real fonts nest components 1–3 deep (maxp maxComponentDepth) with at most a few thousand
 * points per glyph (common practice); a crafted font can nest copies exponentially.
 */
const MAX_COMPONENT_DEPTH = 16
const MAX_COMPONENTS = 10_000
const MAX_GLYPH_POINTS = 200_000

class FontFailure {
  constructor(readonly code: FontRefusalCode, readonly message: string) {}
}

function tagAt(view: DataView, offset: number): string {
  return String.fromCharCode(view.getUint8(offset), view.getUint8(offset + 1), view.getUint8(offset + 2), view.getUint8(offset + 3))
}

function truncated(what: string, needed: number, length: number): FontFailure {
  return new FontFailure('invalid_font', `The font file is truncated or damaged: ${what} needs ${needed} bytes, the file has ${length}.`)
}

/** Bytes of one table of a WOFF 1.0 file, decompressed with Node's zlib (which checks the stream). */
function readWoffTable(bytes: Uint8Array, tag: string, offset: number, compressed: number, length: number): Uint8Array {
  if (compressed > length) throw new FontFailure('invalid_font', `The WOFF table '${tag}' is larger compressed than uncompressed; the file is damaged.`)
  const stored = bytes.subarray(offset, offset + compressed)
  if (compressed === length) return stored
  let table: Uint8Array
  try {
    table = inflateSync(stored, { maxOutputLength: Math.max(1, length) })
  } catch {
    throw new FontFailure('invalid_font', `The WOFF table '${tag}' does not decompress; the file is damaged.`)
  }
  if (table.length !== length) throw new FontFailure('invalid_font', `The WOFF table '${tag}' decompresses to ${table.length} bytes, not the ${length} it declares.`)
  return table
}

/**
 * A WOFF 1.0 file rebuilt as the sfnt (TTF/OTF) it wraps: header, table directory and the
 * tables decompressed by Node's zlib, each at a 4-byte boundary (WOFF 1.0 and the OpenType
 * table directory). fontkit's own WOFF path inflates with a JavaScript decoder that loops
 * forever on some damaged streams, so fontkit only ever sees the rebuilt sfnt.
 */
function unwrapWoff(bytes: Uint8Array, view: DataView): Buffer {
  const count = view.getUint16(12)
  if (44 + 20 * count > bytes.length) throw truncated('the table directory', 44 + 20 * count, bytes.length)
  const tables: { tag: number; checksum: number; data: Uint8Array }[] = []
  let decoded = 0
  for (let i = 0; i < count; i++) {
    const entry = 44 + 20 * i
    const [offset, compressed, length] = [view.getUint32(entry + 4), view.getUint32(entry + 8), view.getUint32(entry + 12)]
    if (offset + compressed > bytes.length) throw truncated(`table '${tagAt(view, entry)}'`, offset + compressed, bytes.length)
    decoded += length
    checkDecodedSize(decoded)
    tables.push({ tag: view.getUint32(entry), checksum: view.getUint32(entry + 16), data: readWoffTable(bytes, tagAt(view, entry), offset, compressed, length) })
  }
  const directorySize = 12 + 16 * count
  const padded = (length: number): number => (length + 3) & ~3
  const sfnt = Buffer.alloc(directorySize + tables.reduce((sum, table) => sum + padded(table.data.length), 0))
  const selector = count > 0 ? Math.floor(Math.log2(count)) : 0
  sfnt.writeUInt32BE(view.getUint32(4), 0)
  sfnt.writeUInt16BE(count, 4)
  sfnt.writeUInt16BE(16 * 2 ** selector, 6)
  sfnt.writeUInt16BE(selector, 8)
  sfnt.writeUInt16BE(Math.max(0, 16 * count - 16 * 2 ** selector), 10)
  let offset = directorySize
  tables.forEach((table, i) => {
    const entry = 12 + 16 * i
    sfnt.writeUInt32BE(table.tag, entry)
    sfnt.writeUInt32BE(table.checksum, entry + 4)
    sfnt.writeUInt32BE(offset, entry + 8)
    sfnt.writeUInt32BE(table.data.length, entry + 12)
    sfnt.set(table.data, offset)
    offset += padded(table.data.length)
  })
  return sfnt
}

/**
 * The container format from the file's first bytes and the bytes fontkit should read, after
 * checking that every table the directory lists lies inside the file (OpenType specification,
 * table directory; WOFF 1.0 and WOFF 2.0 header length). fontkit reads lazily, so without this
 * a truncated file would only fail, or read garbage, once a glyph is drawn.
 */
function unpackContainer(bytes: Uint8Array): { format: FontInfo['format']; sfnt: Buffer } {
  if (bytes.length < 12) throw new FontFailure('invalid_font', 'The file is too short to be a font.')
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength)
  const whole = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength)
  const signature = tagAt(view, 0)
  if (signature === 'ttcf') throw new FontFailure('font_collection', 'Font collections (.ttc / .otc) are not supported: upload one font of the collection.')
  if (signature === 'wOFF' || signature === 'wOF2') {
    const headerSize = signature === 'wOFF' ? 44 : 48
    if (bytes.length < headerSize) throw truncated('the header', headerSize, bytes.length)
    if (tagAt(view, 4) === 'ttcf') throw new FontFailure('font_collection', 'WOFF font collections are not supported: upload a single font.')
    const declared = view.getUint32(8)
    if (declared !== bytes.length) throw truncated('the header says the file', declared, bytes.length)
    return signature === 'wOFF' ? { format: 'WOFF', sfnt: unwrapWoff(bytes, view) } : { format: 'WOFF2', sfnt: whole }
  }
  if (signature !== 'OTTO' && signature !== 'true' && view.getUint32(0) !== 0x00010000) {
    throw new FontFailure('invalid_font', 'The file is not a TrueType, OpenType, WOFF or WOFF2 font.')
  }
  const tables = view.getUint16(4)
  if (12 + 16 * tables > bytes.length) throw truncated('the table directory', 12 + 16 * tables, bytes.length)
  for (let i = 0; i < tables; i++) {
    const entry = 12 + 16 * i
    const end = view.getUint32(entry + 8) + view.getUint32(entry + 12)
    if (end > bytes.length) throw truncated(`table '${tagAt(view, entry)}'`, end, bytes.length)
  }
  return { format: signature === 'OTTO' ? 'OTF' : 'TTF', sfnt: whole }
}

interface Woff2Internals {
  _dataPos?: number
  directory: { totalCompressedSize?: number; tables: Record<string, { length?: number; transformLength?: number }> }
}

/**
 * Decompresses a WOFF2 file's Brotli stream once with Node's native decoder, capped at
 * MAX_DECODED_BYTES, and checks it yields the size the table directory declares; fontkit then
 * decodes the same, known-good stream. Reads fontkit's decoded directory (fontkit 2.0.4 fields).
 */
function checkWoff2Stream(bytes: Buffer, font: Font): void {
  const internals = font as unknown as Woff2Internals
  const start = internals._dataPos
  const size = internals.directory.totalCompressedSize
  if (typeof start !== 'number' || typeof size !== 'number') return
  const declared = Object.values(internals.directory.tables).reduce((sum, table) => sum + (table.transformLength ?? table.length ?? 0), 0)
  checkDecodedSize(declared)
  if (start + size > bytes.length) throw truncated('the compressed data', start + size, bytes.length)
  let decoded: Buffer
  try {
    decoded = brotliDecompressSync(bytes.subarray(start, start + size), { maxOutputLength: Math.max(1, declared) })
  } catch {
    throw new FontFailure('invalid_font', 'The WOFF2 data does not decompress; the file is damaged.')
  }
  if (decoded.length !== declared) throw new FontFailure('invalid_font', `The WOFF2 data decompresses to ${decoded.length} bytes, not the ${declared} its tables declare.`)
}

function checkDecodedSize(bytes: number): void {
  if (bytes > MAX_DECODED_BYTES) {
    throw new FontFailure('invalid_font', `The font declares ${bytes} bytes of decompressed data; more than ${MAX_DECODED_BYTES} is refused as damaged.`)
  }
}

interface DecodedTrueTypeGlyph {
  points?: readonly unknown[]
  components?: readonly { glyphID: number }[]
}

/**
 * Walks a TrueType glyph's components (fontkit's own glyf decoding, `_decode`, which reads one
 * glyph without expanding it) within the composite budget; CFF glyphs have no components.
 */
function checkComponents(font: Font, glyphId: number): void {
  let components = 0
  let points = 0
  const visit = (id: number, depth: number): void => {
    const glyph = font.getGlyph(id) as unknown as { _decode?: () => DecodedTrueTypeGlyph | null | undefined }
    if (typeof glyph._decode !== 'function') return
    const decoded = glyph._decode()
    if (!decoded) return
    points += decoded.points?.length ?? 0
    for (const component of decoded.components ?? []) {
      components++
      if (depth >= MAX_COMPONENT_DEPTH || components > MAX_COMPONENTS || points > MAX_GLYPH_POINTS) {
        throw new FontFailure('invalid_font', `Glyph ${glyphId} is built from components nested too deep or too many to be a real outline; the font is refused as damaged.`)
      }
      visit(component.glyphID, depth + 1)
    }
    if (points > MAX_GLYPH_POINTS) throw new FontFailure('invalid_font', `Glyph ${glyphId} has more than ${MAX_GLYPH_POINTS} points; the font is refused as damaged.`)
  }
  visit(glyphId, 0)
}

function openFont(buffer: Uint8Array): { font: Font; info: FontInfo } {
  if (buffer.length > FONT_IMPORT_LIMITS.maxBytes) {
    throw new FontFailure('too_large', `The font is ${buffer.length} bytes; fonts may be at most ${FONT_IMPORT_LIMITS.maxBytes} bytes (10 MB).`)
  }
  const { format, sfnt } = unpackContainer(buffer)
  let font: Font
  let info: FontInfo
  try {
    const opened = fontkit.create(sfnt)
    if ('fonts' in opened) throw new FontFailure('font_collection', 'Font collections are not supported: upload one font of the collection.')
    font = opened
    if (format === 'WOFF2') checkWoff2Stream(sfnt, font)
    const tables = (font as unknown as Woff2Internals).directory.tables
    const outlines = 'CFF ' in tables || 'CFF2' in tables ? 'cubic' : 'glyf' in tables && 'loca' in tables ? 'quadratic' : null
    if (outlines === null) throw new FontFailure('no_outlines', 'The font has no outline table (glyf or CFF); bitmap-only and colour-only fonts cannot be imported.')
    info = {
      family: font.familyName ?? font.postscriptName ?? '',
      format,
      outlines,
      unitsPerEm: font.unitsPerEm,
      ascender: font.ascent,
      descender: font.descent,
      glyphCount: font.numGlyphs,
    }
    // Touch what importGlyphs will need, so damage shows up here: the cmap (one lookup, never
    // font.characterSet) and the outline of glyph 0.
    void font.hasGlyphForCodePoint(0x20)
    checkComponents(font, 0)
    void font.getGlyph(0).path.commands.length
  } catch (error) {
    if (error instanceof FontFailure) throw error
    throw new FontFailure('invalid_font', `The font could not be read (${error instanceof Error ? error.message : String(error)}).`)
  }
  const numbers = [info.unitsPerEm, info.ascender, info.descender, info.glyphCount]
  if (!numbers.every(Number.isFinite) || info.unitsPerEm < UNITS_PER_EM_RANGE[0] || info.unitsPerEm > UNITS_PER_EM_RANGE[1] || info.glyphCount < 1) {
    throw new FontFailure('invalid_font', 'The font\'s header tables are damaged (units per em, metrics or glyph count out of range).')
  }
  return { font, info }
}

function attempt<T extends { ok: true }>(buffer: Uint8Array, run: () => T): T | FontRefusal {
  if (!(buffer instanceof Uint8Array)) throw new RangeError('buffer must be a Buffer or Uint8Array')
  try {
    return run()
  } catch (error) {
    if (error instanceof FontFailure) return { ok: false, code: error.code, message: error.message }
    return { ok: false, code: 'invalid_font', message: `The font could not be read (${error instanceof Error ? error.message : String(error)}).` }
  }
}

/**
 * Family, container format, outline kind and metrics of a font file.
 * Refusals: too_large, invalid_font (truncated, damaged or not a font), font_collection, no_outlines.
 * Throws RangeError only when `buffer` is not a Buffer / Uint8Array.
 * @example readFontInfo(readFileSync('DejaVuSans.ttf')) // { ok: true, font: { family: 'DejaVu Sans', format: 'TTF', outlines: 'quadratic', unitsPerEm: 2048, … } }
 */
export function readFontInfo(buffer: Uint8Array): FontInfoResult {
  return attempt(buffer, () => ({ ok: true as const, font: openFont(buffer).info }))
}

function hex(codePoint: number): string {
  return `U+${codePoint.toString(16).toUpperCase().padStart(4, '0')}`
}

/** Selected code points in order; throws FontFailure for a malformed or oversized selection. */
function selectCodePoints(font: Font, selection: GlyphSelection, limit: number): { chosen: number[]; missing: number[] } {
  const { text, range } = selection
  if ((text === undefined) === (range === undefined)) {
    throw new FontFailure('invalid_selection', 'Give either the characters to import or a Unicode range, not both and not neither.')
  }
  const candidates: number[] = []
  if (text !== undefined) {
    if (typeof text !== 'string' || text === '') throw new FontFailure('invalid_selection', 'Type at least one character to import.')
    const seen = new Set<number>()
    for (const character of text) {
      const codePoint = character.codePointAt(0)!
      if (!seen.has(codePoint)) {
        seen.add(codePoint)
        candidates.push(codePoint)
      }
    }
  } else {
    const [low, high] = range!
    if (!Number.isInteger(low) || !Number.isInteger(high) || low < 0 || high > MAX_CODE_POINT || low > high) {
      throw new FontFailure('invalid_selection', `A range runs from a lower to a higher code point within U+0000–U+10FFFF (got ${low}–${high}).`)
    }
    if (high - low + 1 > FONT_IMPORT_LIMITS.maxRangeSpan) {
      throw new FontFailure('invalid_selection', `A range may span at most ${FONT_IMPORT_LIMITS.maxRangeSpan} code points (${hex(low)}–${hex(high)} spans ${high - low + 1}).`)
    }
    for (let codePoint = low; codePoint <= high; codePoint++) candidates.push(codePoint)
  }
  const chosen = candidates.filter((codePoint) => font.hasGlyphForCodePoint(codePoint))
  if (chosen.length > limit) {
    throw new FontFailure('too_many_glyphs', `The selection has ${chosen.length} glyphs in this font; at most ${limit} can be imported at once.`)
  }
  const present = new Set(chosen)
  return { chosen, missing: candidates.filter((codePoint) => !present.has(codePoint)) }
}

/** A character shown as itself in names: letters, digits, punctuation and symbols (not blanks, controls or marks). */
const SHOWN = /^[\p{L}\p{N}\p{P}\p{S}]$/u

function glyphData(glyph: Glyph): string {
  const commands: PathCommand[] = []
  const letters = { moveTo: 'M', lineTo: 'L', quadraticCurveTo: 'Q', bezierCurveTo: 'C', closePath: 'Z' } as const
  for (const { command, args } of glyph.path.commands) {
    const letter = letters[command]
    if (letter === undefined || !args.every(Number.isFinite)) {
      throw new FontFailure('invalid_font', `The outline of glyph ${glyph.id} is damaged.`)
    }
    // Flip y once: font units are y-up, paths are y-down.
    commands.push([letter, ...args.map((value, i) => (i % 2 === 1 ? -value : value))])
  }
  return formatPathCommands(commands)
}

function importGlyph(font: Font, codePoint: number): ImportedGlyph {
  const glyph = font.glyphForCodePoint(codePoint)
  checkComponents(font, glyph.id)
  const glyphName = typeof glyph.name === 'string' && glyph.name !== '' ? glyph.name : null
  const character = String.fromCodePoint(codePoint)
  const label = SHOWN.test(character) ? character : glyphName
  const data = glyphData(glyph)
  const warnings = data === '' ? ['no outline (a blank glyph such as a space): imported with empty path data'] : []
  const advanceWidth = glyph.advanceWidth
  if (!Number.isFinite(advanceWidth)) throw new FontFailure('invalid_font', `The advance width of glyph ${glyph.id} is damaged.`)
  return { name: label ? `${label} (${hex(codePoint)})` : hex(codePoint), codePoint, glyphName, data, advanceWidth, warnings }
}

/**
 * The glyphs for typed text (its unique code points, in order of first appearance) or for an
 * inclusive Unicode range (every code point the font maps), looked up in the font's cmap
 * without shaping. Code points the font does not map are listed in `missing`, in order.
 * Refusals: those of readFontInfo, invalid_selection, too_many_glyphs (more than `limit`).
 * Throws RangeError only for a malformed call (buffer not bytes, limit not a positive integer).
 * @example importGlyphs(dejaVuSans, { text: 'R' }).glyphs[0].data // 'M909 -700 Q974 -678 1035.5 -606 …'
 */
export function importGlyphs(buffer: Uint8Array, selection: GlyphSelection, limit: number = FONT_IMPORT_LIMITS.maxGlyphs): FontImportResult {
  if (!Number.isInteger(limit) || limit < 1) throw new RangeError(`limit must be a positive integer (got ${limit})`)
  return attempt(buffer, () => {
    const { font, info } = openFont(buffer)
    const { chosen, missing } = selectCodePoints(font, selection ?? {}, limit)
    return { ok: true as const, font: info, glyphs: chosen.map((codePoint) => importGlyph(font, codePoint)), missing }
  })
}
