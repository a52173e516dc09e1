/**
 * Password hashing outside the Nitro runtime (seeds, scripts, tests), producing exactly what
 * nuxt-auth-utils' `hashPassword` produces with its default settings, so its `verifyPassword`
 * accepts these hashes and the other way round.
 *
 * nuxt-auth-utils 0.5 wraps `@adonisjs/hash` with the scrypt driver and the options in
 * `runtimeConfig.hash.scrypt` (empty by default: the driver's defaults, cost 16384, block
 * size 8, parallelism 1, 16-byte salt, 64-byte key). The result is a PHC string such as
 * `$scrypt$n=16384,r=8,p=1$<salt>$<hash>`; the parameters travel inside it, so a hash made
 * here stays verifiable if the app's settings change later. In server routes use the
 * nuxt-auth-utils helpers (auto-imported) instead.
 */
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'

let hasher: Hash | undefined

function getHasher(): Hash {
  hasher ??= new Hash(new Scrypt({}))
  return hasher
}

/**
 * Hashes a password in the nuxt-auth-utils format.
 *
 * @param plain - the password
 * @returns PHC-format scrypt hash, e.g. '$scrypt$n=16384,r=8,p=1$…$…'
 */
export function hashPasswordScrypt(plain: string): Promise<string> {
  return getHasher().make(plain)
}

/**
 * Checks a password against a hash in the nuxt-auth-utils format.
 *
 * @returns true when `plain` matches `hashed`; false for a wrong password or a malformed hash
 */
export function verifyPasswordScrypt(hashed: string, plain: string): Promise<boolean> {
  return getHasher().verify(hashed, plain)
}
