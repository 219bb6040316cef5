import { PatternSize, User, type Application, type Trial } from '../../db/models';
import type { Config } from '../config';
import { MILESTONE_LABELS, TESTER_MILESTONES } from '../domain/trials';
import type { Mailer } from '../mail/mailer';
import { declinedMail, selectedMail, waitlistedMail, type MailContent, type OptOut } from '../mail/templates';
import { optOutFor, send as sendMail } from '../outbox/outbox.service';
import type { DecisionEffects } from './trials.service';
import { milestoneMap, studioOf } from './trials.service';

/** A date and time in words, in the given time zone (the tester's or the studio's). */
const DUE_FORMATS = new Map<string, Intl.DateTimeFormat>();

/** A due time in a zone's words; one formatter per zone, made once (thousands of reminders a sweep). */
export function formatDue(date: Date, timeZone: string): string {
  let format = DUE_FORMATS.get(timeZone);
  if (!format) {
    format = new Intl.DateTimeFormat('en-GB', { dateStyle: 'full', timeStyle: 'short', timeZone });
    DUE_FORMATS.set(timeZone, format);
  }
  return format.format(date);
}

/**
 * Tells each applicant of a decision. Runs after the decision is committed, through the outbox:
 * a mail that cannot be sent now stays queued for the worker's retries and does not undo the
 * decision.
 */
export async function sendDecisionMail(trial: Trial, effects: DecisionEffects, deps: { config: Config; mailer: Mailer }) {
  const studio = await studioOf(trial);
  const link = `${deps.config.publicUrl}/my-trials`;
  const dues = milestoneMap(trial);
  const send = async (app: Application, build: (user: User, optOut: OptOut | undefined) => Promise<MailContent>) => {
    const user = await User.findByPk(app.userId);
    if (!user) return;
    try {
      await sendMail(deps, {
        // One message per decision: the same decision taken again later is a new message.
        key: `decision:${app.id}:${app.status}:${app.decidedAt?.getTime() ?? 0}`,
        to: { id: user.id, email: user.email },
        template: app.status,
        category: 'trial-news',
        studioId: trial.studioId,
        trialId: trial.id,
        content: await build(user, optOutFor(deps.config, user.id, 'trial-news')),
      });
    } catch (error) {
      console.error(`[mail] decision mail to ${user.email} not recorded:`, error);
    }
  };
  for (const app of effects.selected) {
    await send(app, async (user, optOut) => {
      const size = app.sizeId ? await PatternSize.findByPk(app.sizeId) : null;
      const dueLines = TESTER_MILESTONES.flatMap((kind) => (dues[kind] ? [`${MILESTONE_LABELS[kind]}: ${formatDue(dues[kind]!, user.timeZone)}`] : []));
      return selectedMail({ name: user.name, trialTitle: trial.title, studioName: studio.name, link, sizeLabel: size?.label ?? '?', dueLines, optOut });
    });
  }
  for (const app of effects.waitlisted) {
    await send(app, async (user, optOut) => waitlistedMail({ name: user.name, trialTitle: trial.title, studioName: studio.name, link, optOut }));
  }
  for (const app of effects.declined) {
    await send(app, async (user, optOut) => declinedMail({ name: user.name, trialTitle: trial.title, studioName: studio.name, link, optOut }));
  }
}
