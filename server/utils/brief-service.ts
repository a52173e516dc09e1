/**
 * The brief, end to end on the server:
 *
 *   const data = await loadBriefData(proposalId, agencyId)            // records → BriefData
 *   const pdf = await renderDraftBrief(proposalId, agencyId)           // preview, unsigned
 *   const issued = await issueSignedBrief(transaction, proposalId, { actorId })  // on approval
 *
 * `issueSignedBrief` is what the review work calls inside the transaction that approves a
 * proposal: it builds the brief from the records as they stand in that transaction, signs it
 * with the agency's certificate (made on the spot if the agency has none yet), stores the signed
 * file unchanged in `issued_briefs` with its SHA-256, writes the audit event and queues an
 * e-mail to the author with the PDF attached. All of it commits or rolls back with the decision.
 * Calling it again for a proposal that already has an issued brief returns that brief.
 */
import { createHash, randomUUID } from 'node:crypto'
import { Op, QueryTypes, type Transaction } from 'sequelize'
import type { Geometry } from 'geojson'
import { assembleBriefData, type BriefRecords, type SubpopulationRecord } from '../brief/assemble'
import { buildBriefDocument } from '../brief/document'
import { ensureBriefFonts } from '../brief/fonts'
import { renderPdf } from '../brief/render'
import type { BriefAgency, BriefData, BriefPerson } from '../brief/types'
import type { ScenarioInputsLike } from '#shared/proposals/types'
import type { ProposalSubpopulationDto } from '#shared/schemas/proposal'
import { ensureAgencyCredential, signingPassphrase } from './certificates'
import { loadProposalSubpopulations } from './proposal-subpopulations'
import { signPdf } from './signing'

/** What `issueSignedBrief` returns. */
export interface IssuedBriefSummary {
  id: number
  documentId: string
  sha256: string
  sizeBytes: number
  signerSubject: string
  signedAt: Date
  /** False when the proposal already had an issued brief and that one is returned. */
  created: boolean
}

/** The fonts of the built server (Nitro server assets), written once to a temporary folder. */
export function briefFonts() {
  return ensureBriefFonts(async (name) => {
    const raw = await useStorage('assets:server').getItemRaw(`fonts:${name}`)
    if (!raw) throw new Error(`Font ${name} is missing from the server assets.`)
    return Buffer.from(raw as Uint8Array)
  })
}

/** Public address of the verify page (runtimeConfig.appUrl + /verify). */
export function verifyPageUrl(): string {
  const base = String(useRuntimeConfig().appUrl ?? 'http://localhost:3000').replace(/\/+$/, '')
  return `${base}/verify`
}

/** File name of a brief download, e.g. 'EUWS-P-12-brief.pdf'. */
export function briefFileName(agencyShortName: string, proposalId: number, draft: boolean): string {
  const stem = `${agencyShortName}-P-${proposalId}`.replace(/[^A-Za-z0-9-]+/g, '-')
  return `${stem}-brief${draft ? '-draft' : ''}.pdf`
}

function recordOf(dto: ProposalSubpopulationDto, geometry: Geometry | null): SubpopulationRecord {
  return {
    id: dto.id,
    name: dto.name,
    geometry,
    centroid: dto.centroid ? [dto.centroid.lon, dto.centroid.lat] : null,
    areaKm2: dto.areaKm2,
    latestCensus: dto.latestCensus,
    workingNe: dto.workingNe,
    workingNeNote: dto.workingNeNote || null,
    generationTimeYears: dto.generationTimeYears,
    yearsIsolated: dto.yearsIsolated,
    environmentClass: dto.environmentClass,
  }
}

async function agencyLetterhead(agencyId: number, transaction?: Transaction): Promise<BriefAgency> {
  const { sequelize, models } = await useDb()
  const agency = await models.Agency.findByPk(agencyId, { transaction })
  if (!agency) throw notFound('Agency')
  const logos = await sequelize.query<{ content_type: 'image/png' | 'image/jpeg', bytes: Buffer }>(
    'SELECT content_type, bytes FROM agency_logos WHERE agency_id = :agencyId',
    { replacements: { agencyId }, type: QueryTypes.SELECT, transaction },
  )
  const logo = logos[0]
  return {
    name: agency.name,
    shortName: agency.shortName,
    address: agency.address,
    contactEmail: agency.contactEmail ?? null,
    phone: agency.phone ?? null,
    logo: logo ? { contentType: logo.content_type, base64: Buffer.from(logo.bytes).toString('base64') } : null,
  }
}

/**
 * Everything the brief of a proposal shows.
 *
 * @param proposalId - the proposal
 * @param agencyId - the caller's agency (another agency's proposal answers 404)
 * @param options.transaction - read inside this transaction (approval)
 * @param options.documentId - the ID to print (default: a new UUID)
 * @param options.issuedAt - the date to print (default: now)
 */
