// Layout editor drag benchmark: a layout of 500 pieces from the demo designs opened in headless Chromium; one piece,
// then a group of about 40, dragged across the stock with a steady stream of mouse moves while requestAnimationFrame records
// the frame times. Prints median and p95 and rewrites its section of docs/benchmarks.md.
//
//   npm start                      (in another terminal: the demo studio on http://127.0.0.1:5173)
//   npm run bench:editor [-- --url http://127.0.0.1:5173 --pieces 500 --no-write]
import { readFileSync, writeFileSync } from 'node:fs'
import { cpus, loadavg, totalmem } from 'node:os'
import { parseArgs } from 'node:util'
import { chromium, type Page } from 'playwright-core'
import { designListResponseSchema, type DesignSummary } from '../shared/schemas/designs.js'
import { layoutDetailSchema, type CreateLayoutRequest, type LayoutPlacement } from '../shared/schemas/layouts.js'

const { values } = parseArgs({
  options: {
    url: { type: 'string', default: process.env.APP_URL ?? 'http://127.0.0.1:5173' },
    email: { type: 'string', default: 'maker@thistle-tack.example' },
    password: { type: 'string', default: 'demo-cut-2026' },
    pieces: { type: 'string', default: '500' },
    'no-write': { type: 'boolean', default: false },
  },
})
const baseUrl = values.url!.replace(/\/$/, '')
const pieceCount = Number(values.pieces)

async function call<T>(path: string, init: RequestInit & { token?: string } = {}): Promise<T> {
  const response = await fetch(`${baseUrl}${path}`, {
    ...init,
    headers: { 'Content-Type': 'application/json', ...(init.token ? { Authorization: `Bearer ${init.token}` } : {}) },
  })
  if (!response.ok) throw new Error(`${init.method ?? 'GET'} ${path}: HTTP ${response.status} ${await response.text()}`)
  return (await response.json()) as T
}

/**
 * A layout of `pieces` copies of the demo designs (the six smallest that are one piece without holes, so the middle of
 * a piece's box is on its material), packed in shelves with 2 mm spacing across a 1220 mm (48 in) roll: about as long
 * as wide, so the whole layout fits the view.
 */
async function createBenchLayout(token: string, workspaceId: string): Promise<{ layoutId: string; designCount: number }> {
  const list = designListResponseSchema.parse(await call(`/api/workspaces/${workspaceId}/designs?pageSize=100`, { token }))
  const size = (design: DesignSummary) => [design.bbox.maxX - design.bbox.minX, design.bbox.maxY - design.bbox.minY] as const
  const designs = list.items
    .filter((design) => (design.pieceCount === 1 || design.keepTogether) && design.holeCount === 0)
    .sort((a, b) => size(a)[0] * size(a)[1] - size(b)[0] * size(b)[1])
    .slice(0, 6)
  if (designs.length === 0) throw new Error('the workspace has no designs: run `npm start` (it seeds the demo studio)')
  const spacingMm = 2
  const marginMm = 5
  const widthMm = 1219.2
  const placements: LayoutPlacement[] = []
  // Shelves run along the roll's width (y); a new shelf starts further along its length (x).
  let shelfX = marginMm
  let shelfDepth = 0
  let y = marginMm
  for (let index = 0; index < pieceCount; index++) {
    const design = designs[index % designs.length]!
    const [width, height] = size(design)
    if (y + height > widthMm - marginMm) {
      shelfX += shelfDepth + spacingMm
      shelfDepth = 0
      y = marginMm
    }
    placements.push({
      id: `bench-${index}`,
      designId: design.id,
      pieceIndex: design.pieceCount === 1 ? 0 : -1,
      sheet: 0,
      xMm: shelfX - design.bbox.minX,
      yMm: y - design.bbox.minY,
      angleDeg: 0,
      mirrored: false,
      locked: false,
    })
    y += height + spacingMm
    shelfDepth = Math.max(shelfDepth, width)
  }
  const body: CreateLayoutRequest = {
    name: `Drag benchmark, ${pieceCount} pieces`,
    isTemplate: false,
    stock: { kind: 'roll', widthMm, lengthMm: Math.ceil(shelfX + shelfDepth + marginMm) },
    items: designs.map((design) => ({
      designId: design.id,
      quantity: Math.max(1, placements.filter((placement) => placement.designId === design.id).length),
      rotation: 'quarter-turns',
      mirror: 'never',
      grainLock: false,
    })),
    placements,
    options: { spacingMm, marginMm, excludedZones: [], snapToGrid: false, gridMm: 5 },
  }
  const created = layoutDetailSchema.parse(await call(`/api/workspaces/${workspaceId}/layouts`, { method: 'POST', token, body: JSON.stringify(body) }))
  return { layoutId: created.id, designCount: designs.length }
}

