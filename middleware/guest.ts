/**
 * Sign-in and password pages: someone already signed in goes straight on,
 * to ?redirect= when it is a local path, else to the Atlas.
 */
export default defineNuxtRouteMiddleware((to) => {
  const { loggedIn } = useUserSession()
  if (loggedIn.value) return navigateTo(safeRedirect(to.query.redirect))
})