export async function loadBriefData(proposalId: number, agencyId: number, options: { transaction?: Transaction, documentId?: string, issuedAt?: Date } = {}): Promise<BriefData> {
  const { transaction } = options
  const { models } = await useDb()
  const proposal = await models.Proposal.findOne({ where: { id: proposalId, agencyId }, transaction })
  if (!proposal) throw notFound('Proposal')

  const sourceIds = proposal.sourceSubpopulationIds ?? []
  const dtos = await loadProposalSubpopulations(agencyId, [proposal.recipientId, ...sourceIds], transaction)
  const recipientDto = dtos.get(proposal.recipientId)
  if (!recipientDto) throw notFound('Subpopulation')
  const speciesRow = await models.Species.findOne({ where: { id: recipientDto.speciesId, agencyId }, transaction })
  const shapes = await models.Subpopulation.findAll({
    where: { agencyId, speciesId: recipientDto.speciesId },
    attributes: ['id', 'name', 'geometry', 'centroidLon', 'centroidLat', 'areaKm2', 'generationTimeYears', 'yearsIsolated', 'environmentClass'],
    order: [['id', 'ASC']],
    transaction,
  })
  const geometryOf = (id: number) => (shapes.find(row => row.id === id)?.geometry as Geometry | null | undefined) ?? null
  const involved = new Set([proposal.recipientId, ...sourceIds])
  const others: SubpopulationRecord[] = shapes.filter(row => !involved.has(row.id)).map(row => ({
    id: row.id,
    name: row.name,
    geometry: (row.geometry as Geometry | null) ?? null,
    centroid: row.centroidLon !== null && row.centroidLon !== undefined && row.centroidLat !== null && row.centroidLat !== undefined ? [row.centroidLon, row.centroidLat] : null,
    areaKm2: row.areaKm2 ?? null,
    latestCensus: null,
    workingNe: null,
    workingNeNote: null,
    generationTimeYears: row.generationTimeYears,
    yearsIsolated: row.yearsIsolated ?? null,
    environmentClass: row.environmentClass ?? null,
  }))

  const scenarios = await models.Scenario.findAll({ where: { proposalId }, order: [['isBaseline', 'DESC'], ['id', 'ASC']], transaction })
  const decisions = await models.Decision.findAll({ where: { proposalId }, order: [['createdAt', 'DESC'], ['id', 'DESC']], transaction })
  const latestDecision = decisions[0]
  const peopleIds = [proposal.authorId, proposal.reviewerId, latestDecision?.decidedBy].filter((id): id is number => typeof id === 'number')
  const people = await models.User.findAll({ where: { id: { [Op.in]: peopleIds } }, attributes: ['id', 'name', 'email'], transaction })
  const person = (id: number | null | undefined): BriefPerson | null => {
    if (id === null || id === undefined) return null
    const row = people.find(candidate => candidate.id === id)
    return row ? { name: row.name, email: row.email } : { name: 'Former user', email: null }
  }

  const records: BriefRecords = {
    documentId: options.documentId ?? randomUUID(),
    issuedAt: (options.issuedAt ?? new Date()).toISOString(),
    verifyUrl: verifyPageUrl(),
    agency: await agencyLetterhead(agencyId, transaction),
    species: {
      commonName: speciesRow?.commonName ?? recipientDto.speciesName,
      scientificName: speciesRow?.scientificName ?? '',
      invented: speciesRow?.invented ?? false,
    },
    proposal: {
      id: proposal.id,
      title: proposal.title,
      purpose: proposal.purpose ?? '',
      status: proposal.status,
      captiveSource: proposal.captiveSource ?? null,
      narrative: proposal.narrative ?? {},
      outbreedingAnswers: proposal.outbreedingAnswers ?? {},
      recommendedScenarioId: proposal.recommendedScenarioId ?? null,
      submittedAt: proposal.submittedAt ? new Date(proposal.submittedAt).toISOString() : null,
      decidedAt: proposal.decidedAt ? new Date(proposal.decidedAt).toISOString() : null,
    },
    recipient: recordOf(recipientDto, geometryOf(recipientDto.id)),
    sources: sourceIds.map(id => dtos.get(id)).filter((dto): dto is ProposalSubpopulationDto => Boolean(dto)).map(dto => recordOf(dto, geometryOf(dto.id))),
    others,
    scenarios: scenarios.map(row => ({ id: row.id, name: row.name, isBaseline: row.isBaseline, inputs: row.inputs as unknown as ScenarioInputsLike })),
    author: person(proposal.authorId) ?? { name: 'Former user', email: null },
    reviewer: person(proposal.reviewerId),
    decision: latestDecision
      ? {
          decision: latestDecision.decision,
          comment: latestDecision.comment,
          decidedAt: new Date(latestDecision.createdAt).toISOString(),
          decidedBy: person(latestDecision.decidedBy) ?? { name: 'Former user', email: null },
        }
      : null,
  }
  return assembleBriefData(records)
}

/**
 * An unsigned preview of a proposal's brief, marked "Draft — not approved" on every page.
 *
 * @returns the PDF bytes and the agency's short name (for the file name)
 */
export async function renderDraftBrief(proposalId: number, agencyId: number): Promise<{ pdf: Buffer, data: BriefData }> {
  const data = await loadBriefData(proposalId, agencyId)
  const pdf = await renderPdf(buildBriefDocument(data, { draft: true }), await briefFonts())
  return { pdf, data }
}

