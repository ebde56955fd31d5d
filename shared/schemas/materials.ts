import { z } from 'zod'
import { basisWeightKinds } from '../materials/basisWeight.js'

/**
 * Materials, their cut recipes, the tuning history and test cuts. Force is a whole number on the cutter's own
 * force scale; speeds are mm/s; laser power is a percentage of the tube's or diode's rated power.
 */

export const materialCategories = ['vinyl', 'film', 'paper', 'cardstock', 'board', 'leather', 'fabric', 'foam', 'other'] as const
export const materialCategorySchema = z.enum(materialCategories, { error: `Category must be one of ${materialCategories.join(', ')}` })
export type MaterialCategory = z.infer<typeof materialCategorySchema>

/** Pens draw and need no cut recipe; blade cutters and lasers each have their own. */
export const recipeToolKinds = ['blade', 'laser'] as const
export const recipeToolKindSchema = z.enum(recipeToolKinds, { error: 'Tool kind must be blade or laser' })
export type RecipeToolKind = z.infer<typeof recipeToolKindSchema>

export const bladeTypes = ['standard', 'deep-cut', 'fabric', 'rotary'] as const
export const bladeTypeSchema = z.enum(bladeTypes, { error: `Blade type must be one of ${bladeTypes.join(', ')}` })
export type BladeType = z.infer<typeof bladeTypeSchema>

export const testCutOutcomes = ['clean', 'not_through', 'torn', 'too_deep'] as const
export const testCutOutcomeSchema = z.enum(testCutOutcomes, { error: 'Outcome must be clean, not_through, torn or too_deep' })
export type TestCutOutcome = z.infer<typeof testCutOutcomeSchema>

export const recipeFields = ['bladeType', 'bladeAngleDeg', 'force', 'passes', 'speedMmS', 'powerPercent'] as const
export type RecipeField = (typeof recipeFields)[number]

export const maxPasses = 10

// Absolute bounds of the contract; force is also checked against the workspace's (or a cutter's) force range.
export const forceSchema = z
  .number({ error: 'Force must be a number' })
  .int({ error: 'Force must be a whole number' })
  .min(1, { error: 'Force must be at least 1' })
  .max(10_000, { error: 'Force must be at most 10,000' })
export const passesSchema = z
  .number({ error: 'Passes must be a number' })
  .int({ error: 'Passes must be a whole number' })
  .min(1, { error: 'Use at least 1 pass' })
  .max(maxPasses, { error: `Use at most ${maxPasses} passes` })
export const speedSchema = z.number({ error: 'Speed must be a number' }).positive({ error: 'Speed must be above 0' }).max(2000, { error: 'Speed must be at most 2000 mm/s' })
export const bladeAngleSchema = z
  .number({ error: 'Blade angle must be a number' })
  .min(20, { error: 'Blade angle must be at least 20°' })
  .max(75, { error: 'Blade angle must be at most 75°' })
export const powerSchema = z
  .number({ error: 'Power must be a number' })
  .min(1, { error: 'Power must be at least 1 %' })
  .max(100, { error: 'Power must be at most 100 %' })

/** What a recipe holds; fields of the other tool kind are null. */
export const recipeValuesSchema = z.object({
  bladeType: bladeTypeSchema.nullable(),
  /** Null for a rotary blade, which has no cutting angle. */
  bladeAngleDeg: z.number().nullable(),
  force: z.number().nullable(),
  passes: z.number(),
  speedMmS: z.number(),
  powerPercent: z.number().nullable(),
})
export type RecipeValues = z.infer<typeof recipeValuesSchema>

export const recipeSchema = recipeValuesSchema.extend({
  id: z.string(),
  toolKind: recipeToolKindSchema,
  /** The catalogue's starting point for this tool kind, when the material comes from the catalogue. */
  catalogue: recipeValuesSchema.nullable(),
  /** True when the values differ from the catalogue's starting point (always false for own materials). */
  tuned: z.boolean(),
  updatedAt: z.string(),
  updatedByName: z.string().nullable(),
})
export type Recipe = z.infer<typeof recipeSchema>

const reasonSchema = z.string({ error: 'Say why the recipe changes' }).trim().min(1, { error: 'Say why the recipe changes' }).max(300, { error: 'Use at most 300 characters' })

