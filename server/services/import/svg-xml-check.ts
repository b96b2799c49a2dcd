/**
 * Checks on an uploaded SVG's raw text, made before any XML parser sees it: the bytes are
 * text, there is no DOCTYPE and no ENTITY declaration (so no entity is ever expanded), the
 * text is well-formed XML (XML 1.0 §2–3: one root, matched tags, quoted and unique
 * attributes, only the five predefined entity references and character references), the
 * root is <svg>, nothing refers outside the file, and the element count and nesting depth
 * are within limits. One linear pass; nothing is fetched, executed or rendered.
 */
import type { SvgRefusalCode } from './svg-import'

/** The SVG namespace (SVG 1.1 §1.2); a root declaring another default namespace is not SVG. */
export const SVG_NAMESPACE = 'http://www.w3.org/2000/svg'

export interface SvgTextLimits {
  readonly maxElements: number
  readonly maxDepth: number
}

export type SvgTextCheck =
  | { readonly ok: true; readonly text: string; readonly elementCount: number }
  | { readonly ok: false; readonly code: SvgRefusalCode; readonly message: string }

class TextRefusal {
  constructor(readonly code: SvgRefusalCode, readonly message: string) {}
}

const PREDEFINED: Readonly<Record<string, string>> = { lt: '<', gt: '>', amp: '&', apos: "'", quot: '"' }
const REFERENCE = /&(#[0-9]+|#x[0-9a-fA-F]+|[A-Za-z_][A-Za-z0-9._-]*);/y
const NAME = /[A-Za-z_:\u00C0-\uFFFF][A-Za-z0-9_:.\-\u00B7\u00C0-\uFFFF]*/y
const ATTRIBUTE = /\s+([A-Za-z_:\u00C0-\uFFFF][A-Za-z0-9_:.\-\u00B7\u00C0-\uFFFF]*)\s*=\s*(?:"([^<"]*)"|'([^<']*)')/y
const TAG_END = /\s*(\/?)>/y
const END_TAG_END = /\s*>/y

/** Magic numbers of files that are often renamed .svg by mistake (common practice: file signatures). */
const SIGNATURES: readonly (readonly [string, readonly number[]])[] = [
  ['a PNG image', [0x89, 0x50, 0x4e, 0x47]],
  ['a JPEG image', [0xff, 0xd8, 0xff]],
  ['a GIF image', [0x47, 0x49, 0x46, 0x38]],
  ['a PDF document', [0x25, 0x50, 0x44, 0x46]],
  ['a ZIP archive', [0x50, 0x4b, 0x03, 0x04]],
  ['gzip-compressed data (an .svgz file?)', [0x1f, 0x8b]],
]

function lineOf(text: string, position: number): number {
  let line = 1
  for (let i = text.indexOf('\n'); i >= 0 && i < position; i = text.indexOf('\n', i + 1)) line++
  return line
}

function codePointOf(reference: string): number {
  return reference[1] === 'x' ? parseInt(reference.slice(2), 16) : parseInt(reference.slice(1), 10)
}

function isXmlChar(codePoint: number): boolean {
  // XML 1.0 §2.2 Char.
  return codePoint === 0x9 || codePoint === 0xa || codePoint === 0xd ||
    (codePoint >= 0x20 && codePoint <= 0xd7ff) || (codePoint >= 0xe000 && codePoint <= 0xfffd) ||
    (codePoint >= 0x10000 && codePoint <= 0x10ffff)
}

/** Replaces the predefined entity references and character references (text checked by checkSvgText). */
export function decodeXmlReferences(text: string): string {
  if (!text.includes('&')) return text
  return text.replace(/&(#[0-9]+|#x[0-9a-fA-F]+|lt|gt|amp|apos|quot);/g, (whole, reference: string) =>
    reference[0] === '#' ? String.fromCodePoint(codePointOf(reference)) : PREDEFINED[reference] ?? whole)
}

function decodeBytes(bytes: Uint8Array): string {
  const starts = (...prefix: number[]): boolean => prefix.every((byte, i) => bytes[i] === byte)
  for (const [what, signature] of SIGNATURES) {
    if (starts(...signature)) throw new TextRefusal('not_xml', `The file is ${what}, not SVG text.`)
  }
  let text: string
  try {
    if (starts(0xff, 0xfe)) text = new TextDecoder('utf-16le', { fatal: true }).decode(bytes.subarray(2))
    else if (starts(0xfe, 0xff)) text = new TextDecoder('utf-16be', { fatal: true }).decode(bytes.subarray(2))
    else text = new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes)
  } catch {
    throw new TextRefusal('not_xml', 'The file is not text (it is not valid UTF-8 or UTF-16), so it cannot be SVG.')
  }
  if (text.includes('\0')) throw new TextRefusal('not_xml', 'The file contains NUL characters, so it is not XML text.')
  return text
}

