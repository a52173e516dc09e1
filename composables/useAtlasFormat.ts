/**
 * Numbers as the Atlas writes them: Ne and census as whole numbers with thousands separators
 * (one decimal below 10), F with three decimals, areas in km², years.
 */
const whole = new Intl.NumberFormat('en-US', { maximumFractionDigits: 0 })
const oneDecimal = new Intl.NumberFormat('en-US', { maximumFractionDigits: 1 })

/** 1365.6 → '1,366'; 5.9 → '5.9'; null → '—'. */
function count(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—'
  return Math.abs(value) < 10 ? oneDecimal.format(value) : whole.format(value)
}

/** 0.0956 → '0.096'; values below 0.001 → '< 0.001'. */
function inbreeding(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—'
  if (value > 0 && value < 0.001) return '< 0.001'
  return value.toFixed(3)
}

/** km² for people: 0.5 → '0.50 km²', 123.456 → '123.5 km²', 12345 → '12,345 km²'. */
function area(value: number | null | undefined): string {
  if (value === null || value === undefined) return '—'
  if (value < 10) return `${value.toFixed(2)} km²`
  if (value < 1000) return `${value.toFixed(1)} km²`
  return `${whole.format(value)} km²`
}

/** km for people: 0 → '0 km (touching)', 0.4 → '0.4 km', 31.379 → '31.4 km', 212.9 → '213 km'. */
function km(value: number | null | undefined): string {
  if (value === null || value === undefined) return '—'
  if (value === 0) return '0 km'
  if (value < 100) return `${value.toFixed(1)} km`
  return `${whole.format(value)} km`
}

/** 12 → '12 years', 1 → '1 year', 2.5 → '2.5 years'. */
function years(value: number | null | undefined): string {
  if (value === null || value === undefined) return '—'
  return `${oneDecimal.format(value)} ${value === 1 ? 'year' : 'years'}`
}

/** The Atlas's number formats (one object, so the auto-imported names stay few and distinct). */
export const atlasFormat = { count, inbreeding, area, km, years } as const
