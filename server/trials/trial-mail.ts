import { PatternSize, User, type Application, type Trial } from '../../db/models';
import type { Config } from '../config';
import { MILESTONE_LABELS, TESTER_MILESTONES } from '../domain/trials';
import type { Mailer } from '../mail/mailer';
import { declinedMail, selectedMail, waitlistedMail } from '../mail/templates';
import type { DecisionEffects } from './trials.service';
import { milestoneMap, studioOf } from './trials.service';

/** A date and time in words, in the given time zone (the tester's or the studio's). */
export function formatDue(date: Date, timeZone: string): string {
  return new Intl.DateTimeFormat('en-GB', { dateStyle: 'full', timeStyle: 'short', timeZone }).format(date);
}

/**
 * Tells each applicant of a decision. Runs after the decision is committed: a mail that cannot be
 * sent is logged and does not undo the decision (a persistent outbox with retries comes later).
 */
export async function sendDecisionMail(trial: Trial, effects: DecisionEffects, deps: { config: Config; mailer: Mailer }) {
  const studio = await studioOf(trial);
  const link = `${deps.config.publicUrl}/my-trials`;
  const dues = milestoneMap(trial);
  const send = async (app: Application, build: (user: User) => Promise<Parameters<Mailer['send']>[0]>) => {
    const user = await User.findByPk(app.userId);
    if (!user) return;
    try {
      await deps.mailer.send(await build(user));
    } catch (error) {
      console.error(`[mail] decision mail to ${user.email} not sent:`, error);
    }
  };
  for (const app of effects.selected) {
    await send(app, async (user) => {
      const size = app.sizeId ? await PatternSize.findByPk(app.sizeId) : null;
      const dueLines = TESTER_MILESTONES.flatMap((kind) => (dues[kind] ? [`${MILESTONE_LABELS[kind]}: ${formatDue(dues[kind]!, user.timeZone)}`] : []));
      return { to: user.email, ...selectedMail({ name: user.name, trialTitle: trial.title, studioName: studio.name, link, sizeLabel: size?.label ?? '?', dueLines }) };
    });
  }
  for (const app of effects.waitlisted) {
    await send(app, async (user) => ({ to: user.email, ...waitlistedMail({ name: user.name, trialTitle: trial.title, studioName: studio.name, link }) }));
  }
  for (const app of effects.declined) {
    await send(app, async (user) => ({ to: user.email, ...declinedMail({ name: user.name, trialTitle: trial.title, studioName: studio.name, link }) }));
  }
}
