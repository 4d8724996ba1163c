// Lets plain Node 20 require the project's TypeScript sources (for the benchmarks and the source-run
// solver workers of jest): .ts files are compiled on load with @swc/core, the compiler jest already uses.
// The production server never uses this; Next bundles what it runs.
const { readFileSync } = require('node:fs');
const swc = require('@swc/core');

require.extensions['.ts'] = (module, filename) => {
  const { code } = swc.transformSync(readFileSync(filename, 'utf8'), {
    filename,
    jsc: { parser: { syntax: 'typescript' }, target: 'es2022' },
    module: { type: 'commonjs' },
  });
  module._compile(code, filename);
};
