import { computed, onScopeDispose, ref, shallowRef, watch, type Ref } from 'vue'
import * as actions from '../../../../shared/layout/actions'
import { createConflictTracker, type ConflictEnvironment, type PieceConflict } from '../../../../shared/layout/conflicts'
import { laneCount, usableArea, type LayoutDocument } from '../../../../shared/layout/document'
import { usableRegionOf } from '../../../../shared/layout/polygonStock'
import { computeLayoutFigures, type DesignForLayout } from '../../../../shared/layout/figures'
import { createHistory, type History } from '../../../../shared/layout/history'
import { mergeLayoutChanges, sameDocument } from '../../../../shared/layout/merge'
import { createShapeCache, polygonFromRings, type PlacedPolygon, type ShapeCache } from '../../../../shared/layout/placedGeometry'
import { createPieceIndex } from '../../../../shared/layout/spatialIndex'
import type { DesignDetail, DesignSummary } from '../../../../shared/schemas/index'
import type { LayoutDetail, LayoutFigures, LayoutItem, LayoutOptions, LayoutPlacement, LayoutStock } from '../../../../shared/schemas/layouts'
import { isApiError } from '../../../api/ApiError'
import * as designsApi from '../../designs/api'
import { summaryOf } from '../../designs/store'
import * as layoutsApi from '../api'
import { documentOf, newPlacementId } from '../layoutDocument'
import { clearDraft, readDraft, writeDraft, type LayoutDraft } from '../layoutDraft'

export type SaveState = 'saved' | 'unsaved' | 'saving'

export interface LayoutEditorHandlers {
  onError: (error: unknown, fallback: string) => void
  onInfo: (message: string) => void
}

/** A stale save: what the server said, kept until the maker chooses. */
export interface LayoutSaveConflict {
  message: string
}

const DRAFT_DELAY_MS = 400

/**
 * One layout open in the editor: the document as immutable snapshots with undo and redo, the design geometry it
 * needs, a spatial index and conflict tracker kept in step with every change, the selection, live figures, saving
 * with the version check, and a draft in localStorage for whatever is not saved yet.
 */