interface FrameStats {
  frames: number
  medianMs: number
  p95Ms: number
  maxMs: number
}

/**
 * Starts recording rAF intervals in the page; the returned function stops and hands them back. The page code is
 * passed as text: tsx's helpers for function names do not exist in the page.
 */
async function recordFrames(page: Page): Promise<() => Promise<number[]>> {
  await page.evaluate(`(() => {
    window.benchFrames = []
    window.benchRecording = true
    let last = 0
    const tick = (now) => {
      window.benchFrames.push(now - last)
      last = now
      if (window.benchRecording) requestAnimationFrame(tick)
    }
    requestAnimationFrame((now) => {
      last = now
      requestAnimationFrame(tick)
    })
  })()`)
  return async () => (await page.evaluate('(() => { window.benchRecording = false; return window.benchFrames })()')) as number[]
}

function stats(frames: number[]): FrameStats {
  const sorted = [...frames].sort((a, b) => a - b)
  const at = (share: number) => sorted[Math.min(sorted.length - 1, Math.floor(share * (sorted.length - 1)))]!
  return { frames: sorted.length, medianMs: at(0.5), p95Ms: at(0.95), maxMs: sorted[sorted.length - 1]! }
}

/** Drags from `from` along a loop of `moves` mouse moves (about 4 px apart), as a hand drags a piece around. */
async function dragAround(page: Page, from: { x: number; y: number }, moves: number): Promise<FrameStats> {
  await page.mouse.move(from.x, from.y)
  await page.mouse.down()
  const stop = await recordFrames(page)
  for (let step = 1; step <= moves; step++) {
    const angle = (step / moves) * 2 * Math.PI
    await page.mouse.move(from.x + 160 * Math.sin(angle) + step * 0.6, from.y + 90 * (1 - Math.cos(angle)))
  }
  const frames = await stop()
  await page.mouse.up()
  // The first frames include the start of the drag (hiding the pieces from the main layer); they are part of the drag.
  return stats(frames)
}

const signIn = await call<{ accessToken: string; user: { name: string } }>('/api/auth/signin', { method: 'POST', body: JSON.stringify({ email: values.email, password: values.password }) })
const workspaces = await call<{ id: string; name: string }[]>('/api/workspaces', { token: signIn.accessToken })
const workspace = workspaces[0]!
const { layoutId, designCount } = await createBenchLayout(signIn.accessToken, workspace.id)

