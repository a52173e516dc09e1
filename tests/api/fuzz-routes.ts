/**
 * The API route list, read from the files under server/api (one file per route and method,
 * `[name]` folders and file names are parameters, `index` is the folder itself), so a new
 * route is fuzzed without anyone adding it to a list.
 */
import { readdirSync } from 'node:fs'
import { join, relative } from 'node:path'
import { fileURLToPath } from 'node:url'

/** One route as its file declares it. */
export interface ApiRoute {
  /** upper-case HTTP method */
  method: string
  /** '/api/proposals/[id]/versions/[version]' */
  template: string
  /** parameter names in the order they appear */
  params: string[]
  /** path of the handler file, relative to the repository */
  file: string
}

const apiDirectory = fileURLToPath(new URL('../../server/api', import.meta.url))
const repositoryRoot = fileURLToPath(new URL('../..', import.meta.url))
const ROUTE_FILE = /^(.+)\.(get|post|put|patch|delete)\.ts$/

function handlerFiles(directory: string): string[] {
  return readdirSync(directory, { withFileTypes: true }).flatMap((entry) => {
    const path = join(directory, entry.name)
    return entry.isDirectory() ? handlerFiles(path) : [path]
  })
}

/**
 * Every route under server/api, sorted by address then method.
 *
 * @example discoverApiRoutes().find(r => r.template === '/api/health') // { method: 'GET', params: [], … }
 */
export function discoverApiRoutes(): ApiRoute[] {
  const routes: ApiRoute[] = []
  for (const file of handlerFiles(apiDirectory)) {
    const parts = relative(apiDirectory, file).split(/[/\\]/)
    const match = ROUTE_FILE.exec(parts.pop() ?? '')
    if (!match) continue
    const [, name, method] = match as unknown as [string, string, string]
    const segments = name === 'index' ? parts : [...parts, name]
    const template = `/api${segments.map(segment => `/${segment}`).join('')}`
    const params = [...template.matchAll(/\[([^\]]+)\]/g)].map(found => found[1]!) // group 1 always exists
    routes.push({ method: method.toUpperCase(), template, params, file: relative(repositoryRoot, file) })
  }
  return routes.sort((a, b) => a.template.localeCompare(b.template) || a.method.localeCompare(b.method))
}

/** The record table behind a parameter, from the address segment before it ('/proposals/[id]' → proposals). */
const TABLE_BEFORE_PARAM: Record<string, string> = {
  'proposals': 'proposals',
  'subpopulations': 'subpopulations',
  'species': 'species',
  'attachments': 'attachments',
  'genotypes': 'genetic_datasets',
  'runs': 'simulation_runs',
  'scenarios': 'scenarios',
  'users': 'users',
  'census': 'census_counts',
  'effective-sizes': 'effective_size_estimates',
}

/**
 * Table whose ids fit `param` of `route` (undefined when the address does not say).
 *
 * @example recordTableOf({ template: '/api/genotypes/[id]', … }, 'id') // 'genetic_datasets'
 */
export function recordTableOf(route: ApiRoute, param: string): string | undefined {
  const segments = route.template.split('/')
  const index = segments.indexOf(`[${param}]`)
  return index > 0 ? TABLE_BEFORE_PARAM[segments[index - 1]!] : undefined // index > 0, so the segment exists
}

/**
 * Routes that can end the fuzzing sessions (sign-in attempts count against the test address,
 * account changes can sign people out): they are fuzzed last.
 */
export function endsSessions(route: ApiRoute): boolean {
  return /^\/api\/(auth|me)\//.test(route.template) || route.template.startsWith('/api/admin/users')
}
