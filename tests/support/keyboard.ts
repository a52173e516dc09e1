/**
 * Keyboard-only helpers for browser tests: move focus with Tab / Shift+Tab until a given element
 * has it, and check that focusing it changed how it (or the label or box around it) looks — an
 * outline, our focus ring, a background or border change. No mouse is used.
 *
 *   await tabTo(page, page.getByLabel('E-mail address'))
 *   await page.keyboard.type('someone@example.test')
 */
import type { Locator, Page } from 'playwright-core'

/** True when `locator`'s element is the page's focused element. */
export function hasFocus(locator: Locator): Promise<boolean> {
  return locator.evaluate(element => element === document.activeElement).catch(() => false)
}

/** How the element, its ::after and its three nearest wrappers look (the parts a focus style changes). */
function appearance(locator: Locator): Promise<string[]> {
  return locator.evaluate((element) => {
    const describe = (style: CSSStyleDeclaration) => [style.outlineStyle, style.outlineWidth, style.outlineColor, style.boxShadow, style.backgroundColor, style.borderColor].join(' | ')
    const parts = [describe(getComputedStyle(element)), describe(getComputedStyle(element, '::after'))]
    for (let node = element.parentElement, depth = 0; node && depth < 3; node = node.parentElement, depth++) parts.push(describe(getComputedStyle(node)))
    return parts
  })
}

/**
 * Presses Tab (or Shift+Tab when `backwards`) until `target` has focus; fails after `limit`
 * presses, naming where focus went. On arrival, fails unless the focus is visible (something
 * about the element or its wrappers looks different from before it had focus).
 */
export async function tabTo(page: Page, target: Locator, options: { backwards?: boolean, limit?: number } = {}): Promise<void> {
  const key = options.backwards ? 'Shift+Tab' : 'Tab'
  const visited: string[] = []
  const element = await target.elementHandle()
  if (!element) throw new Error(`${target.toString()} is not on the page`)
  // One round trip per key press: is the target focused, and if not, what is.
  const where = () => element.evaluate((node) => {
    const active = document.activeElement
    if (active === node) return null
    if (!active || active === document.body) return 'nothing (body)'
    const name = active.getAttribute('aria-label') ?? (active as HTMLInputElement).labels?.[0]?.textContent ?? active.textContent ?? ''
    return `<${active.tagName.toLowerCase()}> "${name.trim().replace(/\s+/g, ' ').slice(0, 60)}"`
  })
  const before = await where() === null ? null : await appearance(target)
  for (let presses = 0; ; presses++) {
    const focused = await where()
    if (focused === null) break
    if (presses > 0) visited.push(focused)
    if (presses >= (options.limit ?? 80)) throw new Error(`${key} never reached ${target.toString()}; focus went through:\n  ${visited.join('\n  ')}`)
    await page.keyboard.press(key)
  }
  await element.dispose()
  if (before) {
    const after = await appearance(target)
    if (after.every((part, index) => part === before[index])) throw new Error(`${target.toString()} has focus but looks the same as without it (no visible focus indicator)`)
  } else {
    await expectFocusRing(page)
  }
}

/**
 * Fails unless the focused element matches :focus-visible and draws an outline or a box-shadow
 * (our focus ring) — for focus that arrived without Tab (a dialog opening, focus returning).
 */
export async function expectFocusRing(page: Page): Promise<void> {
  const verdict = await page.evaluate(() => {
    const element = document.activeElement as HTMLElement | null
    if (!element || element === document.body) return 'nothing has focus'
    if (!element.matches(':focus-visible')) return `<${element.tagName.toLowerCase()}> has focus but does not match :focus-visible`
    const style = getComputedStyle(element)
    const outline = style.outlineStyle !== 'none' && Number.parseFloat(style.outlineWidth) > 0
    return outline || style.boxShadow !== 'none' ? '' : `no outline or ring on the focused <${element.tagName.toLowerCase()} class="${element.className}">`
  })
  if (verdict) throw new Error(verdict)
}
