import type { ShopAction } from '~~/shared/utils/permissions'

declare module '#app' {
  interface PageMeta {
    /** Pages open without a session (the sign-in page). */
    public?: boolean
    /** An action the role must be allowed, or the page is not offered. */
    requires?: ShopAction
  }
}

export default defineNuxtRouteMiddleware((to) => {
  const { loggedIn, session } = useUserSession()
  if (to.meta.public) {
    if (loggedIn.value && to.path === '/login') return navigateTo('/')
    return
  }
  if (!loggedIn.value) {
    return navigateTo({ path: '/login', query: to.fullPath !== '/' ? { next: to.fullPath } : {} })
  }
  if (to.meta.requires && !can(session.value?.role, to.meta.requires)) {
    return abortNavigation(createError({ statusCode: 403, statusMessage: 'Your role may not open this page' }))
  }
})
