import { TesterProfile, type User } from '../../db/models';
import type { z } from 'zod';
import type { profileSchema } from '../domain/schemas/profile';
import { serializeProfile } from '../serializers';

export async function getProfile(user: User) {
  return serializeProfile(user, await TesterProfile.findByPk(user.id));
}

export async function updateProfile(user: User, input: z.output<typeof profileSchema>) {
  return user.sequelize.transaction(async (transaction) => {
    await user.update(
      {
        ...(input.name !== undefined && { name: input.name }),
        ...(input.lengthUnit && { lengthUnit: input.lengthUnit }),
        ...(input.fabricUnit && { fabricUnit: input.fabricUnit }),
        ...(input.timeZone && { timeZone: input.timeZone }),
        ...(input.mail?.reminders !== undefined && { mailReminders: input.mail.reminders }),
        ...(input.mail?.trialNews !== undefined && { mailTrialNews: input.mail.trialNews }),
        ...(input.mail?.digest !== undefined && { mailDigest: input.mail.digest }),
      },
      { transaction },
    );
    const [profile] = await TesterProfile.findOrCreate({ where: { userId: user.id }, defaults: { userId: user.id }, transaction });
    const measurements =
      input.measurementsMm === undefined
        ? undefined
        : Object.fromEntries(Object.entries(input.measurementsMm).filter(([, mm]) => mm != null)) as Record<string, number>;
    await profile.update(
      {
        ...(measurements && { measurementsMm: measurements }),
        ...(input.experience !== undefined && { experience: input.experience }),
        ...(input.fitNotes !== undefined && { fitNotes: input.fitNotes || null }),
      },
      { transaction },
    );
    return serializeProfile(user, profile);
  });
}
