/**
 * Minimal stand-ins for the Nitro auto-imports that server/utils call, so their pure logic can
 * be unit-tested without a server. `createError` mimics h3's shape (statusCode, message, data).
 */
import { vi } from 'vitest'

export interface FakeHttpError extends Error { statusCode: number, data?: unknown }

export function fakeCreateError(input: { status?: number, statusCode?: number, message?: string, data?: unknown }): FakeHttpError {
  const error = new Error(input.message ?? '') as FakeHttpError
  error.statusCode = input.status ?? input.statusCode ?? 500
  error.data = input.data
  return error
}

/** Installs the stand-ins as globals (call in beforeAll/at top of a test file). */
export function stubNitroGlobals(extra: Record<string, unknown> = {}): void {
  vi.stubGlobal('createError', fakeCreateError)
  for (const [name, value] of Object.entries(extra)) vi.stubGlobal(name, value)
}
