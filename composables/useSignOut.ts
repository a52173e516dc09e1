/**
 * Sign out: end the session on the server, forget the local copy and the
 * cached user, then show the sign-in page with a short confirmation.
 */
export function useSignOut() {
  const session = useUserSession()
  const signingOut = ref(false)

  async function signOut(): Promise<void> {
    if (signingOut.value) return
    signingOut.value = true
    try {
      await $fetch('/api/auth/logout', { method: 'POST' }).catch(() => undefined)
      await session.clear().catch(() => undefined)
      clearNuxtData('current-user')
      await navigateTo({ path: '/login', query: { signedOut: '1' } })
    } finally {
      signingOut.value = false
    }
  }

  return { signOut, signingOut }
}
