/**
 * Changing one's own password on the profile page: the current password proves it is really the
 * owner at the keyboard (a session left open on a shared machine cannot lock the owner out).
 */
import { z } from 'zod';
import { hashPassword, verifyPassword } from '$lib/server/auth/password';
import { User } from '$lib/server/db/models';
import { InputError } from '$lib/server/errors';
import { PASSWORD_MIN_LENGTH } from '$lib/server/invitations/invitations';

/** The password form: the current password and the new one typed twice. */
export const changePasswordSchema = z
  .object({
    currentPassword: z.string('Enter your current password.').min(1, 'Enter your current password.'),
    password: z
      .string('Choose a new password.')
      .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
      .max(1000, 'Keep the password under 1000 characters.'),
    passwordAgain: z.string('Type the new password again.')
  })
  .refine((input) => input.password === input.passwordAgain, {
    path: ['passwordAgain'],
    message: 'The two passwords differ; type the same one twice.'
  })
  .refine((input) => input.password !== input.currentPassword, {
    path: ['password'],
    message: 'The new password is the same as the current one; choose another.'
  });

/**
 * Sets a new password for `userId` after checking the current one.
 * @throws InputError (`password.wrong`, field `currentPassword`) when the current password does not match.
 */
export async function changePassword(userId: number, input: z.output<typeof changePasswordSchema>): Promise<void> {
  const user = await User.findByPk(userId);
  if (!user || !(await verifyPassword(input.currentPassword, user.passwordHash))) {
    throw new InputError('password.wrong', 'That is not your current password.', {
      currentPassword: 'That is not your current password.'
    });
  }
  await user.update({ passwordHash: await hashPassword(input.password) });
}