export const createRecipeRequestSchema = z.discriminatedUnion(
  'toolKind',
  [
    z.object({
      toolKind: z.literal('blade'),
      bladeType: bladeTypeSchema,
      bladeAngleDeg: bladeAngleSchema.nullable().default(null),
      force: forceSchema,
      passes: passesSchema.default(1),
      speedMmS: speedSchema,
      reason: reasonSchema.optional(),
    }),
    z.object({
      toolKind: z.literal('laser'),
      powerPercent: powerSchema,
      passes: passesSchema.default(1),
      speedMmS: speedSchema,
      reason: reasonSchema.optional(),
    }),
  ],
  { error: 'Tool kind must be blade or laser' },
)
export type CreateRecipeRequest = z.input<typeof createRecipeRequestSchema>

/** A tuning step: the fields that change and why. Every changed field becomes one history entry. */
export const updateRecipeRequestSchema = z
  .object({
    bladeType: bladeTypeSchema.optional(),
    bladeAngleDeg: bladeAngleSchema.nullable().optional(),
    force: forceSchema.optional(),
    passes: passesSchema.optional(),
    speedMmS: speedSchema.optional(),
    powerPercent: powerSchema.optional(),
    reason: reasonSchema,
  })
  .refine((body) => recipeFields.some((field) => body[field] !== undefined), { error: 'Send at least one recipe value to change' })
export type UpdateRecipeRequest = z.input<typeof updateRecipeRequestSchema>

export const resetRecipeRequestSchema = z.object({ reason: reasonSchema.optional() })

export const recipeChangeSources = ['created', 'tuned', 'suggestion', 'reset'] as const

export const recipeChangeSchema = z.object({
  id: z.string(),
  toolKind: recipeToolKindSchema,
  field: z.enum(recipeFields),
  /** Values as stored: numbers, a blade type, or null. */
  from: z.union([z.number(), z.string()]).nullable(),
  to: z.union([z.number(), z.string()]).nullable(),
  reason: z.string(),
  source: z.enum(recipeChangeSources),
  testCutId: z.string().nullable(),
  changedByName: z.string().nullable(),
  changedAt: z.string(),
})
export type RecipeChange = z.infer<typeof recipeChangeSchema>

const paged = <T extends z.ZodType>(item: T) => z.object({ items: z.array(item), total: z.number(), page: z.number(), pageSize: z.number() })

export const recipeHistoryResponseSchema = paged(recipeChangeSchema)
export type RecipeHistoryResponse = z.infer<typeof recipeHistoryResponseSchema>

export const basisWeightSchema = z.object({
  pounds: z.number({ error: 'Basis weight must be a number' }).positive({ error: 'Basis weight must be above 0' }).max(1000, { error: 'Basis weight must be at most 1000 lb' }),
  kind: z.enum(basisWeightKinds, { error: 'Basis weight kind must be cover or text' }),
})

export const materialSummarySchema = z.object({
  id: z.string(),
  /** Stable key of the catalogue entry this material started from; null for the workspace's own materials. */
  catalogueKey: z.string().nullable(),
  name: z.string(),
  category: materialCategorySchema,
  description: z.string(),
  thicknessMm: z.number().nullable(),
  basisWeight: basisWeightSchema.nullable(),
  /** Given, or derived from the basis weight (US basis-weight definition). */
  grammageGsm: z.number().nullable(),
  /** False for PVC and vinyl materials: lasering them releases hydrogen chloride (chlorine) gas. */
  laserSafe: z.boolean(),
  archived: z.boolean(),
  isFavourite: z.boolean(),
  recipes: z.array(recipeSchema),
  createdAt: z.string(),
  updatedAt: z.string(),
})
export type MaterialSummary = z.infer<typeof materialSummarySchema>

export const materialSettingsSchema = z.object({
  forceStep: z.number(),
  forceMin: z.number(),
  forceMax: z.number(),
  powerStepPercent: z.number(),
})
export type MaterialSettings = z.infer<typeof materialSettingsSchema>

export const materialDetailSchema = materialSummarySchema.extend({
  /** What a tuning step uses: the workspace's force step and range. */
  settings: materialSettingsSchema,
  stockCount: z.number(),
  testCutCount: z.number(),
})
export type MaterialDetail = z.infer<typeof materialDetailSchema>

export const materialListResponseSchema = paged(materialSummarySchema)
export type MaterialListResponse = z.infer<typeof materialListResponseSchema>

export const materialStatuses = ['active', 'archived', 'all'] as const

