import type { BasisWeightKind } from './basisWeight.js'
import type { BladeType, MaterialCategory, RecipeToolKind, RecipeValues } from '../schemas/materials.js'

/**
 * The built-in catalogue of generic materials, each with a starting recipe per tool kind. Every number here is
 * invented for the demo as a plausible starting point on a force scale of 1–400 and speeds in mm/s: the UI says
 * "starting point — run a test cut", and a studio tunes from there. Keys are stable: a workspace's copy of an entry
 * keeps its key, so "reset to the catalogue value" finds the starting point again after a rename.
 */
export interface CatalogueBladeRecipe {
  bladeType: BladeType
  bladeAngleDeg: number | null
  force: number
  passes: number
  speedMmS: number
}

export interface CatalogueLaserRecipe {
  powerPercent: number
  speedMmS: number
  passes: number
}

export interface CatalogueEntry {
  key: string
  name: string
  category: MaterialCategory
  description: string
  thicknessMm: number | null
  basisWeight: { pounds: number; kind: BasisWeightKind } | null
  grammageGsm: number | null
  /** PVC and vinyl must never be laser-cut: they release hydrogen chloride (chlorine) gas (REFERENCES.md, cutting practice). */
  laserSafe: boolean
  blade: CatalogueBladeRecipe
  /** Only for materials that may be lasered. */
  laser: CatalogueLaserRecipe | null
}

/** Bump when entries are added, so workspaces pick up the new ones the next time they open their materials. */
export const catalogueVersion = 1