function summaryOf(row: { id: number, documentId: string, sha256: string, sizeBytes: number, signerSubject: string, signedAt: Date }, created: boolean): IssuedBriefSummary {
  return { id: row.id, documentId: row.documentId, sha256: row.sha256, sizeBytes: row.sizeBytes, signerSubject: row.signerSubject, signedAt: new Date(row.signedAt), created }
}

/**
 * Builds, signs, stores and sends the brief of an approved proposal (see the file comment).
 *
 * @param transaction - the approval's transaction
 * @param proposalId - the proposal just approved
 * @param options.actorId - the approver (audit actor and `issued_by`); default: the latest approving decision's author
 * @returns the issued brief's ID, SHA-256, size, signer and time
 */
export async function issueSignedBrief(transaction: Transaction, proposalId: number, options: { actorId?: number } = {}): Promise<IssuedBriefSummary> {
  const { sequelize, models } = await useDb()
  const proposal = await models.Proposal.findByPk(proposalId, { transaction })
  if (!proposal) throw notFound('Proposal')
  const existing = await models.IssuedBrief.findOne({ where: { proposalId }, attributes: { exclude: ['pdf'] }, transaction })
  if (existing) return summaryOf(existing, false)

  const agency = await models.Agency.findByPk(proposal.agencyId, { transaction })
  if (!agency) throw notFound('Agency')
  const { credential, generated } = await ensureAgencyCredential(sequelize, agency, transaction)
  if (generated) {
    await recordAudit(transaction, {
      agencyId: agency.id, actorId: null, action: 'agency.certificate.generate', entityType: 'agency', entityId: agency.id,
      before: null, after: { subject: credential.info.subject, fingerprintSha256: credential.info.fingerprintSha256, notAfter: credential.info.notAfter.toISOString() },
    })
  }

  const signingTime = new Date()
  const documentId = randomUUID()
  const data = await loadBriefData(proposalId, proposal.agencyId, { transaction, documentId, issuedAt: signingTime })
  const unsigned = await renderPdf(buildBriefDocument(data, { draft: false }), await briefFonts(), {
    reason: `Approval of ${data.proposal.reference}: ${data.proposal.title}`.slice(0, 200),
    name: agency.name,
    location: agency.address.split('\n')[0] ?? '',
    contactInfo: agency.contactEmail ?? '',
    signingTime,
  })
  const signed = await signPdf(unsigned, credential.pkcs12, signingPassphrase(), signingTime)

  const approverId = options.actorId ?? (await models.Decision.findOne({ where: { proposalId, decision: 'approve' }, order: [['createdAt', 'DESC']], transaction }))?.decidedBy ?? null
  const row = await models.IssuedBrief.create({
    agencyId: proposal.agencyId,
    proposalId,
    documentId,
    sha256: signed.sha256,
    pdf: signed.pdf,
    sizeBytes: signed.pdf.length,
    signerSubject: credential.info.subject,
    signerFingerprintSha256: credential.info.fingerprintSha256,
    signedAt: signingTime,
    issuedBy: approverId,
  }, { transaction })
  await recordAudit(transaction, {
    agencyId: proposal.agencyId, actorId: approverId, action: 'brief.issue', entityType: 'proposal', entityId: proposalId,
    before: null, after: { documentId, sha256: signed.sha256, sizeBytes: signed.pdf.length, signerSubject: credential.info.subject },
  })

  const author = await models.User.findByPk(proposal.authorId, { attributes: ['id', 'name', 'email', 'active'], transaction })
  if (author?.email) {
    const fileName = briefFileName(agency.shortName, proposalId, false)
    await queueMail(transaction, {
      agencyId: proposal.agencyId,
      to: author.email,
      subject: `Signed brief: ${proposal.title}`,
      text: [
        `Hello ${author.name},`,
        '',
        `Your proposal "${proposal.title}" was approved. The signed brief is attached (${fileName}).`,
        '',
        `Document ID: ${documentId}`,
        `SHA-256 of the signed file: ${signed.sha256}`,
        `Signed by: ${credential.info.subject}`,
        '',
        `Anyone can check a copy at ${verifyPageUrl()} — it says whether the signature is valid and whether the file is exactly the one issued.`,
        '',
        'This brief supports a decision; agency policy, permits and licensed practice govern any action.',
      ].join('\n'),
      attachments: [{ filename: fileName, contentType: 'application/pdf', content: signed.pdf }],
    })
  }
  return summaryOf(row, true)
}

/** The issued brief of a proposal (with or without the bytes), or null. */
export async function findIssuedBrief(proposalId: number, agencyId: number, options: { withPdf?: boolean } = {}) {
  const { models } = await useDb()
  return models.IssuedBrief.findOne({
    where: { proposalId, agencyId },
    ...(options.withPdf ? {} : { attributes: { exclude: ['pdf'] } }),
  })
}

/** SHA-256 of bytes, lower-case hex. */
export function sha256Hex(data: Buffer): string {
  return createHash('sha256').update(data).digest('hex')
}