export const materialListQuerySchema = z.object({
  search: z.string().trim().max(100).optional(),
  category: materialCategorySchema.optional(),
  status: z.enum(materialStatuses, { error: 'Status must be active, archived or all' }).default('active'),
  favouritesOnly: z
    .enum(['true', 'false'], { error: 'favouritesOnly must be true or false' })
    .transform((value) => value === 'true')
    .optional(),
  page: z.coerce.number({ error: 'Page must be a number' }).int().min(1, { error: 'Page must be at least 1' }).default(1),
  pageSize: z.coerce.number({ error: 'Page size must be a number' }).int().min(1).max(100, { error: 'Page size must be at most 100' }).default(50),
})
export type MaterialListQuery = z.input<typeof materialListQuerySchema>

const materialNameSchema = z.string({ error: 'Enter a name' }).trim().min(1, { error: 'Enter a name' }).max(120, { error: 'Use at most 120 characters' })
const descriptionSchema = z.string().trim().max(1000, { error: 'Use at most 1000 characters' })
const thicknessSchema = z.number({ error: 'Thickness must be a number' }).positive({ error: 'Thickness must be above 0' }).max(50, { error: 'Thickness must be at most 50 mm' })
const grammageSchema = z.number({ error: 'Grammage must be a number' }).positive({ error: 'Grammage must be above 0' }).max(5000, { error: 'Grammage must be at most 5000 g/m²' })

export const createMaterialRequestSchema = z.object({
  name: materialNameSchema,
  category: materialCategorySchema,
  description: descriptionSchema.default(''),
  thicknessMm: thicknessSchema.nullable().default(null),
  basisWeight: basisWeightSchema.nullable().default(null),
  /** Ignored when a basis weight is given: then it follows from that. */
  grammageGsm: grammageSchema.nullable().default(null),
  /** Off unless someone says so: a material of unknown make may contain PVC. */
  laserSafe: z.boolean({ error: 'laserSafe must be true or false' }).default(false),
})
export type CreateMaterialRequest = z.input<typeof createMaterialRequestSchema>

export const updateMaterialRequestSchema = z
  .object({
    name: materialNameSchema.optional(),
    category: materialCategorySchema.optional(),
    description: descriptionSchema.optional(),
    thicknessMm: thicknessSchema.nullable().optional(),
    basisWeight: basisWeightSchema.nullable().optional(),
    grammageGsm: grammageSchema.nullable().optional(),
    laserSafe: z.boolean({ error: 'laserSafe must be true or false' }).optional(),
    archived: z.boolean({ error: 'archived must be true or false' }).optional(),
  })
  .refine((body) => Object.values(body).some((value) => value !== undefined), { error: 'Send at least one field to change' })
export type UpdateMaterialRequest = z.input<typeof updateMaterialRequestSchema>

export const updateMaterialSettingsRequestSchema = z
  .object({
    forceStep: z.number({ error: 'Force step must be a number' }).int({ error: 'Force step must be a whole number' }).min(1, { error: 'Force step must be at least 1' }).max(500, { error: 'Force step must be at most 500' }).optional(),
    forceMin: z.number({ error: 'Lowest force must be a number' }).int({ error: 'Lowest force must be a whole number' }).min(1, { error: 'Lowest force must be at least 1' }).max(10_000).optional(),
    forceMax: z.number({ error: 'Highest force must be a number' }).int({ error: 'Highest force must be a whole number' }).min(1).max(10_000, { error: 'Highest force must be at most 10,000' }).optional(),
    powerStepPercent: z.number({ error: 'Power step must be a number' }).min(0.5, { error: 'Power step must be at least 0.5 %' }).max(50, { error: 'Power step must be at most 50 %' }).optional(),
  })
  .refine((body) => Object.values(body).some((value) => value !== undefined), { error: 'Send at least one setting to change' })
export type UpdateMaterialSettingsRequest = z.input<typeof updateMaterialSettingsRequestSchema>

export const suggestionActions = ['keep', 'raise-force', 'add-pass', 'lower-force', 'remove-pass', 'raise-power', 'lower-power', 'check-setup'] as const

export const recipeSuggestionSchema = z.object({
  action: z.enum(suggestionActions),
  changes: z.array(z.object({ field: z.enum(recipeFields), from: z.number(), to: z.number() })),
  message: z.string(),
})
export type RecipeSuggestionDto = z.infer<typeof recipeSuggestionSchema>