export const catalogue: readonly CatalogueEntry[] = [
  {
    key: 'vinyl-adhesive-permanent',
    name: 'Adhesive vinyl, permanent',
    category: 'vinyl',
    description: 'Calendered or cast PVC film with a permanent adhesive on a paper liner; kiss cut through the film only.',
    thicknessMm: 0.08,
    basisWeight: null,
    grammageGsm: null,
    laserSafe: false,
    blade: { bladeType: 'standard', bladeAngleDeg: 45, force: 95, passes: 1, speedMmS: 200 },
    laser: null,
  },
  {
    key: 'vinyl-adhesive-removable',
    name: 'Adhesive vinyl, removable',
    category: 'vinyl',
    description: 'PVC film with a low-tack adhesive for wall decals and stencils; kiss cut through the film only.',
    thicknessMm: 0.07,
    basisWeight: null,
    grammageGsm: null,
    laserSafe: false,
    blade: { bladeType: 'standard', bladeAngleDeg: 45, force: 85, passes: 1, speedMmS: 200 },
    laser: null,
  },
  {
    key: 'heat-transfer-film',
    name: 'Heat-transfer film',
    category: 'film',
    description: 'Iron-on film on a clear carrier; cut mirrored, shiny carrier side down.',
    thicknessMm: 0.1,
    basisWeight: null,
    grammageGsm: null,
    laserSafe: false,
    blade: { bladeType: 'standard', bladeAngleDeg: 45, force: 80, passes: 1, speedMmS: 200 },
    laser: null,
  },
  {
    key: 'sticker-paper-printable',
    name: 'Printable sticker paper',
    category: 'paper',
    description: 'Paper face stock with adhesive on a release liner; kiss cut around printed stickers.',
    thicknessMm: 0.15,
    basisWeight: null,
    grammageGsm: null,
    laserSafe: true,
    blade: { bladeType: 'standard', bladeAngleDeg: 45, force: 110, passes: 1, speedMmS: 200 },
    laser: { powerPercent: 10, speedMmS: 180, passes: 1 },
  },
  {
    key: 'copy-paper',
    name: 'Copy paper',
    category: 'paper',
    description: 'Plain office paper, about 80 g/m²; tears easily on fine detail, so cut slowly.',
    thicknessMm: 0.1,
    basisWeight: null,
    grammageGsm: 80,
    laserSafe: true,
    blade: { bladeType: 'standard', bladeAngleDeg: 45, force: 70, passes: 1, speedMmS: 150 },
    laser: { powerPercent: 8, speedMmS: 200, passes: 1 },
  },
  {
    key: 'cardstock-65lb-cover',
    name: 'Cardstock, 65 lb cover',
    category: 'cardstock',
    description: 'Light card for cards, tags and layered paper craft.',
    thicknessMm: 0.23,
    basisWeight: { pounds: 65, kind: 'cover' },
    grammageGsm: null,
    laserSafe: true,
    blade: { bladeType: 'standard', bladeAngleDeg: 45, force: 160, passes: 1, speedMmS: 150 },
    laser: { powerPercent: 15, speedMmS: 120, passes: 1 },
  },
  {
    key: 'cardstock-80lb-cover',
    name: 'Cardstock, 80 lb cover',
    category: 'cardstock',
    description: 'Mid-weight card for boxes, toppers and sturdy cards.',
    thicknessMm: 0.28,
    basisWeight: { pounds: 80, kind: 'cover' },
    grammageGsm: null,
    laserSafe: true,
    blade: { bladeType: 'standard', bladeAngleDeg: 45, force: 185, passes: 1, speedMmS: 120 },
    laser: { powerPercent: 18, speedMmS: 110, passes: 1 },
  },
  {
    key: 'cardstock-110lb-cover',
    name: 'Cardstock, 110 lb cover',
    category: 'cardstock',
    description: 'Heavy card; a deeper blade and a second pass keep the corners from tearing.',
    thicknessMm: 0.38,
    basisWeight: { pounds: 110, kind: 'cover' },
    grammageGsm: null,
    laserSafe: true,
    blade: { bladeType: 'deep-cut', bladeAngleDeg: 60, force: 230, passes: 2, speedMmS: 100 },
    laser: { powerPercent: 22, speedMmS: 100, passes: 1 },
  },
  {
    key: 'kraft-board',
    name: 'Kraft board',
    category: 'board',
    description: 'Brown board about 1 mm thick for boxes and backing; cut in several passes.',
    thicknessMm: 1,
    basisWeight: null,
    grammageGsm: null,
    laserSafe: true,
    blade: { bladeType: 'deep-cut', bladeAngleDeg: 60, force: 320, passes: 3, speedMmS: 80 },
    laser: { powerPercent: 40, speedMmS: 60, passes: 1 },
  },
  {
    key: 'faux-leather-thin',
    name: 'Faux leather, thin',
    category: 'leather',
    description: 'Synthetic leather about 0.6 mm thick on a fabric back; cut face down on a strong-grip mat.',
    thicknessMm: 0.6,
    basisWeight: null,
    grammageGsm: null,
    laserSafe: false,
    blade: { bladeType: 'deep-cut', bladeAngleDeg: 60, force: 260, passes: 2, speedMmS: 80 },
    laser: null,
  },
  {
    key: 'faux-leather-thick',
    name: 'Faux leather, thick',
    category: 'leather',
    description: 'Synthetic leather about 1.2 mm thick; several passes with a deep-cut blade.',
    thicknessMm: 1.2,
    basisWeight: null,
    grammageGsm: null,
    laserSafe: false,
    blade: { bladeType: 'deep-cut', bladeAngleDeg: 60, force: 340, passes: 3, speedMmS: 60 },
    laser: null,
  },
  {
    key: 'felt',
    name: 'Felt',
    category: 'fabric',
    description: 'Craft felt about 1.5 mm thick; a stabiliser on the back keeps small shapes from stretching.',
    thicknessMm: 1.5,
    basisWeight: null,
    grammageGsm: null,
    laserSafe: true,
    blade: { bladeType: 'rotary', bladeAngleDeg: null, force: 300, passes: 2, speedMmS: 60 },
    laser: { powerPercent: 25, speedMmS: 80, passes: 1 },
  },
  {
    key: 'bonded-cotton',
    name: 'Bonded cotton',
    category: 'fabric',
    description: 'Cotton fabric with an iron-on stabiliser; cut fabric side down.',
    thicknessMm: 0.4,
    basisWeight: null,
    grammageGsm: null,
    laserSafe: true,
    blade: { bladeType: 'fabric', bladeAngleDeg: 45, force: 180, passes: 1, speedMmS: 100 },
    laser: { powerPercent: 15, speedMmS: 150, passes: 1 },
  },
  {
    key: 'craft-foam',
    name: 'Craft foam',
    category: 'foam',
    description: 'Foam sheet about 2 mm thick; slow and deep, with a second pass for clean edges.',
    thicknessMm: 2,
    basisWeight: null,
    grammageGsm: null,
    laserSafe: true,
    blade: { bladeType: 'deep-cut', bladeAngleDeg: 60, force: 280, passes: 2, speedMmS: 60 },
    laser: { powerPercent: 20, speedMmS: 100, passes: 1 },
  },
]

export function findCatalogueEntry(key: string | null | undefined): CatalogueEntry | undefined {
  if (!key) return undefined
  return catalogue.find((entry) => entry.key === key)
}

/** A catalogue recipe as recipe values (the other tool kind's fields null). */
export function catalogueRecipeValues(entry: CatalogueEntry, toolKind: RecipeToolKind): RecipeValues | null {
  if (toolKind === 'blade') {
    const { bladeType, bladeAngleDeg, force, passes, speedMmS } = entry.blade
    return { bladeType, bladeAngleDeg, force, passes, speedMmS, powerPercent: null }
  }
  if (!entry.laser) return null
  const { powerPercent, speedMmS, passes } = entry.laser
  return { bladeType: null, bladeAngleDeg: null, force: null, passes, speedMmS, powerPercent }
}
