/**
 * Where an approved proposal stands in its monitoring, from the dates of what was recorded:
 *
 *   not approved                                  → 'not-applicable'
 *   approved, nothing moved yet                   → 'awaiting-translocation'
 *   moved, no follow-up since the last move:
 *       less than FOLLOW_UP_DAYS since that move  → 'awaiting-follow-up'
 *       FOLLOW_UP_DAYS or more                    → 'follow-up-due'
 *   followed up after the last move:
 *       latest follow-up less than FOLLOW_UP_DAYS ago → 'monitored'
 *       FOLLOW_UP_DAYS or more ago                → 'follow-up-due'
 *
 * A yearly follow-up is common practice for small recipient populations after a translocation
 * (no single source; agencies set their own interval in the monitoring plan). Pure: "today" is
 * passed in.
 */
import type { ProposalStatus } from '../types/db'

/** Days after a move (or the latest follow-up) by which the next follow-up is due. */
export const FOLLOW_UP_DAYS = 365

export const MONITORING_STATUS_CODES = ['not-applicable', 'awaiting-translocation', 'awaiting-follow-up', 'follow-up-due', 'monitored'] as const
export type MonitoringStatusCode = typeof MONITORING_STATUS_CODES[number]

export interface MonitoringStatus {
  code: MonitoringStatusCode
  /** Two or three words for a badge. */
  label: string
  /** One sentence with the dates. */
  detail: string
  /** When the next follow-up is due (YYYY-MM-DD), when one is. */
  nextDueOn: string | null
}

const DAY_MS = 86_400_000

function dayNumber(day: string): number {
  return Math.floor(Date.parse(`${day}T00:00:00Z`) / DAY_MS)
}

/**
 * The day `days` after `day`.
 *
 * @example addDays('2024-12-30', 3) // '2025-01-02'
 */
export function addDays(day: string, days: number): string {
  return new Date((dayNumber(day) + days) * DAY_MS).toISOString().slice(0, 10)
}

function latest(days: readonly string[]): string | null {
  let best: string | null = null
  for (const day of days) if (best === null || day > best) best = day
  return best
}

/**
 * The monitoring status of a proposal.
 *
 * @param input.proposalStatus - the proposal's status
 * @param input.movedOn - days of the recorded translocations (YYYY-MM-DD, any order)
 * @param input.observedOn - days of the follow-up observations (YYYY-MM-DD, any order)
 * @param input.today - today (YYYY-MM-DD)
 * @returns code, label, sentence and the next due day
 * @example monitoringStatus({ proposalStatus: 'approved', movedOn: [], observedOn: [], today: '2025-01-01' }).code // 'awaiting-translocation'
 * @example monitoringStatus({ proposalStatus: 'approved', movedOn: ['2024-05-01'], observedOn: [], today: '2025-06-01' }).code // 'follow-up-due'
 * @example monitoringStatus({ proposalStatus: 'approved', movedOn: ['2024-05-01'], observedOn: ['2025-04-20'], today: '2025-06-01' }).code // 'monitored'
 */
export function monitoringStatus(input: { proposalStatus: ProposalStatus, movedOn: readonly string[], observedOn: readonly string[], today: string }): MonitoringStatus {
  if (input.proposalStatus !== 'approved') {
    return { code: 'not-applicable', label: 'Not started', detail: 'Monitoring starts once the proposal is approved.', nextDueOn: null }
  }
  const lastMove = latest(input.movedOn)
  if (lastMove === null) {
    return { code: 'awaiting-translocation', label: 'Awaiting translocation', detail: 'Approved; no translocation has been recorded yet.', nextDueOn: null }
  }
  const followUps = input.observedOn.filter(day => day >= lastMove)
  const lastFollowUp = latest(followUps)
  const anchor = lastFollowUp ?? lastMove
  const nextDueOn = addDays(anchor, FOLLOW_UP_DAYS)
  const overdue = dayNumber(input.today) - dayNumber(anchor) >= FOLLOW_UP_DAYS
  if (lastFollowUp === null) {
    return overdue
      ? { code: 'follow-up-due', label: 'Follow-up due', detail: `Animals were moved on ${lastMove}; no follow-up has been recorded since, and one was due by ${nextDueOn}.`, nextDueOn }
      : { code: 'awaiting-follow-up', label: 'Awaiting follow-up', detail: `Animals were moved on ${lastMove}; the first follow-up is due by ${nextDueOn}.`, nextDueOn }
  }
  return overdue
    ? { code: 'follow-up-due', label: 'Follow-up due', detail: `The latest follow-up was on ${lastFollowUp}; the next was due by ${nextDueOn}.`, nextDueOn }
    : { code: 'monitored', label: 'Monitored', detail: `Followed up on ${lastFollowUp}; the next follow-up is due by ${nextDueOn}.`, nextDueOn }
}