export const testCutSchema = z.object({
  id: z.string(),
  materialId: z.string(),
  toolKind: recipeToolKindSchema,
  /** The recipe as it was cut. */
  recipe: recipeValuesSchema,
  /** The cutter and the blade in it when the cut was made; null when not recorded. */
  cutterId: z.string().nullable(),
  bladeId: z.string().nullable(),
  cutterName: z.string().nullable(),
  /** The blade in words, e.g. "standard blade 45°". */
  bladeText: z.string().nullable(),
  /** The cutter's highest force when given: the suggestion adds a pass instead of force past it. */
  cutterMaxForce: z.number().nullable(),
  outcome: testCutOutcomeSchema,
  note: z.string(),
  /** API path of the photo (members only), or null. */
  photoUrl: z.string().nullable(),
  suggestion: recipeSuggestionSchema,
  /** Null when the suggestion can be applied in one click; otherwise why not. */
  applyBlockedReason: z.string().nullable(),
  suggestionAppliedAt: z.string().nullable(),
  suggestionAppliedByName: z.string().nullable(),
  createdAt: z.string(),
  createdByName: z.string().nullable(),
})
export type TestCut = z.infer<typeof testCutSchema>

export const testCutListResponseSchema = paged(testCutSchema)
export type TestCutListResponse = z.infer<typeof testCutListResponseSchema>

/** Multipart text fields arrive as strings: an empty field means "not given". */
const fromForm = <T extends z.ZodType>(schema: T) =>
  z.preprocess((value) => {
    if (value === '' || value === null) return undefined
    if (typeof value === 'string' && /^-?\d+(\.\d+)?$/.test(value.trim())) return Number(value)
    return value
  }, schema.optional())

/**
 * Logging a test cut: the outcome and the tool kind whose recipe was cut. The recipe used is the material's current
 * one unless values are sent (a cut made with a setting changed on the machine). JSON or multipart with `photo`.
 */
export const createTestCutRequestSchema = z.object({
  toolKind: fromForm(recipeToolKindSchema).transform((value) => value ?? 'blade'),
  outcome: testCutOutcomeSchema,
  note: z.preprocess((value) => (value === null ? undefined : value), descriptionSchema.optional()).transform((value) => value ?? ''),
  cutterId: fromForm(z.uuid({ error: 'Not a valid cutter id' })),
  bladeId: fromForm(z.uuid({ error: 'Not a valid blade id' })),
  cutterMaxForce: fromForm(forceSchema),
  bladeType: fromForm(bladeTypeSchema),
  bladeAngleDeg: fromForm(bladeAngleSchema),
  force: fromForm(forceSchema),
  passes: fromForm(passesSchema),
  speedMmS: fromForm(speedSchema),
  powerPercent: fromForm(powerSchema),
})
export type CreateTestCutRequest = z.input<typeof createTestCutRequestSchema>

export const testCutListQuerySchema = z.object({
  toolKind: recipeToolKindSchema.optional(),
  page: z.coerce.number({ error: 'Page must be a number' }).int().min(1, { error: 'Page must be at least 1' }).default(1),
  pageSize: z.coerce.number({ error: 'Page size must be a number' }).int().min(1).max(100, { error: 'Page size must be at most 100' }).default(20),
})

export const historyListQuerySchema = z.object({
  toolKind: recipeToolKindSchema.optional(),
  page: z.coerce.number({ error: 'Page must be a number' }).int().min(1, { error: 'Page must be at least 1' }).default(1),
  pageSize: z.coerce.number({ error: 'Page size must be a number' }).int().min(1).max(100, { error: 'Page size must be at most 100' }).default(20),
})

export const applySuggestionResponseSchema = z.object({ recipe: recipeSchema, testCut: testCutSchema, changes: z.array(recipeChangeSchema) })
export type ApplySuggestionResponse = z.infer<typeof applySuggestionResponseSchema>

export const favouritesResponseSchema = z.object({ materialIds: z.array(z.string()) })
export type FavouritesResponse = z.infer<typeof favouritesResponseSchema>

const id = z.uuid({ error: 'Not a valid id' })
export const materialParamsSchema = z.object({ workspaceId: id, materialId: id })
export const recipeParamsSchema = z.object({ workspaceId: id, materialId: id, toolKind: recipeToolKindSchema })
export const testCutParamsSchema = z.object({ workspaceId: id, materialId: id, testCutId: id })
export const favouriteParamsSchema = z.object({ workspaceId: id, materialId: id })