function short(value: string): string {
  const trimmed = value.trim()
  return trimmed.length > 80 ? `${trimmed.slice(0, 77)}…` : trimmed
}

/** True for a reference that stays inside the file: a fragment (#id), embedded data (data:) or empty. */
function isLocalReference(value: string): boolean {
  const trimmed = value.trim()
  return trimmed === '' || trimmed.startsWith('#') || /^data:/i.test(trimmed)
}

function checkUrls(value: string, where: () => string): void {
  const pattern = /url\(\s*(['"]?)/gi
  for (let match = pattern.exec(value); match; match = pattern.exec(value)) {
    const target = value.slice(match.index + match[0].length)
    if (!target.startsWith('#') && !/^data:/i.test(target)) {
      throw new TextRefusal('external_reference', `${where()} refers outside the file (url(${short(target.split(')')[0])})); only #id references are allowed.`)
    }
  }
}

/**
 * Checks the raw bytes of an SVG upload and returns its text, or a refusal with a message
 * that says where (line numbers) and what to change. Never expands an entity: DOCTYPE and
 * ENTITY are refused as soon as they appear anywhere in the text, even inside comments.
 */
export function checkSvgText(bytes: Uint8Array, limits: SvgTextLimits): SvgTextCheck {
  try {
    const text = decodeBytes(bytes)
    const elementCount = scanXml(text, limits)
    return { ok: true, text, elementCount }
  } catch (error) {
    if (error instanceof TextRefusal) return { ok: false, code: error.code, message: error.message }
    throw error
  }
}

function refuseNotXml(text: string, message: string, position: number): never {
  throw new TextRefusal('not_xml', `The file is not well-formed XML: ${message} (line ${lineOf(text, position)}).`)
}

function checkReferences(text: string, value: string, position: number): void {
  for (let at = value.indexOf('&'); at >= 0; at = value.indexOf('&', at + 1)) {
    REFERENCE.lastIndex = at
    const reference = REFERENCE.exec(value)?.[1]
    if (reference === undefined) refuseNotXml(text, 'a bare "&" (write &amp;)', position)
    if (reference[0] === '#') {
      if (!isXmlChar(codePointOf(reference))) refuseNotXml(text, `the character reference &${reference}; is not an XML character`, position)
    } else if (!(reference in PREDEFINED)) {
      throw new TextRefusal('entity', `The file uses the undeclared entity &${reference}; (line ${lineOf(text, position)}); only &lt; &gt; &amp; &apos; &quot; and character references are allowed.`)
    }
  }
}

function readName(text: string, at: number): string | undefined {
  NAME.lastIndex = at
  return NAME.exec(text)?.[0]
}

function scanXml(text: string, limits: SvgTextLimits): number {
  const doctype = /<!DOCTYPE/i.exec(text)
  if (doctype) {
    throw new TextRefusal('doctype', `The file has a DOCTYPE declaration (line ${lineOf(text, doctype.index)}); SVG uploads must not have one. Remove the <!DOCTYPE …> line.`)
  }
  const entity = /<!ENTITY/i.exec(text)
  if (entity) throw new TextRefusal('entity', `The file declares an ENTITY (line ${lineOf(text, entity.index)}); entity declarations are refused.`)

  const stack: string[] = []
  let elementCount = 0
  let rootSeen = false
  let position = text.charCodeAt(0) === 0xfeff ? 1 : 0
  const firstPosition = position
  while (position < text.length) {
    const open = text.indexOf('<', position)
    const textEnd = open < 0 ? text.length : open
    if (textEnd > position) {
      const content = text.slice(position, textEnd)
      if (stack.length === 0) {
        if (content.trim() !== '') refuseNotXml(text, rootSeen ? 'text after the root element' : 'text before the root element', position)
      } else {
        checkReferences(text, content, position)
        if (stack[stack.length - 1] === 'style') checkStyleText(decodeXmlReferences(content))
      }
    }
    if (open < 0) break
    if (text.startsWith('<!--', open)) {
      const close = text.indexOf('-->', open + 4)
      if (close < 0) refuseNotXml(text, 'a comment that is never closed', open)
      position = close + 3
    } else if (text.startsWith('<![CDATA[', open)) {
      if (stack.length === 0) refuseNotXml(text, 'CDATA outside the root element', open)
      const close = text.indexOf(']]>', open + 9)
      if (close < 0) refuseNotXml(text, 'a CDATA section that is never closed', open)
      if (stack[stack.length - 1] === 'style') checkStyleText(text.slice(open + 9, close))
      position = close + 3
    } else if (text.startsWith('<?', open)) {
      const close = text.indexOf('?>', open + 2)
      if (close < 0) refuseNotXml(text, 'a processing instruction that is never closed', open)
      checkProcessingInstruction(text, text.slice(open + 2, close), open, firstPosition)
      position = close + 2
    } else if (text.startsWith('<!', open)) {
      refuseNotXml(text, 'an unexpected "<!" declaration', open)
    } else if (text.startsWith('</', open)) {
      const name = readName(text, open + 2)
      if (name === undefined) refuseNotXml(text, '"</" is not followed by a tag name', open)
      END_TAG_END.lastIndex = open + 2 + name.length
      if (!END_TAG_END.exec(text)) refuseNotXml(text, `the end tag </${name} is not closed with ">"`, open)
      const expected = stack.pop()
      if (expected !== name) refuseNotXml(text, expected ? `</${name}> closes <${expected}>` : `</${name}> closes nothing`, open)
      position = END_TAG_END.lastIndex
    } else {
      const name = readName(text, open + 1)
      if (name === undefined) refuseNotXml(text, '"<" is not followed by a tag name (write &lt;)', open)
      if (rootSeen && stack.length === 0) refuseNotXml(text, 'a second root element', open)
      const attributes = new Map<string, string>()
      ATTRIBUTE.lastIndex = open + 1 + name.length
      let at = ATTRIBUTE.lastIndex
      for (let match = ATTRIBUTE.exec(text); match; match = ATTRIBUTE.exec(text)) {
        const [, attribute, doubleQuoted, singleQuoted] = match
        if (attributes.has(attribute)) refuseNotXml(text, `the attribute ${attribute} appears twice on <${name}>`, open)
        const raw = doubleQuoted ?? singleQuoted
        checkReferences(text, raw, open)
        const value = decodeXmlReferences(raw)
        attributes.set(attribute, value)
        checkAttributeReference(text, name, attribute, value, open)
        at = ATTRIBUTE.lastIndex
      }
      TAG_END.lastIndex = at
      const end = TAG_END.exec(text)
      if (!end) refuseNotXml(text, `the start tag <${name}> is malformed or not closed`, open)
      elementCount++
      if (elementCount > limits.maxElements) {
        throw new TextRefusal('too_many_elements', `The file has more than ${limits.maxElements} elements; split it into smaller files.`)
      }
      if (!rootSeen) {
        rootSeen = true
        checkRoot(name, attributes)
      }
      if (end[1] !== '/') {
        stack.push(name)
        if (stack.length > limits.maxDepth) {
          throw new TextRefusal('too_deep', `Elements are nested more than ${limits.maxDepth} deep (line ${lineOf(text, open)}).`)
        }
      }
      position = TAG_END.lastIndex
    }
  }
  if (stack.length > 0) refuseNotXml(text, `the file ends before </${stack[stack.length - 1]}> (truncated?)`, text.length)
  if (!rootSeen) {
    throw new TextRefusal('not_xml', text.trim() === '' ? 'The file is empty.' : 'The file has no XML element.')
  }
  return elementCount
}

function checkProcessingInstruction(text: string, body: string, position: number, firstPosition: number): void {
  const target = /^\S*/.exec(body)?.[0].toLowerCase() ?? ''
  if (target === 'xml' && position !== firstPosition) refuseNotXml(text, 'the XML declaration is not at the very start', position)
  if (target === 'xml-stylesheet') {
    const href = /href\s*=\s*(?:"([^"]*)"|'([^']*)')/.exec(body)
    const value = href ? href[1] ?? href[2] : ''
    if (!isLocalReference(value)) {
      throw new TextRefusal('external_reference', `An <?xml-stylesheet?> instruction (line ${lineOf(text, position)}) refers outside the file ("${short(value)}").`)
    }
  }
}

function checkRoot(name: string, attributes: ReadonlyMap<string, string>): void {
  const namespace = attributes.get('xmlns')
  if (name !== 'svg' || (namespace !== undefined && namespace !== SVG_NAMESPACE)) {
    const what = name === 'svg' ? `<svg> in the namespace "${short(namespace ?? '')}"` : `<${name}>`
    throw new TextRefusal('not_svg', `The file is XML but not SVG: its root element is ${what}, not <svg>.`)
  }
}

function checkAttributeReference(text: string, element: string, attribute: string, value: string, position: number): void {
  const where = (): string => `<${element} ${attribute}> (line ${lineOf(text, position)})`
  if ((attribute === 'href' || attribute.endsWith(':href')) && !isLocalReference(value)) {
    throw new TextRefusal('external_reference', `${where()} refers outside the file ("${short(value)}"); only #id references are allowed.`)
  }
  if (/url\(/i.test(value)) checkUrls(value, where)
}

function checkStyleText(css: string): void {
  if (/@import/i.test(css)) throw new TextRefusal('external_reference', 'A <style> element uses @import; stylesheets from outside the file are refused.')
  checkUrls(css, () => 'A <style> element')
}
