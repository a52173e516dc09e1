/**
 * Content-Disposition for a download: `attachment` with a plain ASCII file name and the
 * RFC 5987 UTF-8 form, so every browser saves the file under its name.
 */

/**
 * @param fileName - the name to save under
 * @example attachmentDisposition('mistridge-salamander-subpopulations.csv')
 *   // "attachment; filename=\"mistridge-salamander-subpopulations.csv\"; filename*=UTF-8''mistridge-salamander-subpopulations.csv"
 */
export function attachmentDisposition(fileName: string): string {
  const ascii = fileName.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_')
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(fileName)}`
}
