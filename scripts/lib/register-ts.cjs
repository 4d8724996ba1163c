// Lets plain Node 20 require the project's TypeScript sources (for the benchmarks and the source-run
// solver workers of jest): .ts files are compiled on load with @swc/core, the compiler jest already uses.
// The production server never uses this; Next bundles what it runs.
const { readFileSync } = require('node:fs');
const path = require('node:path');
const swc = require('@swc/core');

/** The repository root, for the `@/` alias of tsconfig.json (`@/x` is `src/x`). */
const ROOT = path.resolve(__dirname, '..', '..');

require.extensions['.ts'] = (module, filename) => {
  const { code } = swc.transformSync(readFileSync(filename, 'utf8'), {
    filename,
    jsc: { parser: { syntax: 'typescript' }, target: 'es2022', baseUrl: ROOT, paths: { '@/*': ['src/*'] } },
    module: { type: 'commonjs' },
  });
  module._compile(code, filename);
};
