/**
 * How long something has waited, in words for the Reviews inbox ("3 days", "5 hours"), and
 * whether that is long enough to stand out.
 */

const HOUR_MS = 3_600_000
const DAY_MS = 24 * HOUR_MS

/** A submission waiting this long or longer is shown as overdue (two working weeks). */
export const LONG_WAIT_DAYS = 14

/**
 * Waiting time in words: under an hour, hours under a day, then days.
 *
 * @example waitingWords(20 * 60_000) // 'less than an hour'
 * @example waitingWords(5 * 3_600_000) // '5 hours'
 * @example waitingWords(86_400_000) // '1 day'
 * @example waitingWords(17.9 * 86_400_000) // '17 days'
 */
export function waitingWords(milliseconds: number): string {
  if (!(milliseconds >= HOUR_MS)) return 'less than an hour'
  if (milliseconds < DAY_MS) {
    const hours = Math.floor(milliseconds / HOUR_MS)
    return `${hours} ${hours === 1 ? 'hour' : 'hours'}`
  }
  const days = Math.floor(milliseconds / DAY_MS)
  return `${days} ${days === 1 ? 'day' : 'days'}`
}

/** Whether a wait of `milliseconds` is long (LONG_WAIT_DAYS or more). */
export function isLongWait(milliseconds: number): boolean {
  return milliseconds >= LONG_WAIT_DAYS * DAY_MS
}
