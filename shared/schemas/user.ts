import { z } from 'zod'
import { ROLES } from '../roles'

const email = z.string({ message: 'E-mail is required' }).trim().toLowerCase().pipe(z.email({ message: 'Enter a valid e-mail address' })).pipe(z.string().max(190, 'E-mail is too long'))
const displayName = z.string({ message: 'Name is required' }).trim().min(2, 'Name needs at least 2 characters').max(120, 'Name is too long')
const password = z.string({ message: 'Password is required' }).min(12, 'Password needs at least 12 characters').max(200, 'Password is too long')
const role = z.enum(ROLES, { message: `Role must be one of: ${ROLES.join(', ')}` })

export const signInSchema = z.object({
  email,
  password: z.string({ message: 'Enter your password' }).min(1, 'Enter your password').max(200, 'Password is too long'),
})

export const userCreateSchema = z.strictObject({ email, displayName, role, password })
export type UserCreate = z.infer<typeof userCreateSchema>

/** An admin's change to an account: any of role, name, active flag, or a new password. */
export const userUpdateSchema = z
  .strictObject({ displayName, role, active: z.boolean({ message: 'Active must be true or false' }), password })
  .partial()
  .refine((value) => Object.keys(value).length > 0, { message: 'Nothing to change: send displayName, role, active or password' })
export type UserUpdate = z.infer<typeof userUpdateSchema>

/** A signed-in user choosing their own password; the strength rules are checked on the server. */
export const ownPasswordSchema = z.strictObject({
  currentPassword: z.string({ message: 'Enter your current password' }).min(1, 'Enter your current password').max(200, 'Password is too long'),
  newPassword: password,
})
export type OwnPasswordChange = z.infer<typeof ownPasswordSchema>
