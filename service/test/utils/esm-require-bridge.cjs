// Jest transform for the one CommonJS NestJS package the service uses (@nestjs/throttler).
//
// Node 20 lets CommonJS require() an ES module, but Jest's module runtime only does so on Node 24.9+,
// so under Jest `require("@nestjs/common")` inside @nestjs/throttler fails ("Must use import to load
// ES Module"). This transform points those require() calls at the very ES module instances the app
// itself imported (test/utils/esm-bridge.setup.ts puts them on globalThis before each test file), so
// decorators, Reflector and class identity stay shared. Tests only; the built service is unaffected.
const { createHash } = require('node:crypto');

const BRIDGED = /require\("(@nestjs\/(?:common|core))"\)/g;
const KEY = '__crankjournalEsmBridge';

module.exports = {
  process(sourceText) {
    if (!BRIDGED.test(sourceText)) return { code: sourceText };
    BRIDGED.lastIndex = 0;
    const prelude =
      `const __esmBridge = (name) => { const m = globalThis.${KEY} && globalThis.${KEY}[name]; ` +
      `if (!m) throw new Error('ES module ' + name + ' is not bridged: the Jest project must list test/utils/esm-bridge.setup.ts in setupFiles'); return m; };`;
    const body = sourceText.replace(BRIDGED, (_, name) => `__esmBridge(${JSON.stringify(name)})`);
    // The prelude goes on the first line (after a "use strict" directive), so line numbers stay right.
    const strict = body.match(/^\s*(["'])use strict\1;?/);
    return { code: strict ? strict[0] + prelude + body.slice(strict[0].length) : prelude + body };
  },
  getCacheKey(sourceText, sourcePath) {
    return createHash('sha256').update('esm-require-bridge-v1\0').update(sourcePath).update('\0').update(sourceText).digest('hex');
  },
};
