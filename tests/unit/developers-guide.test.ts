// DEVELOPERS.md stays a map, and the map and the design notes (docs/*.md) stay true: the guide
// is at most 15,000 characters, and every repository path it or a design note names exists.
// A path is a token that starts with a top-level folder (`server/`, `tests/`, …) or names a
// root file (`README.md`, `knexfile.ts`, …); a placeholder (`<area>`, a `[id]` segment that is
// not in the tree, `*`, `…`, `{a,b}`) stands for what follows, so only the part before it is
// checked; a `:symbol` or line suffix is not part of the path.
import { existsSync, readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'

const root = fileURLToPath(new URL('../..', import.meta.url))
const read = (path: string) => readFileSync(join(root, path), 'utf8')

const GUIDE_MAX_CHARS = 15_000

const FOLDERS = ['server', 'shared', 'components', 'composables', 'utils', 'stores', 'pages', 'layouts', 'middleware', 'plugins', 'migrations', 'seeds', 'scripts', 'tests', 'docs', 'assets', 'public', '.ci']
const ROOT_FILES = ['README.md', 'DEVELOPERS.md', 'package.json', 'nuxt.config.ts', 'tailwind.config.ts', 'tsconfig.json', 'knexfile.ts', 'eslint.config.mjs', 'vitest.config.ts']

const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')
// Not preceded by anything that would make it part of a longer path, an alias (#shared/…),
// a package (@scope/…) or a relative path outside the repository (../shared/STACK.md).
const PATH_TOKEN = new RegExp(
  `(?<![\\w./#~@-])(?:(?:${FOLDERS.map(escape).join('|')})/[^\\s\`'"()|,;]*|(?:${ROOT_FILES.map(escape).join('|')})(?![\\w-]|\\.\\w))`,
  'g',
)

/** The repository paths a text names, as written (suffixes and trailing punctuation removed). */
function namedPaths(text: string): string[] {
  return [...new Set([...text.matchAll(PATH_TOKEN)].map(m => m[0]
    .replace(/[:#].*$/, '') // a `:symbol`, `:12-30` or `#L12` suffix
    .replace(/[.!?’”]+$/, '')))] // sentence punctuation
}

/**
 * The part of a path that must exist: up to the first placeholder segment. `<…>`, `*`, `…` and
 * `{…}` always stand for something; a `[name]` segment does only where the tree has no folder
 * or file of that literal name (`[competitionId]` exists, so it is checked as written).
 */
function checkedPart(path: string): string {
  const segments = path.split('/')
  const kept: string[] = []
  for (const segment of segments) {
    if (/[<*…{]/.test(segment)) break
    if (/\[[^\]]+\]/.test(segment) && !existsSync(join(root, ...kept, segment))) break
    kept.push(segment)
  }
  return kept.join('/')
}

/** The named paths of a text that do not exist in the repository. */
function missingPaths(text: string): string[] {
  return namedPaths(text).filter(path => !existsSync(join(root, checkedPart(path))))
}

const notes = readdirSync(join(root, 'docs')).filter(name => name.endsWith('.md')).sort().map(name => `docs/${name}`)

describe('DEVELOPERS.md', () => {
  it('is a map of at most 15,000 characters', () => {
    const characters = [...read('DEVELOPERS.md')].length
    expect(characters).toBeLessThanOrEqual(GUIDE_MAX_CHARS)
  })

  it('names only paths that exist', () => {
    const guide = read('DEVELOPERS.md')
    expect(namedPaths(guide).length).toBeGreaterThan(50)
    expect(missingPaths(guide)).toEqual([])
  })

  it('points to every design note in docs/', () => {
    expect(notes.length).toBeGreaterThan(0)
    const guide = read('DEVELOPERS.md')
    expect(notes.filter(note => !guide.includes(note))).toEqual([])
  })
})

describe('the design notes (docs/*.md)', () => {
  it.each(notes)('%s names only paths that exist', (note) => {
    expect(missingPaths(read(note))).toEqual([])
  })
})

describe('the path check itself', () => {
  it('reports a path that does not exist, in backticks or in plain text', () => {
    expect(missingPaths('See `server/domain/board/refresh.ts` and tests/unit/server/nowhere.test.ts.'))
      .toEqual(['server/domain/board/refresh.ts', 'tests/unit/server/nowhere.test.ts'])
    expect(missingPaths('The old `server/utils/board.ts:refreshTiles`, in README.mdx')).toEqual(['server/utils/board.ts'])
  })

  it('checks the part before a placeholder, and keeps literal route folders', () => {
    expect(missingPaths('`server/domain/<area>/`, `shared/constants/messages-<area>.ts`, `tests/e2e/api/<resource>/`')).toEqual([])
    expect(missingPaths('`server/api/competitions/[competitionId]/board/seq.get.ts`, `tests/{unit,nuxt}`, `migrations/*.ts`, `server/api/…`')).toEqual([])
    expect(missingPaths('`server/api/competitions/[competitionId]/nowhere/[id].get.ts`')).toEqual(['server/api/competitions/[competitionId]/nowhere/[id].get.ts'])
    expect(missingPaths('`server/nowhere/<area>/x.ts`')).toEqual(['server/nowhere/<area>/x.ts'])
  })

  it('takes no alias, package or path outside the repository for one of ours', () => {
    expect(namedPaths('`#shared/utils/rules`, `#server/utils/db`, `@socket.io/postgres-adapter`, `../shared/STACK.md`, `~/entries`, /api/competitions/:id/board')).toEqual([])
    expect(namedPaths('`server/utils/db.ts`: `useDb`; see knexfile.ts.')).toEqual(['server/utils/db.ts', 'knexfile.ts'])
  })
})
