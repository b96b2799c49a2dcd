/**
 * SVG file → paths for the Library. The raw text is checked first (svg-xml-check.ts: not XML,
 * DOCTYPE, ENTITY, external references, element count and depth), then parsed with svgson;
 * every path, rect, circle, ellipse, line, polyline and polygon becomes absolute path data in
 * the root viewport's coordinates, with all ancestor transforms and every viewBox composed in
 * (arcs stay arcs: svgpath maps an arc's ellipse through the matrix). Nothing is executed,
 * fetched or rendered; scripts, event attributes, foreignObject, images and text are ignored
 * with a warning and never stored.
 */
import svgpath from 'svgpath'
import { parseSync } from 'svgson'
import type { INode } from 'svgson'
import { parsePathData } from '../../../shared/geometry/index'
import type { FillRule } from '../../../shared/geometry/index'
import { chooseDecimals, formatPathCommands } from './path-data-format'
import type { PathCommand } from './path-data-format'
import { convertShapeToPathData, readLength, SHAPE_ELEMENTS } from './svg-shapes'
import type { ShapeContext, ShapeElement } from './svg-shapes'
import {
  computeDeterminant, computeViewBoxMatrix, DEFAULT_ASPECT_RATIO, IDENTITY, multiplyMatrices,
  parseAspectRatio, parseTransformList, parseViewBox,
} from './svg-transform'
import type { Matrix, Size } from './svg-transform'
import { checkSvgText, decodeXmlReferences } from './svg-xml-check'

/** Why an SVG file was refused as a whole. */
export type SvgRefusalCode =
  | 'too_large' | 'not_xml' | 'not_svg' | 'doctype' | 'entity' | 'external_reference'
  | 'too_many_elements' | 'too_deep' | 'too_many_segments'

/** One shape of the file as path data. */
export interface ImportedPath {
  /** The element's id, else its <title>, else "<element> n" (n counts that element kind in document order). */
  name: string
  /** Absolute path data (M L H V C S Q T A Z) in the root viewport's coordinates; arcs stay A commands. */
  data: string
  fillRule: FillRule
  element: ShapeElement
  elementId?: string
  warnings: string[]
}

export type SvgImportResult =
  | { ok: true; fileName: string; paths: ImportedPath[]; warnings: string[] }
  | { ok: false; fileName: string; code: SvgRefusalCode; message: string }

/** The limits importSvg enforces (the upload route states maxBytes in the UI). */
export const SVG_IMPORT_LIMITS = {
  maxBytes: 2 * 1024 * 1024,
  maxElements: 10_000,
  /** Nesting depth of elements; real drawings stay far below (editors nest a few dozen groups). */
  maxDepth: 128,
  /** <use> inside <use> chains followed at most this deep. */
  maxUseDepth: 8,
  maxSegmentsPerPath: 20_000,
  maxSegmentsPerFile: 200_000,
  /** Distinct file warnings kept; the rest are counted in one last warning. */
  maxWarnings: 200,
} as const

class ImportRefusal {
  constructor(readonly code: SvgRefusalCode, readonly message: string) {}
}

/** What an element inherits from its ancestors. */
interface Scope {
  readonly matrix: Matrix
  readonly fillRule: FillRule
  readonly hidden: boolean
  /** The nearest viewport in user units (for percentages), null when unknown. */
  readonly viewport: Size | null
  /** Ids of the <use> targets being expanded (cycle guard). */
  readonly uses: readonly string[]
  /** The id of the innermost <use> with an id, for names; and the element that <use> drew. */
  readonly useName: string | null
  readonly useTarget: INode | null
}

interface ImportState {
  readonly ids: ReadonlyMap<string, INode>
  readonly paths: ImportedPath[]
  readonly warnings: Map<string, number>
  readonly ordinals: Map<string, number>
  segments: number
  visited: number
  /** Shapes inside <defs> and the like, until drawn through <use>. */
  readonly definedShapes: Set<INode>
}

type Attributes = Readonly<Record<string, string>>

const attributeCache = new WeakMap<INode, Attributes>()

/** Attribute values with their character and entity references decoded (svgson leaves them as written). */
function attributesOf(node: INode): Attributes {
  let attributes = attributeCache.get(node)
  if (!attributes) {
    attributes = Object.fromEntries(Object.entries(node.attributes).map(([name, value]) => [name, decodeXmlReferences(value)]))
    attributeCache.set(node, attributes)
  }
  return attributes
}

