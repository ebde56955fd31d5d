/**
 * Path data for comparing our path lengths with a browser's. Hand-written strings cover every command letter
 * (W3C SVG 1.1 §8.3), implicit repeats, number syntax and the arc corner cases of Appendix F.6; the generated
 * strings mix all commands in absolute and relative form from a seeded generator, so every run checks the same corpus.
 */
export const handWrittenPaths: string[] = [
  // M L H V Z, absolute and relative
  'M10 10 L90 10 L90 90 Z',
  'm10 10 l80 0 l0 80 z',
  'M10 10 H90 V90 H10 Z',
  'M10 10 h80 v80 h-80 z',
  'M10 10 L40 10 L40 40 Z L10 60',
  'M10 10 l30 0 l0 30 z l0 50',
  'M10 10 L40 10 L40 40 Z m5 5 l10 0',
  'M0 0 L10 0 M20 20 L30 20 M40 40 l5 5',
  'M0 0 L30 0 L30 30 z z',
  // C c S s
  'M0 0 C10 30 40 -20 50 10',
  'M0 0 c10 30 40 -20 50 10 s30 40 50 0',
  'M0 0 C10 30 40 -20 50 10 S80 50 100 10',
  'M0 0 S20 40 40 0',
  'M0 0 Q10 10 20 0 S30 10 40 0',
  'M0 0 C0 0 0 0 30 40',
  'M0 0 C30 30 -10 30 20 0',
  'M10 80 C40 10 65 10 95 80 S150 150 180 80',
  // Q q T t
  'M0 0 Q25 50 50 0 T100 0 T150 0',
  'm0 0 q25 50 50 0 t50 0 t50 0',
  'M0 0 T50 50',
  'M0 0 C10 10 20 10 30 0 T60 0',
  'M10 80 Q52.5 10 95 80 T180 80',
  'M0 0 q10 -20 20 0 t20 0 q5 20 10 0',
  // A a
  'M0 0 A20 20 0 0 1 40 0',
  'M0 0 a20 20 0 0 0 40 0',
  'M0 0 A1 1 0 0 1 10 0',
  'M0 0 A1 1 0 0 0 100 50',
  'M0 0 A3 1 45 1 1 60 20',
  'M0 0 a5 5 0 1010 0',
  'M0 0a5 5 0 1 1 10 0',
  'M0 0 a25,25 -30 0,1 50,-25',
  'M80 80 A45 45 0 0 0 125 125 L125 80 Z',
  'M230 80 A45 45 0 1 0 275 125 L275 80 Z',
  'M80 230 A45 45 0 0 1 125 275 L125 230 Z',
  'M230 230 A45 45 0 1 1 275 275 L275 230 Z',
  'M0 0 A0 10 0 0 1 30 40',
  'M0 0 A10 0 0 0 1 30 40',
  'M0 0 A10 10 0 1 1 0 0 L10 0',
  'M0 0 A-10 -5 0 0 1 30 0',
  'M0 0 A20 10 400 0 1 30 10',
  'M0 0 A20 10 -30 1 0 30 10',
  'M10 10 a30 12 30 1 1 20 20 a30 12 30 1 1 -20 -20 z',
  // implicit repeated parameters
  'M0 0 L10 0 20 10 30 0',
  'M0 0 10 0 10 10',
  'm0 0 10 0 0 10 -10 0',
  'M0 0 H10 20 30 V10 20 5',
  'm0 0 h10 10 v10 10 h-5 -5',
  'M0 0 C10 10 20 10 30 0 40 -10 50 -10 60 0',
  'M0 0 c10 10 20 10 30 0 10 -10 20 -10 30 0',
  'M0 0 Q10 10 20 0 30 -10 40 0',
  'M0 0 S10 10 20 0 30 -10 40 0',
  'M0 0 T10 10 20 0 30 10',
  'M0 0 A5 5 0 0 1 10 0 5 5 0 0 1 20 0',
  'm0 0 a5 5 0 0 1 10 0 5 5 0 0 1 10 0',
  // number syntax: exponents, packed numbers, separators, white space
  'M1e1 1e1 L1E2 1e1',
  'M0 0 L1.5e1 -2e-1 l-1e+1 3E0',
  'M0 0 l.5e2 0 0 .25e2',
  'M0.5.5L10.5.5',
  'M0-5L10-10-20-30',
  'M.5.5l.5.5.5.5',
  'M0,0L10,0,10,10z',
  'M 0 , 0 L 10 , 10',
  'M\t0\n0 L 10\r\n10 l -5 ,-5',
  'M-10-10l20.0 0 0 20.00-20.000 0z',
  'M0 0L+10 0l+5+5',
  'M1e-1 1e-1 L2.5e+1 .25E2 l-.5e1-5e-0',
  'M 100 100 L 150 150 l 0 0 Z',
]

