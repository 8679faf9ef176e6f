import { defineConfig } from 'vitest/config'
import { defineVitestProject } from '@nuxt/test-utils/config'

// Three projects, run in this order by scripts/test.sh:
//  unit  - pure geometry and services, plain Node
//  nuxt  - components and stores in the Nuxt environment (happy-dom)
//  e2e   - the built server against the real PostgreSQL, and Chromium
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
          setupFiles: ['tests/unit/fast-check.setup.ts'],
          // A shared 2-core machine under load runs the property tests several times slower.
          testTimeout: 30_000,
        },
      },
      await defineVitestProject({
        test: {
          name: 'nuxt',
          include: ['tests/nuxt/**/*.test.ts'],
          environment: 'nuxt',
          // Booting the Nuxt environment cold took over the 10 s default under load.
          hookTimeout: 60_000,
          // The first mount starts the whole Nuxt app: seconds on a busy 2-core machine.
          testTimeout: 30_000,
        },
      }),
      {
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/e2e/global-setup.ts'],
          fileParallelism: false,
          // expect.poll waits for a state with a deadline; its 1 s default is shorter than one
          // page update takes on a 2-core machine under load, so the e2e deadline is 15 s.
          expect: { poll: { timeout: 15_000 } },
          testTimeout: 60_000,
          hookTimeout: 180_000,
        },
      },
    ],
  },
})
