import { computed, ref } from 'vue'
import { defineStore } from 'pinia'
import type { WorkspaceSummary } from '../../../shared/schemas/index'
import * as workspacesApi from './api'

const LAST_WORKSPACE_KEY = 'sheetsmith.lastWorkspaceId'

function readLastWorkspaceId(): string | null {
  try {
    return localStorage.getItem(LAST_WORKSPACE_KEY)
  } catch {
    return null
  }
}

function writeLastWorkspaceId(workspaceId: string): void {
  try {
    localStorage.setItem(LAST_WORKSPACE_KEY, workspaceId)
  } catch {
    // Private browsing may refuse storage; remembering the workspace is only a convenience.
  }
}

export const useWorkspacesStore = defineStore('workspaces', () => {
  const workspaces = ref<WorkspaceSummary[]>([])
  const loaded = ref(false)
  /** Set from the route (`/w/:workspaceId/...`); kept while visiting pages outside a workspace. */
  const currentId = ref<string | null>(null)

  const current = computed(() => workspaces.value.find((workspace) => workspace.id === currentId.value) ?? null)

  let loading: Promise<void> | null = null

  /** Loads the list once; `force` re-reads it after a change elsewhere (joined, left, role changed). */
  function load(force = false): Promise<void> {
    if (loaded.value && !force) return Promise.resolve()
    loading ??= workspacesApi
      .listWorkspaces()
      .then((list) => {
        workspaces.value = list
        loaded.value = true
      })
      .finally(() => {
        loading = null
      })
    return loading
  }

  function has(workspaceId: string): boolean {
    return workspaces.value.some((workspace) => workspace.id === workspaceId)
  }

  function select(workspaceId: string): void {
    currentId.value = workspaceId
    writeLastWorkspaceId(workspaceId)
  }

  /** Where `/` should go: the workspace used last on this browser, else the first one. */
  function homeWorkspaceId(): string | null {
    const remembered = currentId.value ?? readLastWorkspaceId()
    if (remembered && has(remembered)) return remembered
    return workspaces.value[0]?.id ?? null
  }

  async function create(name: string): Promise<WorkspaceSummary> {
    const workspace = await workspacesApi.createWorkspace(name)
    workspaces.value = [...workspaces.value, workspace]
    return workspace
  }

  /** Drops a workspace the person has just left. */
  function forget(workspaceId: string): void {
    workspaces.value = workspaces.value.filter((workspace) => workspace.id !== workspaceId)
    if (currentId.value === workspaceId) currentId.value = null
  }

  function reset(): void {
    workspaces.value = []
    loaded.value = false
    currentId.value = null
  }

  return { workspaces, loaded, currentId, current, load, has, select, homeWorkspaceId, create, forget, reset }
})
