// @ts-check
import { fileURLToPath } from 'node:url'
import { createNodeResolver } from 'eslint-plugin-import-x'
import withNuxt from './.nuxt/eslint.config.mjs'

/** @param {string} path */
const here = path => fileURLToPath(new URL(path, import.meta.url))

export default withNuxt(
  {
    ignores: ['.output/**', '.data/**', 'artifacts/**'],
  },
  {
    // The server's modules import each other by name (#domain, #server, #shared): no import
    // cycle may form between them (DEVELOPERS.md, "Import directions").
    files: ['server/**/*.ts'],
    settings: {
      'import-x/extensions': ['.ts', '.mjs', '.js'],
      'import-x/resolver-next': [createNodeResolver({
        extensions: ['.ts', '.mjs', '.js', '.json'],
        alias: {
          '#domain': [here('./server/domain')],
          '#server': [here('./server')],
          '#shared': [here('./shared')],
        },
      })],
    },
    rules: {
      'import/no-cycle': 'error',
    },
  },
)
