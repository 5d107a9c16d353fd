import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';

export default defineConfig({
  plugins: [react()],
  server: {
    port: 5173,
    proxy: { '/api': 'http://127.0.0.1:3000', '/socket.io': { target: 'ws://127.0.0.1:3000', ws: true } },
  },
  build: {
    outDir: 'dist',
    sourcemap: false,
    chunkSizeWarningLimit: 900,
    rollupOptions: {
      output: {
        // Only what every page needs goes into 'vendor'; the rest (charts, dates, dropzone...) is left to the
        // bundler, which puts it beside the lazy pages that use it. A named chunk also takes in the modules it
        // imports: a 'charts' chunk took React and Mantine with it, and the sign-in page then loaded the charts.
        manualChunks(id: string) {
          return /node_modules\/(react|react-dom|scheduler|react-router|react-router-dom|@mantine\/core|@mantine\/hooks)\//.test(id)
            ? 'vendor'
            : undefined;
        },
      },
    },
  },
  test: {
    environment: 'jsdom',
    globals: true,
    setupFiles: ['./src/test-utils/setup.ts'],
    include: ['src/**/*.test.{ts,tsx}'],
    css: false,
  },
});