export function useLayoutEditor(workspaceId: Ref<string>, layoutId: Ref<string>, canEdit: Ref<boolean>, handlers: LayoutEditorHandlers) {
  const layout = shallowRef<LayoutDetail | null>(null)
  const loading = ref(true)
  const missing = ref(false)
  const failed = ref(false)

  const document = shallowRef<LayoutDocument | null>(null)
  /** The document as last loaded or saved: "unsaved" means different from this. */
  const savedDocument = shallowRef<LayoutDocument | null>(null)
  const savedFigures = shallowRef<LayoutFigures | null>(null)
  const saving = ref(false)
  const saveConflict = shallowRef<LayoutSaveConflict | null>(null)
  /** A draft of this layout found on this device at opening, different from the saved layout. */
  const offeredDraft = shallowRef<LayoutDraft | null>(null)
  const draftKept = ref(true)
  /** Auto-arrange runs: editing waits until it is done. */
  const busy = ref(false)

  /** Geometry of the layout's designs: a plain map the shape cache reads (designs never change under a layout). */
  const designMap = new Map<string, DesignForLayout>()
  const designSummaries = shallowRef<Record<string, DesignSummary>>({})
  const goneDesigns = shallowRef<ReadonlySet<string>>(new Set())
  const designsVersion = ref(0)
  let shapes: ShapeCache = createShapeCache(designMap)

  const index = createPieceIndex()
  let placementById = new Map<string, LayoutPlacement>()
  let placementOrder = new Map<string, number>()
  let zonePolygons = new Map<number, PlacedPolygon[]>()
  const tracker = createConflictTracker(environment)
  /** Bumped whenever the tracker's answers change, so views re-read them. */
  const conflictsVersion = ref(0)

  const selection = shallowRef<ReadonlySet<string>>(new Set())
  let history: History<LayoutDocument> = createHistory<LayoutDocument>({ name: '', stock: { kind: 'sheets', widthMm: 1, heightMm: 1, sheetCount: 1 }, items: [], placements: [], options: { spacingMm: 0, marginMm: 0, excludedZones: [], snapToGrid: false, gridMm: 5 } })
  const historyVersion = ref(0)

  const editable = computed(() => canEdit.value && !busy.value && document.value !== null)

  function environment(): ConflictEnvironment {
    const current = document.value!
    return {
      index,
      shapeOf: (id) => {
        const placement = placementById.get(id)
        return placement ? shapes.shapeOf(placement) : undefined
      },
      spacingMm: current.options.spacingMm,
      usable: usableArea(current.stock, current.options),
      usableRegion: usableRegionOf(current.stock, current.options.marginMm),
      laneCount: laneCount(current.stock),
      zonesOf: (sheet) => zonePolygons.get(sheet) ?? [],
      orientationAllowed: (id) => {
        const placement = placementById.get(id)
        return !placement || actions.orientationAllowed(actions.itemOf(current, placement.designId), placement)
      },
    }
  }

  function rebuildLookups(next: LayoutDocument): void {
    placementById = new Map(next.placements.map((placement) => [placement.id, placement]))
    placementOrder = new Map(next.placements.map((placement, order) => [placement.id, order]))
  }

  function rebuildZones(next: LayoutDocument): void {
    zonePolygons = new Map()
    for (const zone of next.options.excludedZones) {
      const list = zonePolygons.get(zone.sheet) ?? []
      list.push(polygonFromRings(zone.outline))
      zonePolygons.set(zone.sheet, list)
    }
  }

  function indexEntryOf(placement: LayoutPlacement) {
    const shape = shapes.shapeOf(placement)
    return shape ? { id: placement.id, sheet: placement.sheet, ...shape.box } : null
  }

  /** Everything from scratch: after loading, or when the stock, spacing, margin or zones change. */
  function rebuildAll(next: LayoutDocument): void {
    rebuildLookups(next)
    rebuildZones(next)
    index.load(next.placements.map(indexEntryOf).filter((entry) => entry !== null))
    tracker.rebuild(next.placements.map((placement) => placement.id))
    conflictsVersion.value += 1
  }

  /** Only what changed: placements replaced, added or removed, and the pieces of items whose rules changed. */
  function syncIncrementally(previous: LayoutDocument, next: LayoutDocument): void {
    rebuildLookups(next)
    const previousById = new Map(previous.placements.map((placement) => [placement.id, placement]))
    const touched: string[] = []
    for (const placement of next.placements) {
      if (previousById.get(placement.id) === placement) continue
      touched.push(placement.id)
      const entry = indexEntryOf(placement)
      if (entry) index.upsert(entry.id, entry.sheet, entry)
      else index.remove(placement.id)
    }
    for (const id of previousById.keys()) {
      if (placementById.has(id)) continue
      touched.push(id)
      index.remove(id)
    }
    if (previous.items !== next.items) {
      const changedDesigns = new Set(next.items.filter((item) => !previous.items.includes(item)).map((item) => item.designId))
      for (const placement of next.placements) if (changedDesigns.has(placement.designId)) touched.push(placement.id)
    }
    if (touched.length) {
      tracker.refresh(touched)
      conflictsVersion.value += 1
    }
  }

  function setDocument(next: LayoutDocument, previous: LayoutDocument | null): void {
    document.value = next
    const needsAll = !previous || previous.stock !== next.stock || previous.options.spacingMm !== next.options.spacingMm || previous.options.marginMm !== next.options.marginMm || previous.options.excludedZones !== next.options.excludedZones
    if (needsAll) rebuildAll(next)
    else syncIncrementally(previous, next)
    const kept = [...selection.value].filter((id) => placementById.has(id))
    if (kept.length !== selection.value.size) selection.value = new Set(kept)
    historyVersion.value += 1
    scheduleDraft()
  }

  /** Records a change as one undo step. `mergeKey` joins a run of steps (nudges) into one. */
  function record(label: string, next: LayoutDocument, mergeKey?: string): boolean {
    const previous = document.value
    if (!previous || next === previous || !canEdit.value) return false
    history.apply(label, next, mergeKey)
    setDocument(next, previous)
    return true
  }

  /** A maker's action: refused while the layout is read-only or an auto-arrange runs. */
  function commit(label: string, next: LayoutDocument, mergeKey?: string): boolean {
    return editable.value && record(label, next, mergeKey)
  }

  function undo(): void {
    if (!editable.value) return
    const previous = document.value
    const label = history.undoLabel
    const next = history.undo()
    if (next) {
      setDocument(next, previous)
      if (label) handlers.onInfo(`Undone: ${label}`)
    }
  }

  function redo(): void {
    if (!editable.value) return
    const previous = document.value
    const label = history.redoLabel
    const next = history.redo()
    if (next) {
      setDocument(next, previous)
      if (label) handlers.onInfo(`Redone: ${label}`)
    }
  }

  const canUndo = computed(() => {
    void historyVersion.value
    return editable.value && history.canUndo
  })
  const canRedo = computed(() => {
    void historyVersion.value
    return editable.value && history.canRedo
  })

  // ---- designs ----

  function rememberDesign(design: DesignDetail): void {
    designMap.set(design.id, { geometry: design.geometry, keepTogether: design.keepTogether })
    designSummaries.value = { ...designSummaries.value, [design.id]: summaryOf(design) }
    designsVersion.value += 1
  }

  async function loadDesigns(forWorkspaceId: string, designIds: readonly string[]): Promise<void> {
    const gone = new Set(goneDesigns.value)
    await Promise.all(
      [...new Set(designIds)]
        .filter((designId) => !designMap.has(designId))
        .map(async (designId) => {
          try {
            rememberDesign(await designsApi.getDesign(forWorkspaceId, designId))
          } catch (error) {
            if (isApiError(error) && error.status === 404) gone.add(designId)
            else throw error
          }
        }),
    )
    goneDesigns.value = gone
  }

  // ---- loading ----

  let latestLoad = 0

  function adopt(detail: LayoutDetail): void {
    layout.value = detail
    savedFigures.value = detail.figures
    const loaded = documentOf(detail)
    savedDocument.value = loaded
    history = createHistory(loaded)
    // The shape cache holds shapes by placement object; a fresh load starts it afresh.
    shapes = createShapeCache(designMap)
    setDocument(loaded, null)
  }

  async function load(): Promise<void> {
    const ticket = ++latestLoad
    const forWorkspaceId = workspaceId.value
    const forLayoutId = layoutId.value
    loading.value = true
    missing.value = false
    failed.value = false
    offeredDraft.value = null
    selection.value = new Set()
    try {
      const detail = await layoutsApi.getLayout(forWorkspaceId, forLayoutId)
      await loadDesigns(forWorkspaceId, detail.items.map((item) => item.designId))
      if (ticket !== latestLoad) return
      adopt(detail)
      const draft = readDraft(forWorkspaceId, forLayoutId)
      if (draft && !sameDocument(draft.document, documentOf(detail))) offeredDraft.value = draft
      else if (draft) clearDraft(forWorkspaceId, forLayoutId)
    } catch (error) {
      if (ticket !== latestLoad) return
      if (isApiError(error) && (error.status === 404 || (error.status === 400 && Object.keys(error.fields).some((field) => field.startsWith('params.'))))) missing.value = true
      else {
        failed.value = true
        handlers.onError(error, 'Could not open the layout.')
      }
    } finally {
      if (ticket === latestLoad) loading.value = false
    }
  }

  // ---- draft ----

  let draftTimer: ReturnType<typeof setTimeout> | null = null

  const unsaved = computed(() => {
    const current = document.value
    const saved = savedDocument.value
    if (!current || !saved || current === saved) return false
    return !sameDocument(current, saved)
  })

  function writeDraftNow(): void {
    draftTimer = null
    const current = document.value
    const saved = savedDocument.value
    const detail = layout.value
    if (!current || !saved || !detail || !canEdit.value) return
    if (!unsaved.value) {
      // Nothing unsaved; a draft offered at opening stays until the maker decides.
      if (!offeredDraft.value) clearDraft(workspaceId.value, detail.id)
      return
    }
    draftKept.value = writeDraft(workspaceId.value, detail.id, { baseVersion: detail.version, base: saved, document: current, savedAt: new Date().toISOString() })
  }

  function scheduleDraft(): void {
    if (draftTimer) clearTimeout(draftTimer)
    draftTimer = setTimeout(writeDraftNow, DRAFT_DELAY_MS)
  }

  /** Takes the draft found at opening back, re-applied on the saved version when that moved on since. */
  function restoreDraft(): void {
    const draft = offeredDraft.value
    const current = document.value
    const detail = layout.value
    if (!draft || !current || !detail) return
    offeredDraft.value = null
    const restored = draft.baseVersion === detail.version ? draft.document : mergeLayoutChanges(draft.base, draft.document, current)
    void loadDesigns(workspaceId.value, restored.items.map((item) => item.designId))
      .then(() => {
        commit('Restore unsaved changes', restored)
        handlers.onInfo(draft.baseVersion === detail.version ? 'Your unsaved changes are back.' : 'Your unsaved changes are back, applied on the newer saved version.')
      })
      .catch((error: unknown) => handlers.onError(error, 'Could not load the designs of the draft.'))
  }

  function discardDraft(): void {
    offeredDraft.value = null
    if (layout.value) clearDraft(workspaceId.value, layout.value.id)
  }

  // ---- saving ----

  const saveState = computed<SaveState>(() => (saving.value ? 'saving' : unsaved.value ? 'unsaved' : 'saved'))

  async function save(): Promise<boolean> {
    const current = document.value
    const detail = layout.value
    if (!current || !detail || !canEdit.value || saving.value) return false
    saving.value = true
    try {
      const answer = await layoutsApi.updateLayout(workspaceId.value, detail.id, { ...current, version: detail.version, isTemplate: detail.isTemplate })
      layout.value = answer
      savedFigures.value = answer.figures
      savedDocument.value = current
      saveConflict.value = null
      if (document.value === current) clearDraft(workspaceId.value, detail.id)
      else scheduleDraft()
      return true
    } catch (error) {
      if (isApiError(error) && error.status === 409) {
        saveConflict.value = { message: error.message }
        writeDraftNow()
      } else handlers.onError(error, 'Could not save the layout.')
      return false
    } finally {
      saving.value = false
    }
  }

  /**
   * After a stale save: loads the version saved since and re-applies this editor's unsaved changes on top (mine win
   * where both changed the same thing). The result is unsaved, for the maker to look over and save.
   */
  async function reloadAndReapply(): Promise<void> {
    const detail = layout.value
    const mine = document.value
    const base = savedDocument.value
    if (!detail || !mine || !base) return
    try {
      const latest = await layoutsApi.getLayout(workspaceId.value, detail.id)
      const theirs = documentOf(latest)
      const merged = mergeLayoutChanges(base, mine, theirs)
      await loadDesigns(workspaceId.value, [...theirs.items, ...merged.items].map((item) => item.designId))
      saveConflict.value = null
      adopt(latest)
      commit('Re-apply my changes', merged)
      handlers.onInfo('Loaded the newer version and applied your changes again. Check them, then save.')
    } catch (error) {
      handlers.onError(error, 'Could not load the newer version of the layout.')
    }
  }

  function dismissConflict(): void {
    saveConflict.value = null
  }

  // ---- selection ----

  function select(ids: Iterable<string>, mode: 'replace' | 'add' | 'toggle' = 'replace'): void {
    const next = new Set(mode === 'replace' ? [] : selection.value)
    for (const id of ids) {
      if (!placementById.has(id)) continue
      if (mode === 'toggle' && next.has(id)) next.delete(id)
      else next.add(id)
    }
    selection.value = next
  }

  function selectAll(): void {
    selection.value = new Set(placementById.keys())
  }

  function clearSelection(): void {
    if (selection.value.size) selection.value = new Set()
  }

  // ---- actions on the selection and the layout ----

  const current = () => document.value!
  const selected = () => [...selection.value]
  const environmentForActions = (): actions.EditorEnvironment => ({ designs: designMap, shapes, newId: newPlacementId })

  function moveSelection(dxMm: number, dyMm: number, mergeKey?: string): void {
    commit('Move', actions.movePlacements(current(), selected(), dxMm, dyMm), mergeKey)
  }

  function placePieces(places: ReadonlyMap<string, { sheet: number; xMm: number; yMm: number }>): void {
    commit(places.size === 1 ? 'Move a piece' : `Move ${places.size} pieces`, actions.placePlacements(current(), places))
  }

  function rotateSelection(direction: 1 | -1 = 1): void {
    const { document: next, skipped } = actions.rotatePlacements(current(), selected(), { shapes }, direction)
    if (skipped) handlers.onInfo(skipped === 1 ? 'This piece may not be turned: its design allows no other angle.' : `${skipped} pieces may not be turned: their designs allow no other angle.`)
    commit('Rotate', next)
  }

  function mirrorSelection(): void {
    const { document: next, skipped } = actions.mirrorPlacements(current(), selected(), { shapes })
    if (skipped) handlers.onInfo(skipped === 1 ? 'This piece may not be mirrored: set its design to “Mirror allowed” first.' : `${skipped} pieces may not be mirrored: set their designs to “Mirror allowed” first.`)
    commit('Mirror', next)
  }

  /**
   * Copies of the selection set beside it, to the right by its width and the spacing, where there is often room;
   * the copies are selected, ready to be dragged.
   */
  function duplicateSelection(): void {
    const document = current()
    const ids = selected()
    let minX = Infinity
    let maxX = -Infinity
    for (const id of ids) {
      const placement = placementById.get(id)
      const box = placement && shapes.boxAt(placement, placement.xMm, placement.yMm)
      if (!box) continue
      minX = Math.min(minX, box.minX)
      maxX = Math.max(maxX, box.maxX)
    }
    if (!Number.isFinite(minX)) return
    const step = document.options.snapToGrid ? Math.ceil((maxX - minX + document.options.spacingMm) / document.options.gridMm) * document.options.gridMm : maxX - minX + document.options.spacingMm
    const { document: next, newIds } = actions.duplicatePlacements(document, ids, { newId: newPlacementId }, step, 0)
    if (commit('Duplicate', next)) selection.value = new Set(newIds)
  }

  function deleteSelection(): void {
    const { document: next, skipped } = actions.deletePlacements(current(), selected())
    if (skipped) handlers.onInfo(skipped === 1 ? 'A locked piece was kept: unlock it to delete it.' : `${skipped} locked pieces were kept: unlock them to delete them.`)
    commit('Delete', next)
  }

  function lockSelection(locked: boolean): void {
    commit(locked ? 'Lock' : 'Unlock', actions.setPlacementsLocked(current(), selected(), locked))
  }

  function moveSelectionToSheet(sheet: number): void {
    commit(`Move to sheet ${sheet + 1}`, actions.movePlacementsToSheet(current(), selected(), sheet))
  }

  function addSheet(): void {
    commit('Add a sheet', actions.addSheet(current()))
  }

  function removeSheet(sheet: number): void {
    commit(`Remove sheet ${sheet + 1}`, actions.removeSheet(current(), sheet))
  }

  async function addDesign(design: DesignSummary, quantity = 1): Promise<void> {
    if (!editable.value) return
    try {
      await loadDesigns(workspaceId.value, [design.id])
    } catch (error) {
      handlers.onError(error, 'Could not load the design.')
      return
    }
    if (!designMap.has(design.id)) {
      handlers.onInfo('That design was deleted from the library.')
      return
    }
    const item: LayoutItem = { designId: design.id, quantity, rotation: 'quarter-turns', mirror: 'never', grainLock: false }
    commit(`Add ${design.name}`, actions.addItem(current(), item, environmentForActions()))
  }

  function removeDesign(designId: string): void {
    commit(`Remove ${designSummaries.value[designId]?.name ?? 'a design'}`, actions.removeItem(current(), designId))
  }

  function setQuantity(designId: string, quantity: number): void {
    commit('Change quantity', actions.setItemQuantity(current(), designId, quantity, environmentForActions()))
  }

  function updateItem(designId: string, patch: Partial<Omit<LayoutItem, 'designId' | 'quantity'>>): void {
    commit('Change item options', actions.updateItem(current(), designId, patch))
  }

  /** A new stock; a stock from the shelf brings the margin it suggests (a remnant's is already inside its outline), in the same undo step. */
  function setStock(stock: LayoutStock, marginMm?: number): void {
    const next = actions.setStock(current(), stock)
    commit('Change the stock', marginMm === undefined ? next : actions.setOptions(next, { marginMm }))
  }

  function setOptions(patch: Partial<LayoutOptions>, label = 'Change settings'): void {
    commit(label, actions.setOptions(current(), patch))
  }

  function rename(name: string): void {
    commit('Rename', actions.renameLayout(current(), name))
  }

  /** The result of an auto-arrange, which arrives while editing waits for it. */
  function applyArrangement(placements: LayoutPlacement[], stock: LayoutStock): void {
    if (record('Auto-arrange', actions.applyArrangement(current(), placements, stock))) selection.value = new Set()
  }

  // ---- derived views ----

  const figures = computed<LayoutFigures | null>(() => {
    const current = document.value
    if (!current) return null
    void designsVersion.value
    return computeLayoutFigures(current, designMap)
  })

  const conflictedIds = computed<ReadonlySet<string>>(() => {
    void conflictsVersion.value
    return document.value ? tracker.conflictedIds() : new Set()
  })

  function conflictOf(id: string): PieceConflict {
    return tracker.conflictOf(id)
  }

  const placedDesignIds = computed(() => new Set(document.value?.items.map((item) => item.designId) ?? []))

  /** A tab closed right after an edit must not lose it to the draft's delay. */
  function flushDraft(): void {
    if (!draftTimer) return
    clearTimeout(draftTimer)
    writeDraftNow()
  }

  watch([workspaceId, layoutId], () => void load(), { immediate: true })
  window.addEventListener('pagehide', flushDraft)
  onScopeDispose(() => {
    window.removeEventListener('pagehide', flushDraft)
    flushDraft()
  })

  return {
    // state
    layout,
    loading,
    missing,
    failed,
    document,
    savedFigures,
    saveState,
    saveConflict,
    offeredDraft,
    draftKept,
    busy,
    editable,
    selection,
    designSummaries,
    goneDesigns,
    designsVersion,
    conflictsVersion,
    figures,
    conflictedIds,
    placedDesignIds,
    canUndo,
    canRedo,
    // geometry access for the canvas
    shapes: () => shapes,
    designMap,
    index,
    environment,
    placementOf: (id: string) => placementById.get(id),
    orderOf: (id: string) => placementOrder.get(id) ?? -1,
    conflictOf,
    // actions
    load,
    save,
    reloadAndReapply,
    dismissConflict,
    restoreDraft,
    discardDraft,
    undo,
    redo,
    select,
    selectAll,
    clearSelection,
    moveSelection,
    placePieces,
    rotateSelection,
    mirrorSelection,
    duplicateSelection,
    deleteSelection,
    lockSelection,
    moveSelectionToSheet,
    addSheet,
    removeSheet,
    addDesign,
    removeDesign,
    setQuantity,
    updateItem,
    setStock,
    setOptions,
    rename,
    applyArrangement,
    sealHistory: () => history.seal(),
  }
}
export type LayoutEditor = ReturnType<typeof useLayoutEditor>
