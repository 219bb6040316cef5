import bcrypt from 'bcryptjs';
import { col, fn, Op, where } from 'sequelize';
import { PasswordReset, User } from '../../db/models';
import type { Config } from '../config';
import type { ResetConfirmInput, SignInInput, SignUpInput } from '../domain/schemas/auth';
import { AppError, badRequest, conflict, unavailable } from '../errors';
import type { Mailer } from '../mail/mailer';
import { passwordResetMail } from '../mail/templates';
import { sendOrThrow } from '../outbox/outbox.service';
import { hashSecretToken, newSecretToken } from './secret-token';

export const RESET_MINUTES = 60;

// Compared against when no account matches, so an unknown address takes as long as a wrong password.
let dummyHash: Promise<string> | undefined;
const dummyHashFor = (cost: number) => (dummyHash ??= bcrypt.hash('no account has this password', cost));

export function findUserByEmail(email: string, scope: 'defaultScope' | 'withPassword' = 'defaultScope') {
  return User.scope(scope).findOne({ where: where(fn('lower', col('email')), email.trim().toLowerCase()) });
}

export async function signUp(input: SignUpInput, auth: Config['auth']): Promise<User> {
  const email = input.email.toLowerCase();
  if (await findUserByEmail(email)) {
    throw conflict('An account with this e-mail address exists already. Sign in, or reset its password.', {
      email: 'is already registered',
    });
  }
  const passwordHash = await bcrypt.hash(input.password, auth.bcryptCost);
  const user = await User.create({ email, name: input.name, passwordHash });
  return (await User.findByPk(user.id))!;
}

export async function signIn(input: SignInInput, auth: Config['auth']): Promise<User> {
  const user = await findUserByEmail(input.email, 'withPassword');
  const ok = await bcrypt.compare(input.password, user?.passwordHash ?? (await dummyHashFor(auth.bcryptCost)));
  if (!user || !ok) {
    throw new AppError(401, 'invalid_credentials', 'That e-mail address and password do not match an account.');
  }
  return (await User.findByPk(user.id))!;
}

/** Sends a single-use reset link when the address has an account; says nothing either way. */
export async function requestPasswordReset(email: string, deps: { config: Config; mailer: Mailer }): Promise<void> {
  const user = await findUserByEmail(email);
  if (!user) return;
  const { token, hash } = newSecretToken();
  const reset = await PasswordReset.create({
    userId: user.id,
    tokenHash: hash,
    expiresAt: new Date(Date.now() + RESET_MINUTES * 60_000),
  });
  const link = `${deps.config.publicUrl}/reset-password?token=${encodeURIComponent(token)}`;
  try {
    await sendOrThrow(deps, {
      key: `password-reset:${reset.id}`,
      to: { id: user.id, email: user.email },
      template: 'password-reset',
      content: passwordResetMail({ name: user.name, link, minutes: RESET_MINUTES }),
    });
  } catch (error) {
    await reset.destroy();
    console.error('[mail] password reset not sent:', error);
    throw unavailable('We could not send the e-mail just now. Please try again in a few minutes.');
  }
}

/** Sets the new password, spends the token and ends every earlier session of the account. */
export async function confirmPasswordReset(input: ResetConfirmInput, auth: Config['auth']): Promise<User> {
  const sequelize = PasswordReset.sequelize!;
  return sequelize.transaction(async (transaction) => {
    const reset = await PasswordReset.findOne({
      where: { tokenHash: hashSecretToken(input.token), usedAt: null, expiresAt: { [Op.gt]: new Date() } },
      lock: transaction.LOCK.UPDATE,
      transaction,
    });
    if (!reset) {
      throw badRequest('This reset link has expired or was used already. Ask for a new one.', {
        token: 'has expired or was used already',
      });
    }
    // Every open link of the account is spent with this one: an older e-mail must not reset again.
    await PasswordReset.update({ usedAt: new Date() }, { where: { userId: reset.userId, usedAt: null }, transaction });
    const user = (await User.findByPk(reset.userId, { transaction, lock: transaction.LOCK.UPDATE }))!;
    await user.update(
      { passwordHash: await bcrypt.hash(input.password, auth.bcryptCost), sessionVersion: user.sessionVersion + 1 },
      { transaction },
    );
    return user;
  });
}
