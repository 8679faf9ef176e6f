/**
 * Watches every API answer in the tab: a 503 for the database raises the
 * banner (components/app/DatabaseAway.vue), any other answer from the API
 * lowers it. Wrapping the global $fetch covers useFetch and actions alike.
 */
export default defineNuxtPlugin(() => {
  const away = useDatabaseAway()
  const base = globalThis.$fetch
  globalThis.$fetch = base.create({
    onResponse({ request, response }) {
      const url = typeof request === 'string' ? request : request instanceof Request ? request.url : String(request)
      if (!url.includes('/api/')) return
      if (isDatabaseAway(response.status, response._data)) away.value = true
      else if (response.status < 500) away.value = false
    },
  }) as typeof globalThis.$fetch
})
