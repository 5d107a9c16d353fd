// Runs before every API test file: the app's own instances of @nestjs/common and @nestjs/core, for the one
// CommonJS package that require()s them (see esm-require-bridge.cjs), so a test file may import a service at its
// top, before the app has started.
const bridge = globalThis as { __crankjournalEsmBridge?: Record<string, unknown> };
bridge.__crankjournalEsmBridge ??= {
  '@nestjs/common': await import('@nestjs/common'),
  '@nestjs/core': await import('@nestjs/core'),
};

export {};
