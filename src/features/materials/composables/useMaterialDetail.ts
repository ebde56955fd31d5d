import { ref, watch, type Ref } from 'vue'
import { isApiError } from '../../../api/ApiError'
import type { MaterialDetail, Recipe, RecipeChange, RecipeToolKind, TestCut, UpdateMaterialRequest, UpdateRecipeRequest, CreateRecipeRequest } from '../../../../shared/schemas/index'
import * as materialsApi from '../api'

const TEST_CUT_PAGE = 10
const HISTORY_PAGE = 15

/** A material that is gone, belongs elsewhere, or whose id is not an id: all look the same. */
export function isMissingMaterial(error: unknown): boolean {
  if (!isApiError(error)) return false
  return error.status === 404 || (error.status === 400 && Object.keys(error.fields).some((field) => field.startsWith('params.')))
}

/**
 * One material with its recipes, its recent test cuts and its recipe history, reloaded when the route changes.
 * Every change goes through here, so the recipe card, the timeline and the history stay in step.
 */
export function useMaterialDetail(workspaceId: Ref<string>, materialId: Ref<string>, onError: (error: unknown) => void) {
  const material = ref<MaterialDetail | null>(null)
  const testCuts = ref<TestCut[]>([])
  const testCutTotal = ref(0)
  const history = ref<RecipeChange[]>([])
  const historyTotal = ref(0)
  const loading = ref(false)
  const missing = ref(false)
  const failed = ref(false)
  const loadingMoreCuts = ref(false)
  const loadingMoreHistory = ref(false)
  let latestRequest = 0

  async function load(): Promise<void> {
    const ticket = ++latestRequest
    if (material.value?.id !== materialId.value) {
      material.value = null
      testCuts.value = []
      history.value = []
    }
    loading.value = true
    missing.value = false
    failed.value = false
    try {
      const [detail, cuts, changes] = await Promise.all([
        materialsApi.getMaterial(workspaceId.value, materialId.value),
        materialsApi.listTestCuts(workspaceId.value, materialId.value, 1, TEST_CUT_PAGE),
        materialsApi.listHistory(workspaceId.value, materialId.value, 1, HISTORY_PAGE),
      ])
      if (ticket !== latestRequest) return
      material.value = detail
      testCuts.value = cuts.items
      testCutTotal.value = cuts.total
      history.value = changes.items
      historyTotal.value = changes.total
    } catch (error) {
      if (ticket !== latestRequest) return
      if (isMissingMaterial(error)) missing.value = true
      else {
        failed.value = true
        onError(error)
      }
    } finally {
      if (ticket === latestRequest) loading.value = false
    }
  }

  /** The recipe, its history and the test cuts' "can apply" state all change together: read them again. */
  async function refreshAfterRecipeChange(): Promise<void> {
    const [detail, cuts, changes] = await Promise.all([
      materialsApi.getMaterial(workspaceId.value, materialId.value),
      materialsApi.listTestCuts(workspaceId.value, materialId.value, 1, Math.max(TEST_CUT_PAGE, testCuts.value.length)),
      materialsApi.listHistory(workspaceId.value, materialId.value, 1, Math.max(HISTORY_PAGE, history.value.length)),
    ])
    material.value = detail
    testCuts.value = cuts.items
    testCutTotal.value = cuts.total
    history.value = changes.items
    historyTotal.value = changes.total
  }

  async function moreTestCuts(): Promise<void> {
    loadingMoreCuts.value = true
    try {
      const page = Math.floor(testCuts.value.length / TEST_CUT_PAGE) + 1
      const answer = await materialsApi.listTestCuts(workspaceId.value, materialId.value, page, TEST_CUT_PAGE)
      const known = new Set(testCuts.value.map((cut) => cut.id))
      testCuts.value = [...testCuts.value, ...answer.items.filter((cut) => !known.has(cut.id))]
      testCutTotal.value = answer.total
    } finally {
      loadingMoreCuts.value = false
    }
  }

  async function moreHistory(): Promise<void> {
    loadingMoreHistory.value = true
    try {
      const page = Math.floor(history.value.length / HISTORY_PAGE) + 1
      const answer = await materialsApi.listHistory(workspaceId.value, materialId.value, page, HISTORY_PAGE)
      const known = new Set(history.value.map((change) => change.id))
      history.value = [...history.value, ...answer.items.filter((change) => !known.has(change.id))]
      historyTotal.value = answer.total
    } finally {
      loadingMoreHistory.value = false
    }
  }

  async function update(changes: UpdateMaterialRequest): Promise<MaterialDetail> {
    const updated = await materialsApi.updateMaterial(workspaceId.value, materialId.value, changes)
    material.value = updated
    return updated
  }

  async function setFavourite(favourite: boolean): Promise<void> {
    if (!material.value) return
    const previous = material.value.isFavourite
    material.value = { ...material.value, isFavourite: favourite }
    try {
      if (favourite) await materialsApi.addFavourite(workspaceId.value, materialId.value)
      else await materialsApi.removeFavourite(workspaceId.value, materialId.value)
    } catch (error) {
      if (material.value) material.value = { ...material.value, isFavourite: previous }
      throw error
    }
  }

  async function tune(toolKind: RecipeToolKind, changes: UpdateRecipeRequest): Promise<Recipe> {
    const recipe = await materialsApi.updateRecipe(workspaceId.value, materialId.value, toolKind, changes)
    await refreshAfterRecipeChange()
    return recipe
  }

  async function addRecipe(body: CreateRecipeRequest): Promise<Recipe> {
    const recipe = await materialsApi.createRecipe(workspaceId.value, materialId.value, body)
    await refreshAfterRecipeChange()
    return recipe
  }

  async function resetRecipe(toolKind: RecipeToolKind): Promise<Recipe> {
    const recipe = await materialsApi.resetRecipe(workspaceId.value, materialId.value, toolKind)
    await refreshAfterRecipeChange()
    return recipe
  }

  async function removeRecipe(toolKind: RecipeToolKind): Promise<void> {
    await materialsApi.deleteRecipe(workspaceId.value, materialId.value, toolKind)
    await refreshAfterRecipeChange()
  }

  async function applySuggestion(testCut: TestCut) {
    const answer = await materialsApi.applySuggestion(workspaceId.value, materialId.value, testCut.id)
    await refreshAfterRecipeChange()
    return answer
  }

  async function testCutLogged(): Promise<void> {
    await refreshAfterRecipeChange()
  }

  async function removeTestCut(testCut: TestCut): Promise<void> {
    await materialsApi.deleteTestCut(workspaceId.value, materialId.value, testCut.id)
    await refreshAfterRecipeChange()
  }

  async function remove(): Promise<void> {
    await materialsApi.deleteMaterial(workspaceId.value, materialId.value)
  }

  watch([workspaceId, materialId], () => void load(), { immediate: true })

  return {
    material,
    testCuts,
    testCutTotal,
    history,
    historyTotal,
    loading,
    missing,
    failed,
    loadingMoreCuts,
    loadingMoreHistory,
    load,
    moreTestCuts,
    moreHistory,
    update,
    setFavourite,
    tune,
    addRecipe,
    resetRecipe,
    removeRecipe,
    applySuggestion,
    testCutLogged,
    removeTestCut,
    remove,
  }
}
