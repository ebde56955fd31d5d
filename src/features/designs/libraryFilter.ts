import type { LocationQuery, LocationQueryRaw } from 'vue-router'

/** What the library shows: a search, a tag and a page; empty strings mean "no filter". */
export interface DesignLibraryFilter {
  search: string
  tag: string
  page: number
}

export const noDesignFilter: DesignLibraryFilter = { search: '', tag: '', page: 1 }

function firstString(value: LocationQuery[string] | undefined): string {
  const first = Array.isArray(value) ? value[0] : value
  return typeof first === 'string' ? first : ''
}

/** The filter lives in the address, so Back, reload and shared links show the same library page. */
export function filterFromQuery(query: LocationQuery): DesignLibraryFilter {
  const page = Number.parseInt(firstString(query.page), 10)
  return {
    search: firstString(query.search).trim().slice(0, 100),
    tag: firstString(query.tag).trim().slice(0, 40),
    page: Number.isFinite(page) && page >= 1 ? page : 1,
  }
}

/** Only what differs from "everything, first page", so the plain library has a plain address. */
export function queryFromFilter(filter: DesignLibraryFilter): LocationQueryRaw {
  const query: LocationQueryRaw = {}
  if (filter.search) query.search = filter.search
  if (filter.tag) query.tag = filter.tag
  if (filter.page > 1) query.page = String(filter.page)
  return query
}

export function isFiltered(filter: DesignLibraryFilter): boolean {
  return filter.search !== '' || filter.tag !== ''
}

export function sameFilter(a: DesignLibraryFilter, b: DesignLibraryFilter): boolean {
  return a.search === b.search && a.tag === b.tag && a.page === b.page
}
