import type { CareEventKind, CutterToolKind, UnitSystem } from '../../../shared/schemas/index'
import { formatLength } from '../../../shared/units'

export const toolKindLabels: Record<CutterToolKind, string> = { blade: 'Blade cutter', pen: 'Pen plotter', laser: 'Laser' }
export const toolKindIcons: Record<CutterToolKind, string> = { blade: 'content_cut', pen: 'edit', laser: 'flare' }

export const careKindLabels: Record<CareEventKind, string> = {
  blade_swap: 'Blade swapped',
  blade_cleaned: 'Blade cleaned',
  housing_cleaned: 'Blade housing cleaned',
  roller_checked: 'Pinch rollers checked',
  spring_checked: 'Blade spring checked',
  other: 'Other care',
}

export const careKindHints: Record<CareEventKind, string> = {
  blade_swap: 'A new blade went in (fitting a blade logs this by itself)',
  blade_cleaned: 'Tape or adhesive residue wiped off the blade',
  housing_cleaned: 'Residue and fluff cleared from the blade housing',
  roller_checked: 'Pinch rollers sit in their working position over the grit',
  spring_checked: 'The blade moves in and springs back freely',
  other: 'Anything else worth remembering',
}

export const careKindIcons: Record<CareEventKind, string> = {
  blade_swap: 'swap_horiz',
  blade_cleaned: 'cleaning_services',
  housing_cleaned: 'cleaning_services',
  roller_checked: 'radio_button_checked',
  spring_checked: 'compress',
  other: 'build',
}

export const bladeTypeLabels: Record<string, string> = { standard: 'Standard', 'deep-cut': 'Deep cut', fabric: 'Fabric', rotary: 'Rotary' }
export const bladeTypeLabel = (type: string) => bladeTypeLabels[type] ?? type

/** Blade wear in metres: people think of a blade's life in metres of cut, not millimetres. */
export function formatMetres(valueMm: number): string {
  const metres = valueMm / 1000
  return `${metres >= 100 ? Math.round(metres).toLocaleString() : metres.toFixed(1)} m`
}

export const formatPercent = (ratio: number) => `${Math.round(ratio * 100)} %`

export function formatWidth(valueMm: number, unit: UnitSystem): string {
  return unit === 'in' ? formatLength(valueMm, 'in').replace(/\.?0+ in$/, ' in') : `${Math.round(valueMm)} mm`
}

export function formatDays(days: number): string {
  return days === 1 ? 'every day' : days % 7 === 0 ? `every ${days / 7 === 1 ? 'week' : `${days / 7} weeks`}` : `every ${days} days`
}

/** "in 3 days", "today", "5 days ago" from now. */
export function relativeDays(iso: string, now = Date.now()): string {
  const days = Math.round((new Date(iso).getTime() - now) / (24 * 3600 * 1000))
  if (days === 0) return 'today'
  if (days > 0) return days === 1 ? 'tomorrow' : `in ${days} days`
  return days === -1 ? 'yesterday' : `${-days} days ago`
}

/** Today as YYYY-MM-DD in the person's own time zone (what a date input shows). */
export function localToday(now = new Date()): string {
  const pad = (value: number) => String(value).padStart(2, '0')
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`
}