/** Mulberry32: a tiny, well-known 32-bit seeded PRNG (deterministic; no Math.random). */
export function mulberry32(seed: number): () => number {
  let state = seed >>> 0
  return () => {
    state = (state + 0x6d2b79f5) >>> 0
    let t = state
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

type Token = { text: string; kind: 'command' | 'number' | 'flag' }

/** Random path data mixing every command, absolute and relative, with varied but valid number syntax. */
export function generatedPaths(seed: number, count: number): string[] {
  const random = mulberry32(seed)
  const between = (low: number, high: number) => low + (high - low) * random()
  const chance = (probability: number) => random() < probability
  const pick = <T>(items: readonly T[]): T => items[Math.floor(random() * items.length)]!

  const numberText = (value: number): string => {
    if (chance(0.08)) return value.toExponential(Math.floor(between(0, 4)))
    let text = value.toFixed(Math.floor(between(0, 4)))
    if (text === '-0') text = '0'
    if (chance(0.3)) text = text.replace(/^(-?)0\./, '$1.')
    return text
  }
  const absolute = () => between(0, 200)
  const offset = () => between(-40, 40)

  const letters = ['L', 'H', 'V', 'C', 'S', 'Q', 'T', 'A', 'Z', 'M'] as const
  const paths: string[] = []
  for (let pathIndex = 0; pathIndex < count; pathIndex++) {
    const tokens: Token[] = [{ text: chance(0.5) ? 'M' : 'm', kind: 'command' }]
    tokens.push({ text: numberText(absolute()), kind: 'number' }, { text: numberText(absolute()), kind: 'number' })
    const commandCount = 2 + Math.floor(random() * 9)
    for (let commandIndex = 0; commandIndex < commandCount; commandIndex++) {
      const letter = pick(letters)
      const relative = chance(0.5)
      const coordinate = relative ? offset : absolute
      tokens.push({ text: relative ? letter.toLowerCase() : letter, kind: 'command' })
      if (letter === 'Z') continue
      const repeats = chance(0.2) ? 2 : 1
      for (let repeat = 0; repeat < repeats; repeat++) {
        const numbers = (...values: number[]) => values.forEach((value) => tokens.push({ text: numberText(value), kind: 'number' }))
        switch (letter) {
          case 'M':
          case 'L':
          case 'T':
            numbers(coordinate(), coordinate())
            break
          case 'H':
          case 'V':
            numbers(coordinate())
            break
          case 'C':
            numbers(coordinate(), coordinate(), coordinate(), coordinate(), coordinate(), coordinate())
            break
          case 'S':
          case 'Q':
            numbers(coordinate(), coordinate(), coordinate(), coordinate())
            break
          case 'A': {
            // One arc in six has radii far too small for its endpoints (scaled up per F.6.6).
            const small = chance(1 / 6)
            numbers(small ? between(0.1, 2) : between(2, 80), small ? between(0.1, 2) : between(2, 80), between(-180, 400))
            tokens.push({ text: chance(0.5) ? '1' : '0', kind: 'flag' }, { text: chance(0.5) ? '1' : '0', kind: 'flag' })
            numbers(coordinate(), coordinate())
            break
          }
        }
      }
    }
    paths.push(joinTokens(tokens, random))
  }
  return paths
}

/** Joins tokens with spaces, commas or nothing where the grammar allows it (a sign, a second dot, an arc flag). */
function joinTokens(tokens: Token[], random: () => number): string {
  let text = tokens[0]!.text
  for (let index = 1; index < tokens.length; index++) {
    const previous = tokens[index - 1]!
    const token = tokens[index]!
    const packable =
      previous.kind === 'command' ||
      token.kind === 'command' ||
      previous.kind === 'flag' ||
      (previous.kind === 'number' && token.text.startsWith('-') && !/e$/i.test(previous.text)) ||
      (previous.kind === 'number' && token.text.startsWith('.') && previous.text.includes('.') && !/e/i.test(previous.text))
    const roll = random()
    if (packable && roll < 0.4) text += token.text
    else if (previous.kind !== 'command' && token.kind !== 'command' && roll < 0.6) text += `,${token.text}`
    else text += ` ${token.text}`
  }
  return text
}
