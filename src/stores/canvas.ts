import { defineStore } from 'pinia'
import { computed, ref, shallowReadonly, shallowRef } from 'vue'
import type { PathDetail } from '../../shared/api'
import { createEmptyPath, hasPoint, hasSegment, parseEditPath, serializeEditPath } from '../canvas/edit-path'
import type { CanvasProbe, CanvasSweep, EditPath, PointRef, SegmentRef } from '../canvas/types'

/** One path on the canvas sheet: what it was when loaded or saved, and its current edit. */
export interface SheetPath {
  /** `path-${id}` for a saved path, `new-${n}` for one drawn here. */
  readonly key: string
  readonly pathId: number | null
  readonly name: string
  /** Revision the edit started from (null: never saved). */
  readonly revision: number | null
  readonly fillRule: 'nonzero' | 'evenodd'
  readonly units: string
  readonly origin: 'drawn' | 'svg' | 'font'
  readonly metadata: Record<string, unknown> | null
  readonly visible: boolean
  /** As last loaded or saved. */
  readonly saved: EditPath
  /** Current state. */
  readonly edit: EditPath
}

/** A hit chosen in the table or on the sheet: hit `index` of line `lineId` (a probe id, or `${sweepId}#${row}`) on sheet `pathKey`. */
export interface HitRef {
  readonly lineId: string
  readonly pathKey: string
  readonly index: number
}

export type SelectMode = 'replace' | 'add' | 'toggle'

/** What one undo step restores: immutable data, so a snapshot holds references only. */
interface Snapshot {
  readonly edits: ReadonlyMap<string, EditPath>
  readonly probes: readonly CanvasProbe[]
  readonly sweeps: readonly CanvasSweep[]
}

interface UndoEntry {
  readonly label: string
  /** The state to go back to (on the undo stack) or forward to (on the redo stack). */
  readonly state: Snapshot
}

/** Undo keeps at most this many steps; the oldest go first. */
export const UNDO_LIMIT = 200

const PROBE_NOUNS: Readonly<Record<CanvasProbe['type'], string>> = { ray: 'ray', line: 'line', segment: 'segment' }

// Serialisations of immutable edits, computed once per object (isDirty is asked on every render).
const serialized = new WeakMap<EditPath, string>()
function dataOf(path: EditPath): string {
  let data = serialized.get(path)
  if (data === undefined) serialized.set(path, (data = serializeEditPath(path)))
  return data
}

function parseOrThrow(data: string): EditPath {
  const parsed = parseEditPath(data)
  if (!parsed.ok) throw new Error(parsed.message)
  return parsed.path
}

/** Plain-data equality (numbers by ===), for telling whether a gesture or an edit changed anything. */
function isSameData(a: unknown, b: unknown): boolean {
  if (a === b) return true
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false
  if (Array.isArray(a) !== Array.isArray(b)) return false
  const keysA = Object.keys(a)
  const keysB = Object.keys(b)
  if (keysA.length !== keysB.length) return false
  return keysA.every((key) => Object.prototype.hasOwnProperty.call(b, key) && isSameData((a as Record<string, unknown>)[key], (b as Record<string, unknown>)[key]))
}

/** Whether going to `target` from `from` would change nothing: the edits of the sheets both hold, the probes, the sweeps. */
function changesNothing(target: Snapshot, from: Snapshot): boolean {
  for (const [key, edit] of target.edits) {
    const other = from.edits.get(key)
    if (other !== undefined && !isSameData(edit, other)) return false
  }
  return isSameData(target.probes, from.probes) && isSameData(target.sweeps, from.sweeps)
}

function sheetFromDetail(detail: PathDetail, edit: EditPath, visible: boolean): SheetPath {
  return {
    key: `path-${detail.id}`,
    pathId: detail.id,
    name: detail.name,
    revision: detail.revision,
    fillRule: detail.fillRule,
    units: detail.units,
    origin: detail.origin,
    metadata: detail.metadata,
    visible,
    saved: edit,
    edit,
  }
}

