// The app bundles only the faces of Barlow its templates use: each face is one more download
// on a weak signal and one more layout of the whole page when it arrives. A weight class with no
// face of its own would be drawn in the nearest face instead (500 in the 400 face): the template
// would say one thing and the screen show another. So every weight a template asks for is loaded,
// and every face loaded is asked for somewhere.
import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'

const root = fileURLToPath(new URL('../..', import.meta.url))

/** Tailwind's font-weight classes (its default theme; tailwind.config.ts adds none). */
const WEIGHT_CLASSES: Record<string, number> = {
  'font-thin': 100,
  'font-extralight': 200,
  'font-light': 300,
  'font-normal': 400,
  'font-medium': 500,
  'font-semibold': 600,
  'font-bold': 700,
  'font-extrabold': 800,
  'font-black': 900,
}

function filesUnder(dir: string, ext: RegExp): string[] {
  return readdirSync(join(root, dir), { recursive: true, withFileTypes: true })
    .filter(d => d.isFile() && ext.test(d.name))
    .map(d => join(d.parentPath, d.name))
}

const loadedWeights = [...readFileSync(join(root, 'nuxt.config.ts'), 'utf8').matchAll(/'@fontsource\/barlow\/(\d{3})\.css'/g)]
  .map(m => Number(m[1]))

const sources = ['pages', 'components', 'layouts'].flatMap(dir => filesUnder(dir, /\.vue$/))
const css = [...filesUnder('assets', /\.css$/), join(root, 'tailwind.config.ts')]

/** Every weight asked for, with the files that ask for it. */
function weightsAskedFor(): Map<number, string[]> {
  const asked = new Map<number, string[]>()
  const note = (weight: number, file: string) => asked.set(weight, [...asked.get(weight) ?? [], file.slice(root.length)])
  for (const file of sources) {
    const text = readFileSync(file, 'utf8')
    for (const m of text.matchAll(/(?<![\w-])(font-(?:thin|extralight|light|normal|medium|semibold|bold|extrabold|black))(?![\w-])/g)) note(WEIGHT_CLASSES[m[1]!]!, file)
    for (const m of text.matchAll(/font-weight:\s*(\d{3})/g)) note(Number(m[1]), file)
  }
  for (const file of css) {
    const text = readFileSync(file, 'utf8')
    for (const m of text.matchAll(/font-weight:\s*(\d{3})|fontWeight:\s*'(\d{3})'|@apply[^;]*\b(font-(?:thin|extralight|light|normal|medium|semibold|bold|extrabold|black))\b/g)) {
      note(m[3] ? WEIGHT_CLASSES[m[3]]! : Number(m[1] ?? m[2]), file)
    }
  }
  return asked
}

describe('the faces of Barlow the app loads (common practice: one download per face used)', () => {
  it('loads some faces of Barlow, the normal one among them', () => {
    expect(loadedWeights).toContain(400)
  })

  it('loads a face for every weight a template or stylesheet asks for', () => {
    const missing = [...weightsAskedFor()].filter(([weight]) => !loadedWeights.includes(weight))
    expect(missing, 'weights asked for with no face loaded (nuxt.config.ts css)').toEqual([])
  })

  it('asks for every face it loads', () => {
    const asked = weightsAskedFor()
    // 400 is the body text's weight, asked for by no class.
    expect(loadedWeights.filter(weight => weight !== 400 && !asked.has(weight))).toEqual([])
  })
})
