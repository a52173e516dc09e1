/**
 * Attachments of subpopulation records (permits, reports, photos): the upload rules built from
 * the allow-list in shared/schemas/attachments.ts (name ending and first bytes must agree), the
 * agency-scoped look-ups, who may delete, and the DTO. The files themselves live in object
 * storage (server/utils/storage.ts); the routes are under server/api/subpopulations/[id]/ and
 * server/api/attachments/.
 */
import type { Transaction } from 'sequelize'
import { ATTACHMENT_MAX_BYTES, ATTACHMENT_TYPES, type AttachmentDto } from '#shared/schemas/attachments'
import type { Attachment, Subpopulation, User } from '../db/models'
import type { CurrentUser } from './auth'
import type { UploadRequest, UploadTypeRule } from './uploads'

/** Roles that may attach files. */
export const ATTACHMENT_UPLOAD_ROLES = ['biologist', 'manager', 'administrator'] as const

/** Whether `role` may attach files (for the `canUpload` flag of the list). */
export function mayAttachFiles(role: CurrentUser['role']): boolean {
  return (ATTACHMENT_UPLOAD_ROLES as readonly string[]).includes(role)
}

function signatureCheckFor(extension: string): (head: Buffer) => boolean {
  switch (extension) {
    case '.pdf': return fileSignatureChecks.pdf
    case '.png': return fileSignatureChecks.png
    case '.jpg':
    case '.jpeg': return fileSignatureChecks.jpeg
    case '.docx':
    case '.xlsx': return fileSignatureChecks.zip
    default: return fileSignatureChecks.text
  }
}

/** The allow-list as upload rules. */
export const ATTACHMENT_UPLOAD_TYPES: readonly UploadTypeRule[] = ATTACHMENT_TYPES.map(type => ({
  ...type,
  sniff: signatureCheckFor(type.extension),
}))

/** An attachment row, with its uploader when the query included `uploader`. */
export type AttachmentRow = Attachment & { uploader?: Pick<User, 'id' | 'name'> | null }

/** The uploader or an administrator may delete an attachment (viewers never). */
export function mayDeleteAttachment(user: CurrentUser, attachment: Pick<Attachment, 'uploadedBy'>): boolean {
  return user.role === 'administrator' || (user.role !== 'viewer' && attachment.uploadedBy === user.id)
}

/** The attachment `id` of the user's agency (with its uploader); 404 otherwise. */
export async function requireAgencyAttachment(user: CurrentUser, id: number, transaction?: Transaction): Promise<AttachmentRow> {
  const { models } = await useDb()
  const row = await models.Attachment.findOne({
    where: { id, agencyId: user.agencyId },
    include: [{ model: models.User, as: 'uploader', required: false, attributes: ['id', 'name'] }],
    transaction,
  })
  if (!row) throw notFound('Attachment')
  return row
}

/** The list form of an attachment. */
export function attachmentDto(row: AttachmentRow, user: CurrentUser): AttachmentDto {
  const type = ATTACHMENT_TYPES.find(entry => entry.contentType === row.contentType)
  return {
    id: row.id,
    ownerType: 'subpopulation',
    ownerId: row.ownerId,
    fileName: row.fileName,
    contentType: row.contentType,
    typeLabel: type?.label ?? 'File',
    sizeBytes: row.sizeBytes,
    checksumSha256: row.checksumSha256,
    uploadedBy: row.uploader ? { id: row.uploader.id, name: row.uploader.name } : null,
    createdAt: row.createdAt.toISOString(),
    canDelete: mayDeleteAttachment(user, row),
  }
}

/** What the audit log keeps of an attachment. */
export function attachmentAuditSnapshot(row: Attachment): Record<string, unknown> {
  return {
    id: row.id, ownerType: row.ownerType, ownerId: row.ownerId, fileName: row.fileName, contentType: row.contentType,
    sizeBytes: row.sizeBytes, checksumSha256: row.checksumSha256, storageKey: row.storageKey, uploadedBy: row.uploadedBy ?? null,
  }
}

/**
 * Streams one file to object storage and records it, all or nothing (the object is removed
 * when the record cannot be written).
 *
 * @throws 413 over ATTACHMENT_MAX_BYTES, 415 for a type off the allow-list, 422 without a
 *   file, 503 when storage is down
 */
export async function createSubpopulationAttachment(request: UploadRequest, user: CurrentUser, subpopulation: Subpopulation): Promise<AttachmentRow> {
  const key = objectKey('attachments', user.agencyId, subpopulation.id, '')
  const upload = await receiveUploadIntoStorage(request, key, { maxFileBytes: ATTACHMENT_MAX_BYTES, types: ATTACHMENT_UPLOAD_TYPES, fieldNames: [] })
  try {
    const { sequelize, models } = await useDb()
    return await sequelize.transaction(async (transaction) => {
      const created = await models.Attachment.create({
        agencyId: user.agencyId,
        ownerType: 'subpopulation',
        ownerId: subpopulation.id,
        storageKey: key,
        fileName: upload.file.fileName,
        contentType: upload.file.contentType,
        sizeBytes: upload.file.sizeBytes,
        checksumSha256: upload.file.sha256,
        uploadedBy: user.id,
      }, { transaction })
      await recordAudit(transaction, {
        agencyId: user.agencyId, actorId: user.id, action: 'attachment.upload',
        entityType: 'attachment', entityId: created.id, before: null, after: attachmentAuditSnapshot(created),
      })
      return requireAgencyAttachment(user, created.id, transaction)
    })
  } catch (error) {
    await discardStoredObject(key)
    throw error
  }
}

/** Deletes an attachment record (uploader or administrator, else 403) with its audit row, then its file. */
export async function deleteAttachment(user: CurrentUser, id: number): Promise<void> {
  const { sequelize, models } = await useDb()
  const key = await sequelize.transaction(async (transaction) => {
    const row = await requireAgencyAttachment(user, id, transaction)
    if (!mayDeleteAttachment(user, row)) throw forbidden('Only the person who attached this file, or an administrator, can delete it.')
    const removed = await models.Attachment.destroy({ where: { id: row.id, agencyId: user.agencyId }, transaction })
    if (removed === 0) throw notFound('Attachment')
    await recordAudit(transaction, {
      agencyId: user.agencyId, actorId: user.id, action: 'attachment.delete',
      entityType: 'attachment', entityId: row.id, before: attachmentAuditSnapshot(row), after: null,
    })
    return row.storageKey
  })
  await discardStoredObject(key)
}
