// Password hashing for scripts and seeds that run outside Nitro. Same scrypt driver and defaults as
// nuxt-auth-utils' hashPassword, so the server's verifyPassword accepts these hashes.
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'

const hasher = new Hash(new Scrypt({}))

export function hashPasswordOutsideServer(password: string): Promise<string> {
  return hasher.make(password)
}
