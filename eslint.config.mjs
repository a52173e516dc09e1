// @ts-check
import withNuxt from './.nuxt/eslint.config.mjs'

// Node 20 lacks Object.groupBy (Node 21+), which the flat-config composer calls when the config is resolved.
if (typeof Object.groupBy !== 'function') {
  Object.defineProperty(Object, 'groupBy', {
    /** @param {Iterable<unknown>} items @param {(item: unknown, index: number) => PropertyKey} keyOf */
    value: (items, keyOf) => {
      /** @type {Record<PropertyKey, unknown[]>} */
      const groups = Object.create(null)
      let index = 0
      for (const item of items) (groups[keyOf(item, index++)] ??= []).push(item)
      return groups
    },
  })
}

export default withNuxt(
  {
    // kernels/ is AssemblyScript (compiled by scripts/build-kernels.mjs), not TypeScript.
    ignores: ['.output/**', '.nuxt/**', 'node_modules/**', 'coverage/**', 'tests/fixtures/**/*.py', 'kernels/**'],
  },
  {
    files: ['shared/**/*.ts'],
    rules: {
      // The shared folder runs in the browser and the server: keep it free of framework and I/O imports.
      'no-restricted-imports': ['error', { paths: ['vue', '#imports', 'h3', 'sequelize', 'leaflet', 'pdfmake', 'pg'] }],
    },
  },
)
