/**
 * Ceilings on request bodies for the whole app, checked by nuxt-security's request size limiter
 * before any route runs (nuxt.config.ts `security.requestSizeLimiter`). Each route keeps its own,
 * tighter limit with its own message (413 "The file is too large. The limit is …"); these
 * ceilings only stop absurd bodies early, so they are derived from the largest route limits and
 * never refuse a body a route would accept.
 *
 * Plain constants (no Nitro, no Node modules): nuxt.config.ts imports this file.
 */
import { ATTACHMENT_MAX_BYTES } from './attachments'
import { VERIFY_MAX_BYTES, LOGO_MAX_BYTES, CERTIFICATE_MAX_BYTES } from './brief'
import { GENOTYPE_FILE_MAX_BYTES } from './genotypes'

/** Multipart framing and the text fields may add this much to the file's own size. */
export const MULTIPART_OVERHEAD_BYTES = 64 * 1024

/** Largest subpopulation import (POST /api/species/:id/subpopulations/import: the file's text inside JSON). */
export const SUBPOPULATION_IMPORT_MAX_BYTES = 5 * 1024 * 1024

/** Largest multipart upload any route accepts, framing included. */
export const LARGEST_UPLOAD_REQUEST_BYTES = Math.max(
  ATTACHMENT_MAX_BYTES, GENOTYPE_FILE_MAX_BYTES, VERIFY_MAX_BYTES, LOGO_MAX_BYTES, CERTIFICATE_MAX_BYTES,
) + MULTIPART_OVERHEAD_BYTES

/** Largest other body (JSON, CSV text) any route accepts, plus room for the JSON around the text. */
export const LARGEST_BODY_REQUEST_BYTES = SUBPOPULATION_IMPORT_MAX_BYTES + 64 * 1024
