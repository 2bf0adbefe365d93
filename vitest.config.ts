import { defineConfig } from 'vitest/config'
import vue from '@vitejs/plugin-vue'

// Unit, store and component tests. Browser end-to-end tests have their own config (tests/e2e/).
export default defineConfig({
  plugins: [vue()],
  test: {
    include: ['tests/**/*.test.ts'],
    exclude: ['tests/e2e/**', 'node_modules/**'],
    environment: 'node',
    testTimeout: 60_000,
    pool: 'threads',
  },
})
