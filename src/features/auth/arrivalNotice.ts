import type { HistoryState } from 'vue-router'

/**
 * A one-line message handed to the next page through history state rather than the URL,
 * so nobody can craft a link that puts their own words on our sign-in page.
 */
export function arrivalNoticeState(message: string): HistoryState {
  return { arrivalNotice: message }
}

export function readArrivalNotice(): string | null {
  const state: unknown = window.history.state
  if (state && typeof state === 'object' && 'arrivalNotice' in state && typeof state.arrivalNotice === 'string') {
    return state.arrivalNotice
  }
  return null
}
