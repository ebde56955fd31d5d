import { onBeforeUnmount, onMounted, type Ref } from 'vue'
import type { UnitSystem } from '../../../../shared/schemas/index'
import { MM_PER_INCH } from '../../../../shared/units'
import type { LayoutEditor } from './useLayoutEditor'

export interface LayoutKeyboardActions {
  save: () => void
  duplicate: () => void
  /** The canvas element: piece keys (arrows, R, M, Delete, Tab) act only while it has the focus. */
  canvasElement: () => HTMLElement | null
  reveal: () => void
}

/** Nudge steps: 1 mm and 10 mm, or 1/16 in and 1/2 in for inch users; the grid's step when snapping (Shift: five steps). */
function nudgeStepMm(editor: LayoutEditor, unit: UnitSystem, large: boolean): number {
  const options = editor.document.value?.options
  if (options?.snapToGrid) return options.gridMm * (large ? 5 : 1)
  if (unit === 'in') return (large ? 0.5 : 1 / 16) * MM_PER_INCH
  return large ? 10 : 1
}

function isTyping(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false
  if (target.isContentEditable) return true
  if (target.closest('.q-dialog, .q-menu')) return true
  return ['INPUT', 'TEXTAREA', 'SELECT'].includes(target.tagName)
}

/**
 * The editor's keys: Ctrl/Cmd+Z undo, Ctrl/Cmd+Shift+Z (or Ctrl+Y) redo, Ctrl/Cmd+D duplicate, Ctrl/Cmd+S save,
 * and, on the canvas, arrows nudge (Shift: larger), R turns (Shift+R back), M mirrors, Delete removes, L locks,
 * Ctrl/Cmd+A selects all, Tab walks through the pieces, Escape clears the selection.
 */
export function useLayoutKeyboard(editor: LayoutEditor, unit: Ref<UnitSystem>, actions: LayoutKeyboardActions) {
  /** Selects the next (or previous) piece in drawing order; false past the last one, so Tab can leave the canvas. */
  function selectNext(direction: 1 | -1): boolean {
    const placements = editor.document.value?.placements ?? []
    const selected = [...editor.selection.value]
    const last = selected.length ? Math.max(...selected.map((id) => editor.orderOf(id))) : direction === 1 ? -1 : placements.length
    const next = last + direction
    if (next < 0 || next >= placements.length) {
      editor.clearSelection()
      return false
    }
    editor.select([placements[next]!.id])
    actions.reveal()
    return true
  }

  function onKeyDown(event: KeyboardEvent): void {
    if (event.defaultPrevented || isTyping(event.target)) return
    const mod = event.ctrlKey || event.metaKey
    const key = event.key.toLowerCase()
    if (mod && key === 'z') {
      event.preventDefault()
      if (event.shiftKey) editor.redo()
      else editor.undo()
      return
    }
    if (mod && key === 'y') {
      event.preventDefault()
      editor.redo()
      return
    }
    if (mod && key === 's') {
      event.preventDefault()
      actions.save()
      return
    }
    if (mod && key === 'd') {
      // Also keeps the browser from bookmarking the page.
      event.preventDefault()
      actions.duplicate()
      return
    }
    const canvas = actions.canvasElement()
    if (!canvas || !canvas.contains(document.activeElement)) return
    if (mod && key === 'a') {
      event.preventDefault()
      editor.selectAll()
      return
    }
    if (mod || event.altKey) return
    // Read-only (a viewer, or while auto-arrange runs): walking through the pieces still works, nothing else.
    if (!editor.editable.value && event.key !== 'Tab' && event.key !== 'Escape') return
    const step = nudgeStepMm(editor, unit.value, event.shiftKey)
    const nudgeKey = `nudge:${[...editor.selection.value].sort().join(',')}`
    switch (event.key) {
      case 'ArrowLeft':
        editor.moveSelection(-step, 0, nudgeKey)
        break
      case 'ArrowRight':
        editor.moveSelection(step, 0, nudgeKey)
        break
      case 'ArrowUp':
        editor.moveSelection(0, -step, nudgeKey)
        break
      case 'ArrowDown':
        editor.moveSelection(0, step, nudgeKey)
        break
      case 'r':
      case 'R':
        editor.rotateSelection(event.shiftKey ? -1 : 1)
        break
      case 'm':
      case 'M':
        editor.mirrorSelection()
        break
      case 'l':
      case 'L': {
        const selected = [...editor.selection.value]
        editor.lockSelection(!selected.every((id) => editor.placementOf(id)?.locked))
        break
      }
      case 'Delete':
      case 'Backspace':
        editor.deleteSelection()
        break
      case 'Tab':
        if (!selectNext(event.shiftKey ? -1 : 1)) return
        break
      case 'Escape':
        editor.clearSelection()
        break
      default:
        return
    }
    event.preventDefault()
  }

  onMounted(() => window.addEventListener('keydown', onKeyDown))
  onBeforeUnmount(() => window.removeEventListener('keydown', onKeyDown))
}
