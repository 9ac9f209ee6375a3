import { z } from 'zod'

export const SignInSchema = z.object({
  email: z.string({ error: 'is required' }).trim().min(1, 'is required').max(254, 'is too long').email('is not an e-mail address'),
  password: z.string({ error: 'is required' }).min(1, 'is required').max(200, 'is too long'),
})
export type SignInInput = z.infer<typeof SignInSchema>

/** Real accounts need at least 12 characters; only the demo seed uses a shorter one. */
export const NewPasswordSchema = z.string({ error: 'is required' }).min(12, 'must be at least 12 characters').max(200, 'is too long')
