/**
 * Pages for signed-in people only: without a session, go to the sign-in page
 * and come back afterwards (?redirect=). The server checks every request too.
 */
export default defineNuxtRouteMiddleware((to) => {
  const { loggedIn } = useUserSession()
  if (!loggedIn.value) {
    return navigateTo({ path: '/login', query: to.fullPath === '/' ? {} : { redirect: to.fullPath } })
  }
})
