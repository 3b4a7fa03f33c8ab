// The server's shape, as DEVELOPERS.md draws it: server/utils holds only the route kit (what
// Nitro auto-imports for the handlers); the domain lives in server/domain/<area>/ and imports
// what it uses by name, from areas below its own only; routes never touch the database
// themselves; shared/ stays free of Vue, Nitro and knex. (Import cycles: ESLint's
// import/no-cycle, eslint.config.mjs.)
import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join, relative, sep } from 'node:path'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'

const root = fileURLToPath(new URL('../../..', import.meta.url))

function filesUnder(dir: string): string[] {
  return readdirSync(join(root, dir)).sort().flatMap((name) => {
    const path = join(dir, name)
    return statSync(join(root, path)).isDirectory() ? filesUnder(path) : [path.split(sep).join('/')]
  })
}
const source = (path: string) => readFileSync(join(root, path), 'utf8')

/** The code of a file without its comments and quoted strings (template text stays). */
function code(path: string): string {
  return source(path)
    .replace(/\/\*[\s\S]*?\*\//g, ' ')
    .replace(/\/\/[^\n]*/g, ' ')
    .replace(/'(?:\\.|[^'\\\n])*'/g, '\'\'')
    .replace(/\.\.\./g, '   ') // a spread is not a property access: `...f(x)` calls f
}

/** Import specifiers of a file, with whether the import is of types only. */
function importsOf(path: string): { from: string, typeOnly: boolean, names: string[] }[] {
  return [...source(path).matchAll(/^import (type )?(?:(\w+)(?:, )?)?(?:\{([^}]*)\})? ?(?:from )?'([^']+)'/gm)].map(m => ({
    from: m[4]!,
    typeOnly: Boolean(m[1]),
    names: [m[2], ...(m[3] ?? '').split(',')].map(n => (n ?? '').trim().replace(/^type /, '').split(' as ').pop()!.trim()).filter(Boolean),
  }))
}

/** Every name a module exports, and whether it is a function or class (a value one calls). */
function exportsOf(path: string): Map<string, 'callable' | 'other'> {
  const out = new Map<string, 'callable' | 'other'>()
  const text = source(path)
  for (const m of text.matchAll(/^export (?:async )?(?:function|class) (\w+)/gm)) out.set(m[1]!, 'callable')
  for (const m of text.matchAll(/^export (?:const|let|interface|type) (\w+)/gm)) out.set(m[1]!, 'other')
  return out
}

// The domain's areas, lowest first: an area may import the areas of lower layers, never its
// own layer's other areas nor a higher one.
const LAYERS: readonly (readonly string[])[] = [
  ['read-model'],
  ['audit', 'realtime', 'findings'],
  ['mail', 'fees'],
  ['board'],
  ['competitions'],
  ['people'],
  ['grid', 'entries', 'files', 'payments', 'tags'],
  ['reports', 'account'],
]
const layerOf = (area: string) => LAYERS.findIndex(l => l.includes(area))

const ROUTE_KIT = ['authz.ts', 'client-address.ts', 'compression.ts', 'csv-upload.ts', 'db.ts', 'errors.ts', 'same-origin.ts', 'server-timing.ts', 'site-url.ts', 'uploads.ts', 'validation.ts']

const domainFiles = filesUnder('server/domain')
const kitFiles = filesUnder('server/utils')
const routeFiles = filesUnder('server/api')
const areaOf = (path: string) => path.split('/')[2]!

