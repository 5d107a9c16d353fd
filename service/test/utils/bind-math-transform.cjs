/**
 * Jest runs each module inside a vm context, where every look-up of a global name goes through the context's
 * interceptor: `Math.min` in a hot loop costs about sixty times what it does in plain Node. The image code the
 * unit tests run (the card tracer, the test cards' drawing, d3's blur and contours, the JPEG codec) looks up Math
 * millions of times per card, which made the tracer's accuracy spec take minutes. These transforms bind Math once
 * per module, on the module's first line (so line numbers stay), and change nothing else: one for plain
 * JavaScript (`module.exports`), one for TypeScript that wraps ts-jest (`typescript`).
 */
const { createHash } = require('node:crypto');
const { TsJestTransformer } = require('ts-jest');

const BIND = 'const Math = globalThis.Math;';

/** The code with Math bound, after a 'use strict' directive (which must stay the first statement). */
function bind(code) {
  const directive = /^\s*(['"])use strict\1;?/.exec(code);
  const at = directive ? directive[0].length : 0;
  return code.slice(0, at) + BIND + code.slice(at);
}

class BindMathTsTransformer extends TsJestTransformer {
  process(sourceText, sourcePath, options) {
    const out = super.process(sourceText, sourcePath, options);
    return { ...out, code: bind(out.code) };
  }
  async processAsync(sourceText, sourcePath, options) {
    const out = await super.processAsync(sourceText, sourcePath, options);
    return { ...out, code: bind(out.code) };
  }
  getCacheKey(sourceText, sourcePath, options) {
    return `${super.getCacheKey(sourceText, sourcePath, options)}-bind-math`;
  }
  async getCacheKeyAsync(sourceText, sourcePath, options) {
    return `${await super.getCacheKeyAsync(sourceText, sourcePath, options)}-bind-math`;
  }
}

module.exports = {
  process(sourceText) {
    return { code: bind(sourceText) };
  },
  getCacheKey(sourceText, sourcePath) {
    return createHash('sha1').update(BIND).update(sourcePath).update(sourceText).digest('hex');
  },
  typescript: { createTransformer: (config) => new BindMathTsTransformer(config) },
};
