import type { Page } from 'playwright-core'
import { inject } from 'vitest'

/**
 * Signs in through the form as a person would, then lets the home page's own
 * requests and link prefetches finish: leaving it mid-way aborts them, which
 * the page watcher (`watchPage`) rightly counts as failures.
 */
export async function signInThroughForm(page: Page, email: string, password = 'rootplate-demo'): Promise<void> {
  const base = inject('baseUrl')
  await page.goto(`${base}/login`)
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL(`${base}/`)
  await page.waitForLoadState('networkidle')
}
