/**
 * A temporary checkout of an earlier revision, for the benchmarks that compare this checkout's
 * engine with it (compare-with-revision.ts, count-instructions.ts): `git worktree add --detach`
 * into a temporary folder, this checkout's node_modules linked in, removed afterwards whatever
 * happens.
 */
import { execFileSync } from 'node:child_process'
import { mkdtempSync, rmSync, symlinkSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'

/** This checkout's root folder. */
export const checkoutRoot = join(dirname(fileURLToPath(import.meta.url)), '..')

/**
 * Runs `action` with the folder of a temporary checkout of `revision`.
 *
 * @param revision - any git revision
 * @param action - receives the checkout's folder
 * @returns what `action` returns
 */
export async function withRevisionCheckout<T>(revision: string, action: (folder: string) => T | Promise<T>): Promise<T> {
  const folder = mkdtempSync(join(tmpdir(), 'tributary-revision-'))
  const worktree = join(folder, 'checkout')
  execFileSync('git', ['worktree', 'add', '--detach', worktree, revision], { cwd: checkoutRoot, stdio: 'ignore' })
  try {
    symlinkSync(join(checkoutRoot, 'node_modules'), join(worktree, 'node_modules'))
    return await action(worktree)
  } finally {
    execFileSync('git', ['worktree', 'remove', '--force', worktree], { cwd: checkoutRoot, stdio: 'ignore' })
    rmSync(folder, { recursive: true, force: true })
  }
}
