import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { col, fn, Op, where, type Transaction } from 'sequelize';
import { PasswordReset, SignUpRequest, User } from '../../db/models';
import type { Config } from '../config';
import type { ResetConfirmInput, SignInInput, SignUpInput } from '../domain/schemas/auth';
import { AppError, badRequest, conflict } from '../errors';
import type { Mailer } from '../mail/mailer';
import { accountExistsMail, confirmAddressMail, passwordResetMail } from '../mail/templates';
import { send as sendMail, sendOrThrow } from '../outbox/outbox.service';
import { hashSecretToken, newSecretToken } from './secret-token';

export const RESET_MINUTES = 60;

// Compared against when no account matches, so an unknown address takes as long as a wrong password.
let dummyHash: Promise<string> | undefined;
const dummyHashFor = (cost: number) => (dummyHash ??= bcrypt.hash('no account has this password', cost));

export function findUserByEmail(email: string, scope: 'defaultScope' | 'withPassword' = 'defaultScope', transaction?: Transaction) {
  return User.scope(scope).findOne({ where: where(fn('lower', col('email')), email.trim().toLowerCase()), transaction });
}

export const SIGN_UP_HOURS = 24;

/**
 * A sign-up asks for the address to be confirmed: the account is made only from the link in the
 * e-mail, so nobody can hold an account (or accept an invitation) for an address they cannot
 * read. An address that has an account gets a note saying so instead. The caller answers the
 * same way in both cases before this runs, so the answer says nothing about who has an account.
 */
export async function requestSignUp(input: SignUpInput, deps: { config: Config; mailer: Mailer }): Promise<void> {
  const email = input.email.toLowerCase();
  const existing = await findUserByEmail(email);
  if (existing) {
    await sendMail(deps, {
      key: `account-exists:${existing.id}:${randomUUID()}`,
      to: { id: existing.id, email: existing.email },
      template: 'account-exists',
      category: 'essential',
      content: accountExistsMail({ name: existing.name, signInLink: `${deps.config.publicUrl}/sign-in`, resetLink: `${deps.config.publicUrl}/reset-password` }),
    });
    return;
  }
  const { token, hash } = newSecretToken();
  const request = await SignUpRequest.create({
    email,
    name: input.name,
    passwordHash: await bcrypt.hash(input.password, deps.config.auth.bcryptCost),
    nextPath: input.next ?? null,
    timeZone: input.timeZone ?? 'UTC',
    tokenHash: hash,
    expiresAt: new Date(Date.now() + SIGN_UP_HOURS * 3_600_000),
  });
  const link = `${deps.config.publicUrl}/verify-email?token=${encodeURIComponent(token)}`;
  await sendOrThrow(deps, {
    key: `confirm-address:${request.id}`,
    to: { id: null, email },
    template: 'confirm-address',
    content: confirmAddressMail({ name: input.name, link, hours: SIGN_UP_HOURS }),
  });
}

/**
 * The link from the confirmation e-mail: makes the account with a confirmed address and spends
 * every other pending sign-up of that address. Returns the user and where the app goes next.
 */
export async function confirmSignUp(token: string): Promise<{ user: User; next: string | null }> {
  return SignUpRequest.sequelize!.transaction(async (transaction) => {
    const request = await SignUpRequest.scope('withPassword').findOne({
      where: { tokenHash: hashSecretToken(token), usedAt: null, expiresAt: { [Op.gt]: new Date() } },
      lock: transaction.LOCK.UPDATE,
      transaction,
    });
    if (!request) {
      throw badRequest('This link has expired or was used already. Create the account again to get a new one.', { token: 'has expired or was used already' });
    }
    await SignUpRequest.update(
      { usedAt: new Date() },
      { where: { usedAt: null, [Op.and]: [where(fn('lower', col('email')), request.email.toLowerCase())] }, transaction },
    );
    if (await findUserByEmail(request.email, 'defaultScope', transaction)) {
      throw conflict('This address has an account already. Sign in, or reset its password.', { token: 'the address has an account already' });
    }
    const user = await User.create(
      { email: request.email, name: request.name, passwordHash: request.passwordHash, timeZone: request.timeZone, emailVerifiedAt: new Date() },
      { transaction },
    );
    return { user: (await User.findByPk(user.id, { transaction }))!, next: request.nextPath };
  });
}

export async function signIn(input: SignInInput, auth: Config['auth']): Promise<User> {
  const user = await findUserByEmail(input.email, 'withPassword');
  const ok = await bcrypt.compare(input.password, user?.passwordHash ?? (await dummyHashFor(auth.bcryptCost)));
  if (!user || !ok) {
    throw new AppError(401, 'invalid_credentials', 'That e-mail address and password do not match an account.');
  }
  return (await User.findByPk(user.id))!;
}

/**
 * Sends a single-use reset link when the address has an account. Runs after the answer has gone
 * (the same for every address), so neither its answer nor its timing tells who has an account.
 */
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
    // The link never left: it must not stay usable. The person asks again.
    await reset.destroy();
    throw error;
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
      {
        passwordHash: await bcrypt.hash(input.password, auth.bcryptCost),
        sessionVersion: user.sessionVersion + 1,
        // The link reached the address, which confirms it.
        emailVerifiedAt: user.emailVerifiedAt ?? new Date(),
      },
      { transaction },
    );
    return user;
  });
}
