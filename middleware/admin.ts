/**
 * Administration pages: signed-in administrators only. Without a session →
 * sign-in page; another role → a 403 page that says why. This only hides
 * pages; every /api/admin route checks the role itself.
 */
export default defineNuxtRouteMiddleware((to) => {
  const { loggedIn, user } = useUserSession()
  if (!loggedIn.value) {
    return navigateTo({ path: '/login', query: { redirect: to.fullPath } })
  }
  if (!canSeeAdministration(user.value?.role)) {
    return abortNavigation(createError({
      status: 403,
      statusText: 'Administrators only',
      message: 'Administration is open to administrators of your agency. Ask one of them if you need a change to users or the agency profile.',
    }))
  }
})