const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', headless: true, args: ['--no-sandbox', '--disable-gpu', '--no-first-run'] })
/** About this many pieces are dragged together in the second measurement. */
const GROUP_SIZE = 40
let single: FrameStats
let group: FrameStats
let groupLabel = ''
const chromiumVersion = browser.version()
try {
  const page = await browser.newPage({ viewport: { width: 1440, height: 900 } })
  await page.goto(`${baseUrl}/signin`)
  await page.getByTestId('signin-email').fill(values.email!)
  await page.getByTestId('signin-password').fill(values.password!)
  await page.getByTestId('signin-submit').click()
  await page.waitForURL(/\/w\/[^/]+$/)
  await page.goto(`${baseUrl}/w/${workspace.id}/layouts/${layoutId}`)
  await page.getByTestId('layout-placed').waitFor()
  await page.waitForTimeout(1000)
  const shown = await page.getByTestId('layout-placed').textContent()
  if (!shown?.startsWith(`${pieceCount} of`)) throw new Error(`the editor shows “${shown}”, not ${pieceCount} pieces`)

  // One piece: the first, picked with Tab so its place on screen comes from the selection frame.
  await page.getByTestId('layout-canvas').focus()
  await page.keyboard.press('Tab')
  const frame = (await page.getByTestId('layout-selection-frame').boundingBox())!
  await dragAround(page, { x: frame.x + frame.width / 2, y: frame.y + frame.height / 2 }, 30)
  await page.keyboard.press('Control+z')
  single = await dragAround(page, { x: frame.x + frame.width / 2, y: frame.y + frame.height / 2 }, 240)
  await page.keyboard.press('Control+z')

  // A group: a selection box drawn from outside the stock over its first shelves, then dragged by its first piece.
  await page.keyboard.press('Escape')
  const canvasBox = (await page.getByTestId('layout-canvas').boundingBox())!
  const from = { x: frame.x - 12, y: frame.y - 12 }
  let reach = 40
  let selectedText = ''
  for (let attempt = 0; attempt < 12; attempt++) {
    await page.mouse.move(from.x, from.y)
    await page.mouse.down()
    await page.mouse.move(from.x + reach, from.y + reach * 1.6, { steps: 4 })
    await page.mouse.up()
    selectedText = (await page.getByTestId('layout-selection').textContent())?.trim() ?? ''
    const count = Number(/^(\d+) pieces/.exec(selectedText)?.[1] ?? 0)
    if (count >= GROUP_SIZE) break
    reach = Math.min(reach * 1.3, canvasBox.height)
  }
  const groupSize = Number(/^(\d+) pieces/.exec(selectedText)?.[1] ?? 0)
  if (groupSize < GROUP_SIZE) throw new Error(`the group drag needs ${GROUP_SIZE} selected pieces; the editor says “${selectedText}”`)
  group = await dragAround(page, { x: frame.x + frame.width / 2, y: frame.y + frame.height / 2 }, 240)
  groupLabel = `${groupSize} pieces at once`
  await page.keyboard.press('Control+z')
} finally {
  await browser.close()
  await fetch(`${baseUrl}/api/workspaces/${workspace.id}/layouts/${layoutId}`, { method: 'DELETE', headers: { Authorization: `Bearer ${signIn.accessToken}` } })
}

const line = (label: string, figures: FrameStats) =>
  `| ${label} | ${figures.frames} | ${figures.medianMs.toFixed(1)} ms | ${figures.p95Ms.toFixed(1)} ms | ${figures.maxMs.toFixed(1)} ms |`
console.log(line('one piece', single))
console.log(line(groupLabel, group))

if (!values['no-write']) {
  const section = [
    '<!-- bench:editor:start -->',
    '## Layout editor drag (`npm run bench:editor`)',
    '',
    `A layout of ${pieceCount} pieces (copies of ${designCount} demo designs of one piece without holes, packed in shelves on a 1220 mm`,
    'roll) open in headless Chromium (1440 × 900, no GPU); a piece, then a group selected with a box, is dragged around a loop',
    'with 240 mouse moves while requestAnimationFrame records the time between frames. Every frame of the drag runs the live',
    'check (overlap, spacing, usable area) of the dragged pieces against their neighbours found through the spatial index.',
    '16.7 ms is one frame at 60 Hz. The longest frame is the first of the drag, when the main layer is drawn once without',
    'the dragged pieces (all 500 outlines, filled and stroked in software); after that only the dragged pieces move.',
    '',
    '| dragged | frames | median frame time | p95 frame time | longest frame |',
    '| --- | --- | --- | --- | --- |',
    line('one piece', single),
    line(groupLabel, group),
    '',
    `Machine: ${cpus()[0]?.model ?? 'unknown'}, ${cpus().length} cores, ${(totalmem() / 2 ** 30).toFixed(1)} GiB, Node ${process.version}, Chromium ${chromiumVersion} (software rendering); load average ${loadavg()[0]!.toFixed(2)} at the end; ${new Date().toISOString().slice(0, 10)}.`,
    '<!-- bench:editor:end -->',
  ].join('\n')
  const file = 'docs/benchmarks.md'
  const current = readFileSync(file, 'utf8')
  const pattern = /<!-- bench:editor:start -->[\s\S]*<!-- bench:editor:end -->/
  writeFileSync(file, pattern.test(current) ? current.replace(pattern, section) : `${current.trimEnd()}\n\n${section}\n`)
}
