/**
 * Model → JSON for the account and administration routes (shapes in shared/types/api.ts).
 * Handlers never return model instances: password hashes and internal columns stay here.
 */
import type { Agency, OutboxMessage, User } from '../db/models'
import type { AdminUserDto, AgencyProfileDto, OutboxMessageDto, SignedInUserDto, UserStatus } from '#shared/types/api'

const iso = (date: Date | null | undefined): string | null => (date ? new Date(date).toISOString() : null)

/** invited (no password yet) / active / deactivated. */
export function userStatus(user: Pick<User, 'passwordHash' | 'active'>): UserStatus {
  if (user.passwordHash === null) return 'invited'
  return user.active ? 'active' : 'deactivated'
}

export function signedInUserDto(user: Pick<User, 'id' | 'agencyId' | 'email' | 'name' | 'role'>): SignedInUserDto {
  return { id: user.id, agencyId: user.agencyId, email: user.email, name: user.name, role: user.role }
}

export function adminUserDto(user: User): AdminUserDto {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    status: userStatus(user),
    active: user.active,
    invitedAt: iso(user.invitedAt),
    lastSignInAt: iso(user.lastSignInAt),
    createdAt: iso(user.createdAt) ?? '',
    version: user.version,
  }
}

export function agencyProfileDto(agency: Agency): AgencyProfileDto {
  return {
    id: agency.id,
    name: agency.name,
    shortName: agency.shortName,
    address: agency.address,
    contactEmail: agency.contactEmail,
    phone: agency.phone,
    updatedAt: iso(agency.updatedAt) ?? '',
    version: agency.version,
  }
}

export function outboxMessageDto(message: OutboxMessage): OutboxMessageDto {
  return {
    id: message.id,
    to: message.toAddress,
    subject: message.subject,
    text: message.textBody,
    html: message.htmlBody,
    status: message.status,
    attempts: message.attempts,
    nextAttemptAt: iso(message.nextAttemptAt) ?? '',
    lastError: message.lastError,
    sentAt: iso(message.sentAt),
    createdAt: iso(message.createdAt) ?? '',
  }
}