describe('server/utils', () => {
  it('holds the route kit and nothing else', () => {
    expect(kitFiles.map(f => f.slice('server/utils/'.length))).toEqual(ROUTE_KIT)
  })

  it('imports no domain module, but for the access helper reading people, entries and files', () => {
    for (const file of kitFiles) {
      const domain = importsOf(file).filter(i => i.from.startsWith('#domain/') && !i.typeOnly).map(i => i.from)
      if (file === 'server/utils/authz.ts') expect(domain.every(d => /^#domain\/(people|entries|files)\//.test(d))).toBe(true)
      else expect(domain, file).toEqual([])
    }
  })
})

describe('server/domain', () => {
  it('has one folder per area, each in a layer', () => {
    const areas = [...new Set(domainFiles.map(areaOf))].sort()
    expect(areas).toEqual(LAYERS.flat().sort())
  })

  it('imports areas of lower layers only', () => {
    const upward: string[] = []
    for (const file of domainFiles) {
      for (const { from } of importsOf(file)) {
        const m = /^#domain\/([^/]+)\//.exec(from)
        if (!m || m[1] === areaOf(file)) continue
        if (layerOf(m[1]!) >= layerOf(areaOf(file))) upward.push(`${file} → ${from}`)
      }
    }
    expect(upward).toEqual([])
  })

  it('reaches its own area by relative paths and every other module through an alias', () => {
    const wrong: string[] = []
    for (const file of domainFiles) {
      for (const { from } of importsOf(file)) {
        if (from.startsWith('../')) wrong.push(`${file} → ${from}`)
      }
    }
    expect(wrong).toEqual([])
  })

  it('calls no function of the route kit or another domain module it does not import', () => {
    const exported = new Map<string, string>()
    for (const file of [...kitFiles, ...domainFiles]) {
      for (const [name, kind] of exportsOf(file)) if (kind === 'callable') exported.set(name, file)
    }
    const missing: string[] = []
    for (const file of domainFiles) {
      const imported = new Set(importsOf(file).flatMap(i => i.names))
      const text = code(file)
      const own = exportsOf(file)
      const declared = new Set([...text.matchAll(/\b(?:function|const|let|class)\s+(\w+)/g)].map(m => m[1]!))
      for (const m of text.matchAll(/(?<![\w.$])(?:new\s+)?([A-Za-z_]\w*)\s*\(/g)) {
        const name = m[1]!
        const from = exported.get(name)
        if (from && from !== file && !imported.has(name) && !own.has(name) && !declared.has(name)) missing.push(`${file}: ${name} (${from})`)
      }
    }
    expect([...new Set(missing)]).toEqual([])
  })
})

describe('server/api', () => {
  it('routes never touch the database themselves', () => {
    const touching = routeFiles.filter(f => /\buseDb\s*\(|\btrx\b|\.raw\s*\(|from 'knex'/.test(code(f)))
    expect(touching).toEqual([])
  })

  it('routes import the domain by name, never a domain file by a relative path', () => {
    const relativeImports = routeFiles.filter(f => importsOf(f).some(i => /server\/domain|\.\.\/.*domain/.test(i.from)))
    expect(relativeImports).toEqual([])
  })
})

describe('shared/', () => {
  it('imports neither Vue, Nitro, h3 nor knex, nor anything of the server', () => {
    const offending: string[] = []
    for (const file of filesUnder('shared')) {
      for (const { from } of importsOf(file)) {
        if (/^(vue|pinia|nitropack|h3|knex|pg|#imports|#app|#server|#domain|nuxt)(\/|$)/.test(from) || from.includes('server/')) {
          offending.push(`${file} → ${from}`)
        }
      }
    }
    expect(offending).toEqual([])
  })
})

describe('this test', () => {
  it('finds the route kit’s and the domain’s modules where it looks', () => {
    expect(domainFiles.length).toBeGreaterThan(30)
    expect(relative(root, join(root, 'server/domain/board/dossier-changed.ts'))).toBe(['server', 'domain', 'board', 'dossier-changed.ts'].join(sep))
    expect(domainFiles).toContain('server/domain/board/dossier-changed.ts')
    expect(exportsOf('server/domain/board/dossier-changed.ts').get('dossierChanged')).toBe('callable')
    expect(importsOf('server/domain/board/dossier-changed.ts').map(i => i.from)).toContain('./transaction')
  })
})