/** A presentation property: the style attribute wins over the attribute of the same name (SVG 1.1 chapter 6, Styling: presentation attributes come last in the cascade). */
function readProperty(attributes: Attributes, name: string): string | undefined {
  const style = attributes.style
  if (style !== undefined) {
    for (const declaration of style.replace(/\/\*[\s\S]*?\*\//g, '').split(';')) {
      const colon = declaration.indexOf(':')
      if (colon > 0 && declaration.slice(0, colon).trim().toLowerCase() === name) {
        return declaration.slice(colon + 1).replace(/!\s*important\s*$/i, '').trim()
      }
    }
  }
  return attributes[name]?.trim()
}

function short(value: string): string {
  return value.length > 60 ? `${value.slice(0, 57)}…` : value
}

function note(state: ImportState, message: string): void {
  state.warnings.set(message, (state.warnings.get(message) ?? 0) + 1)
}

function fileWarnings(state: ImportState): string[] {
  const list = [...state.warnings].map(([message, count]) => (count > 1 ? `${message} (${count} times)` : message))
  if (list.length <= SVG_IMPORT_LIMITS.maxWarnings) return list
  return [...list.slice(0, SVG_IMPORT_LIMITS.maxWarnings), `… and ${list.length - SVG_IMPORT_LIMITS.maxWarnings} more warnings`]
}

function eventAttributes(attributes: Attributes): string[] {
  return Object.keys(attributes).filter((name) => /^on[a-z]/i.test(name))
}

function titleOf(node: INode): string | undefined {
  const title = node.children.find((child) => child.type === 'element' && child.name === 'title')
  if (!title) return undefined
  const text = decodeXmlReferences(title.children.filter((child) => child.type === 'text').map((child) => child.value).join(''))
  const collapsed = text.replace(/\s+/g, ' ').trim()
  return collapsed === '' ? undefined : collapsed.slice(0, 200)
}

/** The scope of an element's content: its transform, fill-rule and display composed onto the parent's. */
function deriveScope(scope: Scope, attributes: Attributes, warn: (message: string) => void): Scope {
  let matrix = scope.matrix
  if (attributes.transform !== undefined) {
    const transform = parseTransformList(attributes.transform)
    if (transform === null) warn(`transform="${short(attributes.transform)}" is malformed; ignored`)
    else matrix = multiplyMatrices(matrix, transform)
  }
  const fillRule = readProperty(attributes, 'fill-rule')?.toLowerCase()
  return {
    ...scope,
    matrix,
    fillRule: fillRule === 'nonzero' || fillRule === 'evenodd' ? fillRule : scope.fillRule,
    hidden: scope.hidden || readProperty(attributes, 'display')?.toLowerCase() === 'none',
    useTarget: null,
  }
}

/**
 * The scope inside a viewport element (the root <svg>, a nested <svg>, or a <symbol> drawn by
 * <use>): transform, then translate(x, y) and the viewBox mapped onto width × height per
 * preserveAspectRatio (SVG 1.1 §7.7–7.9). Null when the viewport draws nothing.
 */
function viewportScope(
  state: ImportState, scope: Scope, attributes: Attributes, sizing: Attributes, label: string, isRoot: boolean,
): Scope | null {
  const warn = (message: string): void => note(state, `${label}: ${message}`)
  const inner = deriveScope(scope, attributes, warn)
  const context: ShapeContext = { viewport: scope.viewport, warn }
  // The root's width and height often say 100% of an unknown window: read those as absent.
  const rootPercent = (name: string): boolean => isRoot && /%\s*$/.test(sizing[name] ?? '')
  const x = isRoot ? 0 : readLength(sizing, 'x', 'x', context) ?? 0
  const y = isRoot ? 0 : readLength(sizing, 'y', 'y', context) ?? 0
  let width = rootPercent('width') ? undefined : readLength(sizing, 'width', 'x', context)
  let height = rootPercent('height') ? undefined : readLength(sizing, 'height', 'y', context)
  if (!isRoot && scope.viewport) {
    // Nested viewports default to 100% of the parent viewport (SVG 1.1 §7.9, SVG 2 auto).
    width ??= scope.viewport.width
    height ??= scope.viewport.height
  }
  if ((width !== undefined && width <= 0) || (height !== undefined && height <= 0)) {
    warn('zero or negative width or height: nothing inside is drawn')
    return null
  }
  const viewBox = parseViewBox(attributes.viewBox)
  if (viewBox === 'empty') {
    warn('the viewBox has zero or negative size: nothing inside is drawn')
    return null
  }
  if (attributes.viewBox !== undefined && viewBox === null) warn(`viewBox="${short(attributes.viewBox)}" is malformed; ignored`)
  let aspect = parseAspectRatio(attributes.preserveAspectRatio)
  if (aspect === null) {
    warn(`preserveAspectRatio="${short(attributes.preserveAspectRatio ?? '')}" is malformed; xMidYMid meet used`)
    aspect = DEFAULT_ASPECT_RATIO
  }
  if (!viewBox) {
    return {
      ...inner,
      matrix: multiplyMatrices(inner.matrix, [1, 0, 0, 1, x, y]),
      viewport: width !== undefined && height !== undefined ? { width, height } : scope.viewport,
    }
  }
  // Without a viewport size, the viewBox's own size is used (scale 1); with one side only, the
  // other follows the viewBox's aspect ratio (SVG 2 intrinsic sizing).
  const ratio = viewBox[3] / viewBox[2]
  const size: Size = {
    width: width ?? (height !== undefined ? height / ratio : viewBox[2]),
    height: height ?? (width !== undefined ? width * ratio : viewBox[3]),
  }
  return {
    ...inner,
    matrix: multiplyMatrices(inner.matrix, computeViewBoxMatrix(viewBox, x, y, size, aspect)),
    viewport: { width: viewBox[2], height: viewBox[3] },
  }
}

/** Absolute path data of `source` mapped through `matrix` (svgpath keeps arcs as arcs), tidied to 12 digits. */
function transformPathData(source: string, matrix: Matrix): string {
  const commands: PathCommand[] = []
  let largest = 0
  svgpath(source).abs().matrix([...matrix]).iterate((segment) => {
    const [letter, ...rest] = segment as unknown as [string, ...(number | string)[]]
    const values = rest.map(Number)
    commands.push([letter, ...values])
    values.forEach((value, i) => {
      // Arc rotation and flags are not coordinates.
      if (letter !== 'A' || i < 2 || i > 4) largest = Math.max(largest, Math.abs(value))
    })
  })
  return formatPathCommands(commands, chooseDecimals(largest))
}

function nextOrdinal(state: ImportState, kind: string): number {
  const ordinal = (state.ordinals.get(kind) ?? 0) + 1
  state.ordinals.set(kind, ordinal)
  return ordinal
}

function importShape(state: ImportState, node: INode, kind: ShapeElement, attributes: Attributes, scope: Scope): void {
  const ordinal = nextOrdinal(state, kind)
  state.definedShapes.delete(node)
  const id = attributes.id
  const label = id ? `${kind} #${id}` : `${kind} ${ordinal}`
  const warnings: string[] = eventAttributes(attributes).map((name) => `event attribute ${name} ignored (never run or stored)`)
  const warn = (message: string): void => { warnings.push(message) }
  const own = deriveScope(scope, attributes, warn)
  const skip = (reason: string): void => note(state, `${label}: ${[...warnings, reason].join('; ')}`)

  const source = convertShapeToPathData(kind, attributes, { viewport: scope.viewport, warn })
  if (source === null) return skip('not imported')
  const parsed = parsePathData(source)
  if (!parsed.ok) return skip(`${parsed.error.message} Not imported.`)
  const count = parsed.path.segments.length
  if (count === 0) return skip('draws nothing (no segment of non-zero length); not imported')
  if (count > SVG_IMPORT_LIMITS.maxSegmentsPerPath) {
    throw new ImportRefusal('too_many_segments', `${label} has ${count} segments; at most ${SVG_IMPORT_LIMITS.maxSegmentsPerPath} are allowed per path.`)
  }
  state.segments += count
  if (state.segments > SVG_IMPORT_LIMITS.maxSegmentsPerFile) {
    throw new ImportRefusal('too_many_segments', `The file has more than ${SVG_IMPORT_LIMITS.maxSegmentsPerFile} segments in all; split it into smaller files.`)
  }
  if (computeDeterminant(own.matrix) === 0) return skip('its transforms collapse it to zero area; not imported')
  if (own.hidden) warnings.push('hidden by display:none (on this element or an ancestor); imported anyway')

  const ownName = id ?? titleOf(node) ?? `${kind} ${ordinal}`
  const name = scope.useName === null ? ownName : scope.useTarget === node ? scope.useName : `${scope.useName} / ${ownName}`
  if (scope.uses.length > 0) warnings.push(`drawn through <use href="#${scope.uses[scope.uses.length - 1]}">`)
  const path: ImportedPath = { name, data: transformPathData(source, own.matrix), fillRule: own.fillRule, element: kind, warnings }
  if (id) path.elementId = id
  state.paths.push(path)
}

const DEFINITIONS = new Set(['defs', 'symbol', 'clipPath', 'mask', 'pattern', 'marker'])
const SILENT = new Set([
  'title', 'desc', 'metadata', 'linearGradient', 'radialGradient', 'stop', 'filter', 'view', 'cursor',
  'color-profile', 'font', 'font-face',
])
const ANIMATIONS = new Set(['animate', 'animateTransform', 'animateMotion', 'animateColor', 'set'])
const IGNORED: Readonly<Record<string, string>> = {
  script: '<script> ignored (never run or stored)',
  foreignObject: '<foreignObject> ignored with everything inside it',
  image: '<image> ignored: only vector shapes are imported',
  text: '<text> ignored: text is not converted to outlines',
  style: '<style> not applied: fill-rule is read from attributes and style attributes only',
  switch: '<switch>: every child is imported (conditions are not evaluated)',
}

function collectShapes(node: INode, into: Set<INode>): void {
  const stack = [...node.children]
  for (let child = stack.pop(); child; child = stack.pop()) {
    if (child.type !== 'element') continue
    if ((SHAPE_ELEMENTS as readonly string[]).includes(child.name)) into.add(child)
    stack.push(...child.children)
  }
}

function visitChildren(state: ImportState, node: INode, scope: Scope): void {
  for (const child of node.children) visit(state, child, scope)
}

function visit(state: ImportState, node: INode, scope: Scope): void {
  if (node.type !== 'element') return
  state.visited++
  if (state.visited > SVG_IMPORT_LIMITS.maxElements) {
    throw new ImportRefusal('too_many_elements', `With its <use> references resolved the file draws more than ${SVG_IMPORT_LIMITS.maxElements} elements.`)
  }
  const name = node.name
  if (name.includes(':')) return // another namespace (editor metadata): not drawn
  const attributes = attributesOf(node)
  if ((SHAPE_ELEMENTS as readonly string[]).includes(name)) {
    importShape(state, node, name as ShapeElement, attributes, scope)
    return
  }
  const label = attributes.id ? `<${name} id="${short(attributes.id)}">` : `<${name}>`
  for (const event of eventAttributes(attributes)) note(state, `event attribute ${event} on ${label} ignored (never run or stored)`)
  if (name in IGNORED) note(state, IGNORED[name])
  switch (name) {
    case 'g': case 'a': case 'switch':
      visitChildren(state, node, deriveScope(scope, attributes, (message) => note(state, `${label}: ${message}`)))
      return
    case 'svg': {
      const inner = viewportScope(state, scope, attributes, attributes, label, false)
      if (inner) visitChildren(state, node, inner)
      return
    }
    case 'use':
      visitUse(state, attributes, label, scope)
      return
    default:
      if (DEFINITIONS.has(name)) collectShapes(node, state.definedShapes)
      else if (ANIMATIONS.has(name)) note(state, `<${name}> ignored: the shapes are imported as they are before any animation`)
      else if (!SILENT.has(name) && !(name in IGNORED)) note(state, `<${name}> is not supported; ignored`)
  }
}

/** <use>: the referenced element drawn with the use's transform and translate(x, y) (SVG 1.1, the 'use' element). */
function visitUse(state: ImportState, attributes: Attributes, label: string, scope: Scope): void {
  const href = (attributes.href ?? attributes['xlink:href'] ?? '').trim()
  const skip = (reason: string): void => note(state, `${label}: ${reason}; ignored`)
  if (!href.startsWith('#')) return skip(href === '' ? 'no href' : 'refers to embedded data, which is not supported')
  const id = href.slice(1)
  const target = state.ids.get(id)
  if (!target) return skip(`#${id} does not exist`)
  if (scope.uses.includes(id)) return skip(`#${id} refers back to itself`)
  if (scope.uses.length >= SVG_IMPORT_LIMITS.maxUseDepth) return skip(`<use> nested more than ${SVG_IMPORT_LIMITS.maxUseDepth} deep`)
  const warn = (message: string): void => note(state, `${label}: ${message}`)
  const derived = deriveScope(scope, attributes, warn)
  const context: ShapeContext = { viewport: scope.viewport, warn }
  const x = readLength(attributes, 'x', 'x', context) ?? 0
  const y = readLength(attributes, 'y', 'y', context) ?? 0
  const useScope: Scope = {
    ...derived,
    matrix: multiplyMatrices(derived.matrix, [1, 0, 0, 1, x, y]),
    uses: [...scope.uses, id],
    useName: attributes.id ?? scope.useName,
    useTarget: target,
  }
  if (target.name === 'symbol' || target.name === 'svg') {
    // The use's width and height, when given, size the symbol's viewport (SVG 1.1, the 'use' element).
    const targetAttributes = attributesOf(target)
    const sizing: Record<string, string> = { ...targetAttributes }
    delete sizing.x
    delete sizing.y
    if (attributes.width !== undefined) sizing.width = attributes.width
    if (attributes.height !== undefined) sizing.height = attributes.height
    state.visited++
    const inner = viewportScope(state, useScope, targetAttributes, sizing, `<${target.name} id="${short(id)}">`, false)
    if (inner) visitChildren(state, target, { ...inner, useTarget: null })
    return
  }
  visit(state, target, useScope)
}

function collectIds(root: INode): Map<string, INode> {
  const ids = new Map<string, INode>()
  const stack: INode[] = [root]
  for (let node = stack.pop(); node; node = stack.pop()) {
    if (node.type !== 'element') continue
    const id = attributesOf(node).id
    if (id !== undefined && !ids.has(id)) ids.set(id, node)
    for (let i = node.children.length - 1; i >= 0; i--) stack.push(node.children[i])
  }
  return ids
}

/**
 * Reads an uploaded SVG file into path data. Refusals (ok: false) say why in `message`:
 * too_large, not_xml, not_svg, doctype, entity, external_reference, too_many_elements,
 * too_deep, too_many_segments (limits in SVG_IMPORT_LIMITS). Everything else that cannot be
 * imported is skipped with a warning: per path in `paths[i].warnings`, per file in `warnings`.
 * Coordinates are the root viewport's: a root viewBox is mapped onto width × height (or, without
 * them, onto its own size, so coordinates become relative to the viewBox's corner).
 * @example importSvg(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><rect width="4" height="2"/></svg>'), 'a.svg')
 *   // { ok: true, paths: [{ name: 'rect 1', data: 'M0 0 H4 V2 H0 Z', fillRule: 'nonzero', element: 'rect', warnings: [] }], … }
 */
export function importSvg(buffer: Uint8Array, fileName: string): SvgImportResult {
  const refuse = (code: SvgRefusalCode, message: string): SvgImportResult => ({ ok: false, fileName, code, message })
  if (buffer.length > SVG_IMPORT_LIMITS.maxBytes) {
    return refuse('too_large', `The file is ${buffer.length} bytes; SVG uploads may be at most ${SVG_IMPORT_LIMITS.maxBytes} bytes (2 MB).`)
  }
  const checked = checkSvgText(buffer, SVG_IMPORT_LIMITS)
  if (!checked.ok) return refuse(checked.code, checked.message)
  let root: INode
  try {
    root = parseSync(checked.text)
  } catch (error) {
    return refuse('not_xml', `The file could not be parsed as SVG (${error instanceof Error ? error.message : String(error)}).`)
  }
  const state: ImportState = {
    ids: collectIds(root), paths: [], warnings: new Map(), ordinals: new Map(), segments: 0, visited: 1, definedShapes: new Set(),
  }
  try {
    const attributes = attributesOf(root)
    for (const event of eventAttributes(attributes)) note(state, `event attribute ${event} on <svg> ignored (never run or stored)`)
    const start: Scope = {
      matrix: IDENTITY, fillRule: 'nonzero', hidden: false, viewport: null, uses: [], useName: null, useTarget: null,
    }
    const scope = viewportScope(state, start, attributes, attributes, '<svg>', true)
    if (scope) visitChildren(state, root, scope)
  } catch (error) {
    if (error instanceof ImportRefusal) return refuse(error.code, error.message)
    throw error
  }
  if (state.definedShapes.size > 0) {
    note(state, `${state.definedShapes.size} shape(s) inside <defs>, <symbol>, <clipPath>, <mask>, <marker> or <pattern> are not drawn by any <use>; not imported`)
  }
  if (state.paths.length === 0) note(state, 'no shapes were found to import')
  return { ok: true, fileName, paths: state.paths, warnings: fileWarnings(state) }
}
