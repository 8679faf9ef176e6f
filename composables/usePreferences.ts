import type { Preferences } from '~~/shared/utils/preferences'
import { formatLength as format, parseLength } from '~~/geometry/core'

interface Me { userId: string; name: string; role: ShopRole; preferences: Preferences }

/** The signed-in person's preferences, with setters that are saved on the server. */
export function usePreferences() {
  // The page and its panels each ask; 'defer' shares the request in flight instead of cancelling it.
  const { data, refresh } = useFetch<Me>('/api/me', { key: 'me', dedupe: 'defer' })
  const prefs = computed<Preferences>(() => data.value?.preferences ?? readPreferences({}))
  const units = computed(() => prefs.value.units)

  async function save(patch: Partial<Omit<Preferences, 'export'>> & { export?: Partial<Preferences['export']> }) {
    const next = await $fetch<Preferences>('/api/me/preferences', { method: 'PATCH', body: patch })
    if (data.value) data.value = { ...data.value, preferences: next }
    else await refresh()
  }

  function formatLength(mm: number): string {
    return format(mm, units.value, { denominator: prefs.value.fraction })
  }

  function parse(text: string) {
    return parseLength(text, { defaultUnit: units.value })
  }

  return { prefs, units, save, formatLength, parse }
}
