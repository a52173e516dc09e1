/**
 * A redirect target taken from the query string, kept only when it is a path
 * inside this app ("/proposals?x=1"), never another site ("//evil.test",
 * "https://…") — an open redirect would let a crafted sign-in link send people
 * elsewhere after they enter their password.
 */
export function safeRedirect(value: unknown, fallback = '/'): string {
  const target = Array.isArray(value) ? value[0] : value
  if (typeof target !== 'string') return fallback
  if (!target.startsWith('/') || target.startsWith('//') || target.startsWith('/\\')) return fallback
  if (target.startsWith('/login')) return fallback
  return target
}
