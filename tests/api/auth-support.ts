/**
 * Helpers for the sign-in and administration API tests: reading links from captured e-mail,
 * a second agency in the test database, and the shape every error answer must have.
 */
import { expect } from 'vitest'
import { hashPasswordScrypt } from '../../server/db/password'
import type { ApiResponse } from '../support/client'
import { eventually, type CapturedMail, type TestServer } from '../support/server'

/** Waits for the newest e-mail to `address` whose link has `path`, and returns its token. */
export async function tokenFromMail(server: TestServer, address: string, path: '/accept-invite' | '/reset-password', after = 0): Promise<{ token: string, mail: CapturedMail }> {
  return eventually(async () => {
    const messages = await server.mail.messages()
    const matching = messages.filter((m) => {
      const to = Array.isArray(m.to) ? m.to : [m.to]
      return to.includes(address.toLowerCase()) && m.text.includes(path) && Number(m.id) > after
    })
    const mail = matching[matching.length - 1]
    const token = mail?.text.match(new RegExp(`${path}\\?token=([A-Za-z0-9_-]+)`))?.[1]
    return mail && token ? { token, mail } : undefined
  })
}

/** Highest id of the messages captured so far (to wait for newer ones). */
export async function lastMailId(server: TestServer): Promise<number> {
  const messages = await server.mail.messages()
  return messages.reduce((max, m) => Math.max(max, Number(m.id)), 0)
}

/** Every error answer: the status, a sentence in `message`, nothing internal. */
export function expectErrorAnswer(response: ApiResponse, status: number, message?: RegExp): void {
  expect(response.status, JSON.stringify(response.body)).toBe(status)
  expect(response.headers.get('content-type')).toMatch(/application\/json/)
  expect(typeof response.body?.message).toBe('string')
  expect(response.body.message.length).toBeGreaterThan(5)
  expect(JSON.stringify(response.body)).not.toMatch(/stack|at .*\.m?js:\d+|Sequelize|node_modules/)
  if (message) expect(response.body.message).toMatch(message)
}

export const otherAgencyPassword = 'granite-ridge-otter-9'

/**
 * Creates a second agency with an administrator and a biologist directly in the test database.
 *
 * @returns their ids and addresses
 */
export async function createOtherAgency(server: TestServer): Promise<{ agencyId: number, adminEmail: string, biologistEmail: string, biologistId: number }> {
  const hash = await hashPasswordScrypt(otherAgencyPassword)
  const agency = await server.db.query<{ id: number }>(
    `INSERT INTO agencies (name, short_name, address) VALUES ('Western Basin Fish Office (invented)', 'WBFO', '') RETURNING id`,
  )
  const agencyId = agency.rows[0]!.id // the INSERT returns exactly one row
  const adminEmail = 'admin@west.tributary.test'
  const biologistEmail = 'biologist@west.tributary.test'
  await server.db.query(
    `INSERT INTO users (agency_id, email, name, role, password_hash, active) VALUES ($1, $2, 'Wren Castellano', 'administrator', $3, true)`,
    [agencyId, adminEmail, hash],
  )
  const biologist = await server.db.query<{ id: number }>(
    `INSERT INTO users (agency_id, email, name, role, password_hash, active) VALUES ($1, $2, 'Tomas Reyes', 'biologist', $3, true) RETURNING id`,
    [agencyId, biologistEmail, hash],
  )
  return { agencyId, adminEmail, biologistEmail, biologistId: biologist.rows[0]!.id } // one row returned
}

/** Id of a user by address. */
export async function userId(server: TestServer, email: string): Promise<number> {
  const result = await server.db.query<{ id: number }>('SELECT id FROM users WHERE email = $1', [email])
  const row = result.rows[0]
  if (!row) throw new Error(`no user ${email}`)
  return row.id
}
