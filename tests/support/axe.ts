/**
 * axe-core (the installed node_modules copy) run inside a Playwright page, for the accessibility
 * browser tests. Only "serious" and "critical" findings fail a test; the report names the rule,
 * the elements (CSS targets) and axe's help text so a failure says what to fix.
 *
 *   const findings = await seriousViolations(page)
 *   expect(findings, describeViolations(findings)).toEqual([])
 */
import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import type { Page } from 'playwright-core'

const require = createRequire(import.meta.url)
const axeSource = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8')

/** One failed axe rule, reduced to what a person needs to fix it. */
export interface AxeFinding {
  id: string
  impact: string
  help: string
  helpUrl: string
  targets: string[]
  /** The start of each failing element's HTML. */
  snippets: string[]
  summaries: string[]
}

/**
 * Runs axe on the page (or the part matched by `include`) against WCAG 2.x A/AA and best
 * practice rules, and returns the serious and critical findings.
 *
 * @param page - a loaded page
 * @param include - optional CSS selector to check only a part of the page (e.g. an open dialog)
 */
export async function seriousViolations(page: Page, include?: string): Promise<AxeFinding[]> {
  // Let opening animations (fade, rise) finish: mid-way, text is half transparent and reads as low contrast.
  await page.waitForFunction(() => document.getAnimations().every(animation => animation.playState !== 'running' || animation.effect?.getTiming().iterations === Infinity))
  const present = await page.evaluate(() => typeof (window as unknown as { axe?: unknown }).axe !== 'undefined')
  if (!present) await page.addScriptTag({ content: axeSource })
  return page.evaluate(async (selector) => {
    type Node = { target: string[], html: string, failureSummary?: string }
    type Result = { id: string, impact?: string | null, help: string, helpUrl: string, nodes: Node[] }
    const axe = (window as unknown as { axe: { run(context: unknown, options: unknown): Promise<{ violations: Result[] }> } }).axe
    const context = selector ? { include: [selector] } : document
    const { violations } = await axe.run(context, {
      runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa', 'best-practice'] },
      resultTypes: ['violations'],
    })
    return violations
      .filter(violation => violation.impact === 'serious' || violation.impact === 'critical')
      .map(violation => ({
        id: violation.id,
        impact: violation.impact ?? '',
        help: violation.help,
        helpUrl: violation.helpUrl,
        targets: violation.nodes.map(node => node.target.join(' ')),
        snippets: violation.nodes.map(node => node.html.slice(0, 160)),
        summaries: violation.nodes.map(node => node.failureSummary ?? ''),
      }))
  }, include)
}

/** A readable failure message: one block per rule with its elements and what to fix. */
export function describeViolations(findings: AxeFinding[], where = ''): string {
  if (findings.length === 0) return `no serious or critical accessibility problems ${where}`
  return [`${findings.length} serious or critical accessibility rule(s) fail ${where}:`, ...findings.map(finding => [
    `- ${finding.id} (${finding.impact}): ${finding.help} — ${finding.helpUrl}`,
    ...finding.targets.slice(0, 8).map((target, index) => `    ${target}\n      ${finding.snippets[index]}\n      ${(finding.summaries[index] ?? '').replace(/\n/g, '\n      ')}`),
    finding.targets.length > 8 ? `    … and ${finding.targets.length - 8} more` : '',
  ].filter(Boolean).join('\n'))].join('\n')
}
