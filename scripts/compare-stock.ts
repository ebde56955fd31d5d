// Runs one stock comparison through a running server's API and prints its table: which stock wastes and costs least.
// Usage: npx tsx scripts/compare-stock.ts --url http://127.0.0.1:5173 --email owner@thistle-tack.example
//          --password demo-cut-2026 [--stocks "name a;name b;name c"] [--quantity 4] [--seconds 5]
// Without --stocks, the first three active shelf items are compared; every design of the workspace goes in `quantity` times.
import { parseArgs } from 'node:util'
import { comparisonDetailSchema, type ComparisonDetail } from '../shared/schemas/comparisons.js'

const { values } = parseArgs({
  options: {
    url: { type: 'string', default: 'http://127.0.0.1:5173' },
    email: { type: 'string', default: 'owner@thistle-tack.example' },
    password: { type: 'string', default: 'demo-cut-2026' },
    stocks: { type: 'string' },
    quantity: { type: 'string', default: '4' },
    seconds: { type: 'string', default: '5' },
  },
})

async function call<T>(path: string, init: RequestInit & { token?: string } = {}): Promise<T> {
  const response = await fetch(`${values.url}${path}`, {
    ...init,
    headers: { 'Content-Type': 'application/json', ...(init.token ? { Authorization: `Bearer ${init.token}` } : {}) },
  })
  const body = await response.json().catch(() => null)
  if (!response.ok) throw new Error(`${init.method ?? 'GET'} ${path}: ${response.status} ${JSON.stringify(body)}`)
  return body as T
}

const session = await call<{ accessToken: string }>('/api/auth/signin', { method: 'POST', body: JSON.stringify({ email: values.email, password: values.password }) })
const token = session.accessToken
const [workspace] = await call<{ id: string; name: string }[]>('/api/workspaces', { token })
if (!workspace) throw new Error('no workspace')
const designs = await call<{ items: { id: string; name: string; pieceCount: number }[] }>(`/api/workspaces/${workspace.id}/designs?pageSize=100`, { token })
const shelf = await call<{ items: { id: string; name: string }[] }>(`/api/workspaces/${workspace.id}/stock?pageSize=100`, { token })
const wanted = values.stocks?.split(';').map((name) => name.trim())
const stocks = wanted ? wanted.map((name) => shelf.items.find((item) => item.name === name) ?? (() => { throw new Error(`no stock named ${name}`) })()) : shelf.items.slice(0, 3)
const quantity = Number(values.quantity)

const started = await call<ComparisonDetail>(`/api/workspaces/${workspace.id}/comparisons`, {
  method: 'POST',
  token,
  body: JSON.stringify({
    items: designs.items.filter((design) => design.pieceCount > 0).map((design) => ({ designId: design.id, quantity })),
    stocks: stocks.map((item) => ({ kind: 'stock-item', stockItemId: item.id })),
    timeBudgetSeconds: Number(values.seconds),
    seed: 1,
  }),
})
let comparison = comparisonDetailSchema.parse(started)
while (comparison.status === 'queued' || comparison.status === 'running') {
  await new Promise((resolve) => setTimeout(resolve, 1000))
  comparison = comparisonDetailSchema.parse(await call(`/api/workspaces/${workspace.id}/comparisons/${comparison.id}`, { token }))
}

console.log(`${workspace.name}: ${comparison.name}`)
console.log(`${designs.items.filter((design) => design.pieceCount > 0).length} designs × ${quantity}, ${comparison.options.timeBudgetSeconds} s per stock, seed 1; status ${comparison.status}`)
console.log(['stock', 'used', 'utilisation', 'waste m²', 'cost', 'per piece', 'placed', 'cut m', 'cut time', 'best'].join(' | '))
for (const row of comparison.rows) {
  const f = row.figures
  if (!f) {
    console.log(`${row.stock.label} | ${row.runStatus} ${row.error ?? ''}`)
    continue
  }
  const used = row.stock.kind === 'sheets' ? `${f.sheetsUsed} sheets` : `${(f.usedLengthMm / 1000).toFixed(3)} m`
  const time = f.cutTimeSeconds === null ? '—' : `${Math.floor(f.cutTimeSeconds / 60)} min ${Math.round(f.cutTimeSeconds % 60)} s`
  console.log(
    [row.stock.label, used, `${(f.utilisation * 100).toFixed(1)} %`, (f.wasteAreaMm2 / 1e6).toFixed(4), f.materialCost?.toFixed(2) ?? '—', f.costPerPiece?.toFixed(4) ?? '—', `${f.placedCount}/${f.wantedCount}`, (f.cutLengthMm / 1000).toFixed(2), time, row.best.join(', ')].join(' | '),
  )
}
