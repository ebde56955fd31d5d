import { download, request, segment, upload, type DownloadedFile } from '../../api/client'
import {
  applySuggestionResponseSchema,
  favouritesResponseSchema,
  materialDetailSchema,
  materialListResponseSchema,
  materialSettingsSchema,
  recipeHistoryResponseSchema,
  recipeSchema,
  testCutListResponseSchema,
  testCutSchema,
  type ApplySuggestionResponse,
  type CreateMaterialRequest,
  type CreateRecipeRequest,
  type FavouritesResponse,
  type MaterialCategory,
  type MaterialDetail,
  type MaterialListResponse,
  type MaterialSettings,
  type Recipe,
  type RecipeHistoryResponse,
  type RecipeToolKind,
  type TestCut,
  type TestCutListResponse,
  type TestCutOutcome,
  type UpdateMaterialRequest,
  type UpdateMaterialSettingsRequest,
  type UpdateRecipeRequest,
} from '../../../shared/schemas/index'

const materialsPath = (workspaceId: string) => `/api/workspaces/${segment(workspaceId)}/materials`
const materialPath = (workspaceId: string, materialId: string) => `${materialsPath(workspaceId)}/${segment(materialId)}`
const favouritesPath = (workspaceId: string) => `/api/workspaces/${segment(workspaceId)}/favourites`

export interface MaterialListFilter {
  search?: string
  category?: MaterialCategory | ''
  status?: 'active' | 'archived' | 'all'
  page: number
  pageSize: number
}

export function listMaterials(workspaceId: string, filter: MaterialListFilter): Promise<MaterialListResponse> {
  return request(materialsPath(workspaceId), {
    query: { search: filter.search || undefined, category: filter.category || undefined, status: filter.status, page: filter.page, pageSize: filter.pageSize },
    schema: materialListResponseSchema,
  })
}

export function getMaterial(workspaceId: string, materialId: string): Promise<MaterialDetail> {
  return request(materialPath(workspaceId, materialId), { schema: materialDetailSchema })
}

export function createMaterial(workspaceId: string, body: CreateMaterialRequest): Promise<MaterialDetail> {
  return request(materialsPath(workspaceId), { method: 'POST', body, schema: materialDetailSchema })
}

export function updateMaterial(workspaceId: string, materialId: string, changes: UpdateMaterialRequest): Promise<MaterialDetail> {
  return request(materialPath(workspaceId, materialId), { method: 'PATCH', body: changes, schema: materialDetailSchema })
}

export function deleteMaterial(workspaceId: string, materialId: string): Promise<void> {
  return request(materialPath(workspaceId, materialId), { method: 'DELETE' })
}

export function getSettings(workspaceId: string): Promise<MaterialSettings> {
  return request(`${materialsPath(workspaceId)}/settings`, { schema: materialSettingsSchema })
}

export function updateSettings(workspaceId: string, changes: UpdateMaterialSettingsRequest): Promise<MaterialSettings> {
  return request(`${materialsPath(workspaceId)}/settings`, { method: 'PATCH', body: changes, schema: materialSettingsSchema })
}

export function createRecipe(workspaceId: string, materialId: string, body: CreateRecipeRequest): Promise<Recipe> {
  return request(`${materialPath(workspaceId, materialId)}/recipes`, { method: 'POST', body, schema: recipeSchema })
}

export function updateRecipe(workspaceId: string, materialId: string, toolKind: RecipeToolKind, changes: UpdateRecipeRequest): Promise<Recipe> {
  return request(`${materialPath(workspaceId, materialId)}/recipes/${toolKind}`, { method: 'PATCH', body: changes, schema: recipeSchema })
}

export function resetRecipe(workspaceId: string, materialId: string, toolKind: RecipeToolKind, reason?: string): Promise<Recipe> {
  return request(`${materialPath(workspaceId, materialId)}/recipes/${toolKind}/reset`, { method: 'POST', body: reason ? { reason } : {}, schema: recipeSchema })
}

export function deleteRecipe(workspaceId: string, materialId: string, toolKind: RecipeToolKind): Promise<void> {
  return request(`${materialPath(workspaceId, materialId)}/recipes/${toolKind}`, { method: 'DELETE' })
}

export function listHistory(workspaceId: string, materialId: string, page: number, pageSize: number): Promise<RecipeHistoryResponse> {
  return request(`${materialPath(workspaceId, materialId)}/recipes/history`, { query: { page, pageSize }, schema: recipeHistoryResponseSchema })
}

export function listTestCuts(workspaceId: string, materialId: string, page: number, pageSize: number): Promise<TestCutListResponse> {
  return request(`${materialPath(workspaceId, materialId)}/test-cuts`, { query: { page, pageSize }, schema: testCutListResponseSchema })
}

export interface NewTestCut {
  toolKind: RecipeToolKind
  outcome: TestCutOutcome
  note: string
  /** Only the values that differ from the recipe, as the cut was made. */
  overrides: Partial<Record<'force' | 'passes' | 'speedMmS' | 'powerPercent', number>>
  cutterMaxForce?: number
  /** The cutter it was cut on; the server records that cutter's current blade with it (blade-swap test-cut prompt). */
  cutterId?: string | null
  photo?: File | null
}

/** Multipart, so a photo can travel with the record; text fields first, the photo last. */
export function createTestCut(workspaceId: string, materialId: string, cut: NewTestCut, onProgress?: (sent: number, total: number) => void): Promise<TestCut> {
  const form = new FormData()
  form.append('toolKind', cut.toolKind)
  form.append('outcome', cut.outcome)
  if (cut.note) form.append('note', cut.note)
  for (const [field, value] of Object.entries(cut.overrides)) form.append(field, String(value))
  if (cut.cutterMaxForce !== undefined) form.append('cutterMaxForce', String(cut.cutterMaxForce))
  if (cut.cutterId) form.append('cutterId', cut.cutterId)
  if (cut.photo) form.append('photo', cut.photo, cut.photo.name)
  return upload(`${materialPath(workspaceId, materialId)}/test-cuts`, form, { schema: testCutSchema, onProgress })
}

export function applySuggestion(workspaceId: string, materialId: string, testCutId: string): Promise<ApplySuggestionResponse> {
  return request(`${materialPath(workspaceId, materialId)}/test-cuts/${segment(testCutId)}/apply-suggestion`, { method: 'POST', schema: applySuggestionResponseSchema })
}

export function deleteTestCut(workspaceId: string, materialId: string, testCutId: string): Promise<void> {
  return request(`${materialPath(workspaceId, materialId)}/test-cuts/${segment(testCutId)}`, { method: 'DELETE' })
}

/** The photo through the API with the session's token (an <img src> could not send it). */
export function downloadPhoto(photoUrl: string): Promise<DownloadedFile> {
  return download(photoUrl)
}

export function addFavourite(workspaceId: string, materialId: string): Promise<FavouritesResponse> {
  return request(`${favouritesPath(workspaceId)}/${segment(materialId)}`, { method: 'PUT', schema: favouritesResponseSchema })
}

export function removeFavourite(workspaceId: string, materialId: string): Promise<FavouritesResponse> {
  return request(`${favouritesPath(workspaceId)}/${segment(materialId)}`, { method: 'DELETE', schema: favouritesResponseSchema })
}
