import { z } from 'zod'
import { roles } from '../../shared/utils/permissions'

// Field rules shared by the crew routes, so every form gets the same messages.
export const emailField = z.string({ error: 'Enter an e-mail address' }).trim().toLowerCase().max(254, 'That address is too long').pipe(z.email('Enter a valid e-mail address'))
export const roleField = z.enum(roles, { error: `Role must be one of: ${roles.join(', ')}` })
export const newPasswordField = z.string({ error: 'Choose a password' }).min(10, 'Use at least 10 characters').max(200, 'Use at most 200 characters')
export const personName = z.string({ error: 'Enter your name' }).trim().min(1, 'Enter your name').max(80, 'Use at most 80 characters')
export const linkToken = z.string().regex(/^[\w-]{43}$/, 'That link is not complete; copy the whole address from the e-mail')

/** The hasher the crew services use: nuxt-auth-utils' scrypt, the one sign-in verifies with. */
export const passwordHasher = { make: hashPassword, verify: verifyPassword }
