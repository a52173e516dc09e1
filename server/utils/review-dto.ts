/**
 * Review, comment, monitoring and audit models → the JSON the review routes answer with
 * (shared/schemas/review.ts). Routes never return a model.
 */
import type { AuditEvent, Comment, Decision, MonitoringObservation, Translocation, User } from '../db/models'
import type {
  AuditEventDto, CommentDto, DecisionDto, MovedAnimalDto, ObservationDto, ReviewPersonDto, TranslocationDto,
} from '#shared/schemas/review'

const iso = (date: Date | string | null | undefined): string => (date ? new Date(date).toISOString() : '')

/** `{ id, name }` of a user; a placeholder when the row is missing (never expected: FKs are NO ACTION). */
export function reviewPersonDto(user: Pick<User, 'id' | 'name'> | null | undefined, fallbackId = 0): ReviewPersonDto {
  return user ? { id: user.id, name: user.name } : { id: fallbackId, name: 'Unknown person' }
}

/** A decision with its decider (include `decider`). */
export function decisionDto(decision: Decision): DecisionDto {
  return {
    id: decision.id,
    proposalId: decision.proposalId,
    decision: decision.decision,
    comment: decision.comment,
    decidedBy: reviewPersonDto(decision.decider, decision.decidedBy),
    createdAt: iso(decision.createdAt),
  }
}

/**
 * A comment with its author (include `author`); mentioned ids are named from `people`
 * (ids not found there are left out).
 */
export function commentDto(comment: Comment, people: ReadonlyMap<number, ReviewPersonDto>): CommentDto {
  const mentions = (Array.isArray(comment.mentions) ? comment.mentions : [])
    .map(id => people.get(Number(id)))
    .filter((person): person is ReviewPersonDto => person !== undefined)
  return {
    id: comment.id,
    proposalId: comment.proposalId,
    body: comment.body,
    author: reviewPersonDto(comment.author, comment.authorId),
    mentions,
    createdAt: iso(comment.createdAt),
  }
}

/** A translocation with its source, recipient and recorder (include them). */
export function translocationDto(row: Translocation): TranslocationDto {
  const animals: MovedAnimalDto[] = (Array.isArray(row.animals) ? row.animals : []).map(animal => ({ id: String(animal.id), sex: animal.sex }))
  return {
    id: row.id,
    proposalId: row.proposalId,
    movedOn: String(row.movedOn),
    source: row.source ? { id: row.source.id, name: row.source.name } : null,
    sourceNote: row.sourceNote,
    recipient: row.recipient ? { id: row.recipient.id, name: row.recipient.name } : { id: row.recipientId, name: 'Unknown subpopulation' },
    animals,
    females: animals.filter(animal => animal.sex === 'female').length,
    males: animals.filter(animal => animal.sex === 'male').length,
    unknownSex: animals.filter(animal => animal.sex === 'unknown').length,
    notes: row.notes,
    recordedBy: reviewPersonDto(row.recorder, row.recordedBy),
    createdAt: iso(row.createdAt),
  }
}

/** A follow-up observation with its recorder (include `recorder`). */
export function observationDto(row: MonitoringObservation): ObservationDto {
  return {
    id: row.id,
    proposalId: row.proposalId,
    subpopulationId: row.subpopulationId,
    observedOn: String(row.observedOn),
    census: row.census ?? null,
    heterozygosity: row.heterozygosity ?? null,
    inbreeding: row.inbreeding ?? null,
    source: row.source,
    notes: row.notes,
    recordedBy: reviewPersonDto(row.recorder, row.recordedBy),
    createdAt: iso(row.createdAt),
  }
}

/** An audit event with its actor (include `actor` with id, name, email). */
export function auditEventDto(row: AuditEvent): AuditEventDto {
  return {
    id: row.id,
    action: row.action,
    entityType: row.entityType,
    entityId: row.entityId ?? null,
    actor: row.actor ? { id: row.actor.id, name: row.actor.name, email: row.actor.email } : null,
    before: row.before ?? null,
    after: row.after ?? null,
    createdAt: iso(row.createdAt),
  }
}