/**
 * The canvas sheet: the paths open on it with their edits, the probes and sweeps cast
 * across them, what is selected, and one undo history for all of it. Paths, probes and
 * sweeps are immutable plain data held in shallow refs and exposed as they are (no deep
 * proxies over thousands of segments), so an unchanged edit keeps its identity.
 *
 * Undo steps: editActive, endGesture (one per drag), and probe and sweep changes made
 * outside a gesture; opening, closing, selecting and saving are not steps. Undo restores
 * the edits of sheets still open, the probes and the sweeps, and drops selected points,
 * segment, probe or hit that no longer exist. Undo and redo do nothing during a gesture.
 */
export const useCanvasStore = defineStore('canvas', () => {
  const sheets = shallowRef<readonly SheetPath[]>([])
  const activeKey = ref<string | null>(null)
  const selection = shallowRef<readonly PointRef[]>([])
  const selectedSegment = shallowRef<SegmentRef | null>(null)
  const probes = shallowRef<readonly CanvasProbe[]>([])
  const sweeps = shallowRef<readonly CanvasSweep[]>([])
  const selectedProbeId = ref<string | null>(null)
  const selectedHit = shallowRef<HitRef | null>(null)
  const undoStack = shallowRef<readonly UndoEntry[]>([])
  const redoStack = shallowRef<readonly UndoEntry[]>([])

  let gestureStart: Snapshot | null = null
  let nextNew = 1
  let nextProbe = 1
  let nextSweep = 1

  const active = computed(() => sheets.value.find((sheet) => sheet.key === activeKey.value) ?? null)
  const canUndo = computed(() => undoStack.value.length > 0)
  const canRedo = computed(() => redoStack.value.length > 0)
  const undoLabel = computed(() => undoStack.value.at(-1)?.label ?? null)
  const redoLabel = computed(() => redoStack.value.at(-1)?.label ?? null)
  const anyDirty = computed(() => sheets.value.some((sheet) => dataOf(sheet.edit) !== dataOf(sheet.saved)))

  function findSheet(key: string): SheetPath | undefined {
    return sheets.value.find((sheet) => sheet.key === key)
  }

  function requireSheet(key: string): SheetPath {
    const sheet = findSheet(key)
    if (sheet === undefined) throw new RangeError(`no path ${key} is open on the canvas`)
    return sheet
  }

  function replaceSheet(key: string, change: (sheet: SheetPath) => SheetPath): void {
    sheets.value = sheets.value.map((sheet) => (sheet.key === key ? change(sheet) : sheet))
  }

  /** Whether a sheet's edit differs from what was last loaded or saved (as path data). */
  function isDirty(key: string): boolean {
    const sheet = findSheet(key)
    return sheet !== undefined && dataOf(sheet.edit) !== dataOf(sheet.saved)
  }

  // --- selection -------------------------------------------------------------------------

  function clearPathSelection(): void {
    selection.value = []
    selectedSegment.value = null
  }

  /** Drops selected things that no longer exist (after an undo, a close or a save). */
  function pruneSelection(): void {
    const edit = active.value?.edit ?? null
    const points = edit === null ? [] : selection.value.filter((ref) => hasPoint(edit, ref))
    if (points.length !== selection.value.length) selection.value = points
    if (selectedSegment.value !== null && (edit === null || !hasSegment(edit, selectedSegment.value))) selectedSegment.value = null
    if (selectedProbeId.value !== null && !probes.value.some((p) => p.id === selectedProbeId.value)) selectedProbeId.value = null
    const hit = selectedHit.value
    if (hit !== null && (findSheet(hit.pathKey) === undefined || !lineExists(hit.lineId))) selectedHit.value = null
  }

  function lineExists(lineId: string): boolean {
    const [id, row] = lineId.split('#')
    if (row === undefined) return probes.value.some((p) => p.id === id)
    const sweep = sweeps.value.find((s) => s.id === id)
    return sweep !== undefined && /^\d+$/.test(row) && Number(row) < sweep.count
  }

  const sameRef = (a: PointRef, b: PointRef): boolean => a.contour === b.contour && a.segment === b.segment && a.role === b.role

  /** Selects points of the active path: replace the selection, add to it, or toggle each point. Points the path lacks are ignored. */
  function select(refs: readonly PointRef[], mode: SelectMode = 'replace'): void {
    const edit = active.value?.edit
    if (edit === undefined) return
    const given: PointRef[] = []
    for (const ref of refs) {
      if (hasPoint(edit, ref) && !given.some((g) => sameRef(g, ref))) given.push({ contour: ref.contour, segment: ref.segment, role: ref.role })
    }
    const current = selection.value
    if (mode === 'replace') selection.value = given
    else if (mode === 'add') selection.value = [...current, ...given.filter((ref) => !current.some((c) => sameRef(c, ref)))]
    else {
      const kept = current.filter((c) => !given.some((ref) => sameRef(c, ref)))
      selection.value = [...kept, ...given.filter((ref) => !current.some((c) => sameRef(c, ref)))]
    }
  }

  function clearSelection(): void {
    selection.value = []
  }

  function selectSegment(segmentRef: SegmentRef | null): void {
    const edit = active.value?.edit
    selectedSegment.value = segmentRef !== null && edit !== undefined && hasSegment(edit, segmentRef) ? { ...segmentRef } : null
  }

  function selectProbe(id: string | null): void {
    selectedProbeId.value = id
  }

  function selectHit(hit: HitRef | null): void {
    selectedHit.value = hit === null ? null : { ...hit }
  }

  // --- undo ------------------------------------------------------------------------------

  function snapshot(): Snapshot {
    return { edits: new Map(sheets.value.map((sheet) => [sheet.key, sheet.edit])), probes: probes.value, sweeps: sweeps.value }
  }

  function restore(state: Snapshot): void {
    sheets.value = sheets.value.map((sheet) => {
      const edit = state.edits.get(sheet.key)
      return edit === undefined || edit === sheet.edit ? sheet : { ...sheet, edit }
    })
    probes.value = state.probes
    sweeps.value = state.sweeps
    pruneSelection()
  }

  function pushUndo(label: string, before: Snapshot): void {
    const stack = [...undoStack.value, { label, state: before }]
    undoStack.value = stack.length > UNDO_LIMIT ? stack.slice(stack.length - UNDO_LIMIT) : stack
    redoStack.value = []
  }

  /** Runs a change as one undo step (none when nothing changed); inside a gesture it only changes the state. */
  function step(label: string, change: () => void): void {
    if (gestureStart !== null) {
      change()
      return
    }
    const before = snapshot()
    change()
    if (!changesNothing(before, snapshot())) pushUndo(label, before)
  }

  /** Moves the top step of one stack onto the other (with the present state) and restores its state; none during a gesture. */
  function travel(from: typeof undoStack, to: typeof undoStack): void {
    const entry = from.value.at(-1)
    if (entry === undefined || gestureStart !== null) return
    from.value = from.value.slice(0, -1)
    to.value = [...to.value, { label: entry.label, state: snapshot() }]
    restore(entry.state)
  }

  function undo(): void {
    travel(undoStack, redoStack)
  }

  function redo(): void {
    travel(redoStack, undoStack)
  }

  /** Rewrites (or, with `to` null, forgets) a sheet key in every undo and redo state. */
  function rekeyHistory(from: string, to: string | null): void {
    const rekey = (entries: readonly UndoEntry[]): readonly UndoEntry[] =>
      entries.map((entry) => {
        const edit = entry.state.edits.get(from)
        if (edit === undefined) return entry
        const edits = new Map(entry.state.edits)
        edits.delete(from)
        if (to !== null) edits.set(to, edit)
        return { label: entry.label, state: { ...entry.state, edits } }
      })
    undoStack.value = rekey(undoStack.value)
    redoStack.value = rekey(redoStack.value)
    if (to === null) {
      undoStack.value = dropDeadSteps(undoStack.value)
      redoStack.value = dropDeadSteps(redoStack.value)
    }
  }

  /** A stack without the steps that only touched a forgotten sheet, walking away from the present. */
  function dropDeadSteps(entries: readonly UndoEntry[]): readonly UndoEntry[] {
    const kept: UndoEntry[] = []
    let from = snapshot()
    for (let i = entries.length - 1; i >= 0; i--) {
      if (changesNothing(entries[i].state, from)) continue
      kept.push(entries[i])
      from = entries[i].state
    }
    return kept.length === entries.length ? entries : kept.reverse()
  }

  // --- sheets ----------------------------------------------------------------------------

  function activate(key: string | null): void {
    if (activeKey.value === key) return
    activeKey.value = key
    clearPathSelection()
  }

  /**
   * Opens a saved path on the sheet and makes it active; returns its key. A path already
   * open only becomes active, keeping its edits. Unparseable data throws an Error with the
   * parser's sentence.
   */
  function openPath(detail: PathDetail): string {
    const key = `path-${detail.id}`
    if (findSheet(key) === undefined) {
      sheets.value = [...sheets.value, sheetFromDetail(detail, parseOrThrow(detail.data), true)]
    }
    activate(key)
    return key
  }

  /** Adds an empty path drawn here (key `new-${n}`), active. */
  function newPath(name = 'Untitled path'): string {
    const key = `new-${nextNew++}`
    const empty = createEmptyPath()
    sheets.value = [
      ...sheets.value,
      { key, pathId: null, name, revision: null, fillRule: 'nonzero', units: 'px', origin: 'drawn', metadata: null, visible: true, saved: empty, edit: empty },
    ]
    activate(key)
    return key
  }

  /** Takes a path off the sheet (its edits go, from the history too); the next one, else the previous, becomes active. */
  function closePath(key: string): void {
    const index = sheets.value.findIndex((sheet) => sheet.key === key)
    if (index === -1) return
    const remaining = sheets.value.filter((sheet) => sheet.key !== key)
    sheets.value = remaining
    rekeyHistory(key, null)
    if (activeKey.value === key) activate(remaining[Math.min(index, remaining.length - 1)]?.key ?? null)
    pruneSelection()
  }

  function setActive(key: string): void {
    requireSheet(key)
    activate(key)
  }

  function setVisible(key: string, visible: boolean): void {
    if (requireSheet(key).visible === visible) return
    replaceSheet(key, (sheet) => ({ ...sheet, visible }))
  }

  function setActiveEdit(edit: EditPath): void {
    const key = activeKey.value
    if (key === null) return
    replaceSheet(key, (sheet) => (sheet.edit === edit ? sheet : { ...sheet, edit }))
  }

  /** Changes the active path as one undo step labelled `label` ("Move point", …); no step when nothing changed or no path is active. */
  function editActive(label: string, change: (path: EditPath) => EditPath): void {
    const sheet = active.value
    if (sheet === null) return
    const next = change(sheet.edit)
    if (next === sheet.edit || isSameData(next, sheet.edit)) return
    step(label, () => setActiveEdit(next))
    pruneSelection()
  }

  /** Starts a drag: changes until endGesture make one undo step. A second call during a gesture keeps the first start. */
  function beginGesture(): void {
    if (gestureStart === null) gestureStart = snapshot()
  }

  /** Shows the active path as it is during a drag (no undo step); only between beginGesture and endGesture. */
  function previewActive(path: EditPath): void {
    if (gestureStart === null) throw new Error('previewActive is only for a drag: call beginGesture first.')
    setActiveEdit(path)
  }

  /** Ends a drag with one undo step from the state at beginGesture, or none when nothing changed. */
  function endGesture(label: string): void {
    const before = gestureStart
    if (before === null) return
    gestureStart = null
    if (!changesNothing(before, snapshot())) pushUndo(label, before)
    pruneSelection()
  }

  /**
   * After a save: the sheet's saved state and edit become the stored data, with the path's
   * id, revision, name, fill rule, units, origin and metadata; a `new-n` sheet becomes
   * `path-${id}` (kept active, its history follows it). Returns the key. A sheet already
   * open under that key is replaced by this one.
   */
  function markSaved(key: string, detail: PathDetail): string {
    const sheet = requireSheet(key)
    const edit = parseOrThrow(detail.data)
    const next = sheetFromDetail(detail, edit, sheet.visible)
    if (next.key !== key) {
      sheets.value = sheets.value.filter((s) => s.key !== next.key)
      rekeyHistory(next.key, null)
      rekeyHistory(key, next.key)
      if (selectedHit.value?.pathKey === key) selectedHit.value = { ...selectedHit.value, pathKey: next.key }
    }
    sheets.value = sheets.value.map((s) => (s.key === key ? next : s))
    if (activeKey.value === key) activeKey.value = next.key
    pruneSelection()
    return next.key
  }

  // --- probes and sweeps -----------------------------------------------------------------

  function addProbe(probe: Omit<CanvasProbe, 'id'>): string {
    const id = `probe-${nextProbe++}`
    step(`Add ${PROBE_NOUNS[probe.type]}`, () => {
      probes.value = [...probes.value, { id, type: probe.type, a: probe.a, b: probe.b }]
    })
    return id
  }

  /** Changes a probe (unknown ids are ignored); an undo step "Edit ray" etc. outside a gesture. */
  function updateProbe(id: string, patch: Partial<Omit<CanvasProbe, 'id'>>): void {
    const probe = probes.value.find((p) => p.id === id)
    if (probe === undefined) return
    const next: CanvasProbe = { ...probe, ...patch, id }
    step(`Edit ${PROBE_NOUNS[next.type]}`, () => {
      probes.value = probes.value.map((p) => (p.id === id ? next : p))
    })
  }

  function removeProbe(id: string): void {
    const probe = probes.value.find((p) => p.id === id)
    if (probe === undefined) return
    step(`Delete ${PROBE_NOUNS[probe.type]}`, () => {
      probes.value = probes.value.filter((p) => p.id !== id)
    })
    pruneSelection()
  }

  function addSweep(sweep: Omit<CanvasSweep, 'id'>): string {
    const id = `sweep-${nextSweep++}`
    step('Add sweep', () => {
      sweeps.value = [...sweeps.value, { id, angle: sweep.angle, spacing: sweep.spacing, count: sweep.count, origin: sweep.origin }]
    })
    return id
  }

  function updateSweep(id: string, patch: Partial<Omit<CanvasSweep, 'id'>>): void {
    const sweep = sweeps.value.find((s) => s.id === id)
    if (sweep === undefined) return
    const next: CanvasSweep = { ...sweep, ...patch, id }
    step('Edit sweep', () => {
      sweeps.value = sweeps.value.map((s) => (s.id === id ? next : s))
    })
    pruneSelection()
  }

  function removeSweep(id: string): void {
    if (!sweeps.value.some((s) => s.id === id)) return
    step('Delete sweep', () => {
      sweeps.value = sweeps.value.filter((s) => s.id !== id)
    })
    pruneSelection()
  }

  /** Replaces every probe and sweep (a probe set loaded), with fresh ids, as one undo step. */
  function replaceProbes(nextProbes: Omit<CanvasProbe, 'id'>[], nextSweeps: Omit<CanvasSweep, 'id'>[]): void {
    step('Replace probes', () => {
      probes.value = nextProbes.map((p) => ({ id: `probe-${nextProbe++}`, type: p.type, a: p.a, b: p.b }))
      sweeps.value = nextSweeps.map((s) => ({ id: `sweep-${nextSweep++}`, angle: s.angle, spacing: s.spacing, count: s.count, origin: s.origin }))
    })
    pruneSelection()
  }

  /** Clears everything (leaving the project): sheets, probes, selection, history and id counters. */
  function reset(): void {
    sheets.value = []
    activeKey.value = null
    selection.value = []
    selectedSegment.value = null
    probes.value = []
    sweeps.value = []
    selectedProbeId.value = null
    selectedHit.value = null
    undoStack.value = []
    redoStack.value = []
    gestureStart = null
    nextNew = 1
    nextProbe = 1
    nextSweep = 1
  }

  return {
    sheets: shallowReadonly(sheets),
    activeKey: shallowReadonly(activeKey),
    selection: shallowReadonly(selection),
    selectedSegment: shallowReadonly(selectedSegment),
    probes: shallowReadonly(probes),
    sweeps: shallowReadonly(sweeps),
    selectedProbeId: shallowReadonly(selectedProbeId),
    selectedHit: shallowReadonly(selectedHit),
    active,
    canUndo,
    canRedo,
    undoLabel,
    redoLabel,
    anyDirty,
    isDirty,
    openPath,
    newPath,
    closePath,
    setActive,
    setVisible,
    editActive,
    beginGesture,
    previewActive,
    endGesture,
    select,
    clearSelection,
    selectSegment,
    addProbe,
    updateProbe,
    removeProbe,
    addSweep,
    updateSweep,
    removeSweep,
    replaceProbes,
    selectProbe,
    selectHit,
    undo,
    redo,
    markSaved,
    reset,
  }
})
