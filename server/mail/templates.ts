/**
 * Basted's e-mails: each a subject, a plain-text body and a simple HTML body of our own.
 * Links are absolute, built from PUBLIC_URL.
 */
export type MailContent = { subject: string; text: string; html: string };

function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** The one-click link that turns this kind of mail off, with the words that say what it stops. */
export type OptOut = { url: string; what: string };

function layout(paragraphs: string[], action: { label: string; url: string }, footer: string, optOut?: OptOut): string {
  const body = paragraphs.map((p) => `<p style="margin:0 0 14px">${escapeHtml(p)}</p>`).join('');
  const stop = optOut
    ? `<p style="color:#5E5850;font-size:13px;margin:8px 0 0"><a href="${escapeHtml(optOut.url)}" style="color:#5E5850">Stop ${escapeHtml(optOut.what)}</a></p>`
    : '';
  return (
    `<div style="font-family:Helvetica,Arial,sans-serif;font-size:15px;line-height:1.5;color:#1F1D1A;max-width:560px">` +
    `<p style="font-weight:bold;color:#2E5E58;font-size:18px;margin:0 0 16px">Basted</p>${body}` +
    `<p style="margin:20px 0"><a href="${escapeHtml(action.url)}" style="background:#2E5E58;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(action.label)}</a></p>` +
    `<p style="color:#5E5850;font-size:13px;margin:0">${escapeHtml(footer)}</p>${stop}</div>`
  );
}

/** Plain text and HTML from the same parts, so the two never say different things. */
export function compose(subject: string, lines: string[], action: { label: string; url: string }, footer: string, optOut?: OptOut): MailContent {
  const stop = optOut ? `\n\nStop ${optOut.what}: ${optOut.url}` : '';
  return { subject, text: `${lines.join('\n\n')}\n\n${action.url}\n\n${footer}${stop}\n`, html: layout(lines, action, footer, optOut) };
}

export function passwordResetMail(input: { name: string; link: string; minutes: number }): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `Someone asked to reset the password of your Basted account. If it was you, choose a new password within ${input.minutes} minutes:`,
  ];
  const footer = 'If you did not ask for this, ignore this e-mail: your password stays as it is. The link works once.';
  return {
    subject: 'Reset your Basted password',
    text: `${lines.join('\n\n')}\n\n${input.link}\n\n${footer}\n`,
    html: layout(lines, { label: 'Choose a new password', url: input.link }, footer),
  };
}

export function confirmAddressMail(input: { name: string; link: string; hours: number }): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `Someone asked to create a Basted account with this e-mail address. If it was you, confirm the address within ${input.hours} hours to finish:`,
  ];
  const footer = 'If you did not ask for this, ignore this e-mail: no account is made without the link. The link works once.';
  return compose('Confirm your e-mail address for Basted', lines, { label: 'Confirm my address', url: input.link }, footer);
}

/** Sent instead of a confirmation when the address has an account already: the owner learns of it, the asker does not. */
export function accountExistsMail(input: { name: string; signInLink: string; resetLink: string }): MailContent {
  const lines = [
    `Hello ${input.name},`,
    'Someone asked to create a Basted account with this e-mail address, but it has one already: yours. Nothing was changed.',
    `If it was you, sign in instead. Forgot the password? Choose a new one here: ${input.resetLink}`,
  ];
  const footer = 'If it was not you, you can ignore this e-mail.';
  return compose('You already have a Basted account', lines, { label: 'Sign in', url: input.signInLink }, footer);
}

export function invitationMail(input: {
  studioName: string;
  roleLabel: string;
  inviterName: string;
  link: string;
  days: number;
}): MailContent {
  // The studio's name and the inviter's name are typed by the studio, not by Basted: they are quoted
  // as names, and the e-mail says what Basted itself never asks for.
  const lines = [
    `${input.inviterName} invites you to join the studio “${input.studioName}” on Basted as ${input.roleLabel.toLowerCase()}.`,
    `Open the invitation within ${input.days} days to accept it. If you have no Basted account yet, you can create one on the way.`,
  ];
  const footer =
    'If you were not expecting this invitation, you can ignore this e-mail. The studio and person names above were written by the studio; Basted never asks for your password by e-mail.';
  return {
    subject: `Invitation to the studio “${input.studioName}” on Basted`,
    text: `${lines.join('\n\n')}\n\n${input.link}\n\n${footer}\n`,
    html: layout(lines, { label: 'Open the invitation', url: input.link }, footer),
  };
}

type TrialMail = { name: string; trialTitle: string; studioName: string; link: string; optOut?: OptOut };

export function applicationReceivedMail(input: TrialMail & { closesOn: string | null }): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `${input.studioName} has your application to test "${input.trialTitle}". ${input.closesOn ? `Applications close on ${input.closesOn}; ` : ''}you will hear whether you are chosen once the studio has decided.`,
  ];
  const footer = 'You can withdraw your application at any time from My trials.';
  return compose(`Application received: ${input.trialTitle}`, lines, { label: 'Open My trials', url: input.link }, footer, input.optOut);
}

export function selectedMail(input: TrialMail & { sizeLabel: string; dueLines: string[] }): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `You are chosen to test "${input.trialTitle}" for ${input.studioName}, in size ${input.sizeLabel}. Thank you!`,
    ...(input.dueLines.length ? [`Your dates: ${input.dueLines.join('; ')}.`] : []),
  ];
  const footer = 'If your plans change, withdraw from My trials so that someone else can take your place.';
  return compose(`You are testing ${input.trialTitle}`, lines, { label: 'See your trial', url: input.link }, footer, input.optOut);
}

export function waitlistedMail(input: TrialMail): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `Every place in your size for "${input.trialTitle}" is taken for now, so ${input.studioName} has put you on the waiting list. If a place opens up in your size, it will be offered to you by e-mail.`,
  ];
  const footer = 'You can withdraw from the waiting list at any time from My trials.';
  return compose(`On the waiting list: ${input.trialTitle}`, lines, { label: 'Open My trials', url: input.link }, footer, input.optOut);
}

export function declinedMail(input: TrialMail): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `Thank you for applying to test "${input.trialTitle}". ${input.studioName} could not offer you a place this time: the trial needed testers in other sizes or heights.`,
  ];
  const footer = 'Your profile stays ready for the next call.';
  return compose(`About your application: ${input.trialTitle}`, lines, { label: 'Open My trials', url: input.link }, footer, input.optOut);
}

export function newDraftMail(input: TrialMail & { version: number; changeNote: string }): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `Draft ${input.version} of "${input.trialTitle}" is out. What changed: ${input.changeNote}`,
    'Download the new files from My trials before you cut: sew the newest draft unless the studio tells you otherwise.',
  ];
  const footer = 'You receive this because you are testing this pattern.';
  return compose(`New draft ${input.version}: ${input.trialTitle}`, lines, { label: 'Open My trials', url: input.link }, footer, input.optOut);
}

/** How far ahead a reminder is sent; the overdue one follows the due time. */
export type ReminderStage = '3d' | '1d' | 'day' | 'overdue';

export function reminderMail(
  input: TrialMail & { stage: ReminderStage; what: string; expectation: string; dueText: string; daysLeft?: number },
): MailContent {
  // The early reminder says how many days are really left: a tester chosen late gets it nearer the date.
  const left = Math.min(3, Math.max(1, input.daysLeft ?? 3));
  const inDays = left === 1 ? 'tomorrow' : `in ${left === 3 ? 'three' : 'two'} days`;
  const opening: Record<ReminderStage, string> = {
    '3d': `A friendly nudge: your ${input.what} for "${input.trialTitle}" is due ${inDays}, on ${input.dueText}.`,
    '1d': `Your ${input.what} for "${input.trialTitle}" is due tomorrow, on ${input.dueText}.`,
    day: `Your ${input.what} for "${input.trialTitle}" is due today, on ${input.dueText}.`,
    overdue: `Your ${input.what} for "${input.trialTitle}" was due on ${input.dueText} and has not reached ${input.studioName} yet.`,
  };
  const ask =
    input.stage === 'overdue'
      ? `If you need more time, tell ${input.studioName}: they can give you a new date. If you cannot finish, withdraw from My trials so that the studio knows.`
      : input.expectation;
  const lines = [`Hello ${input.name},`, opening[input.stage], ask];
  const subjects: Record<ReminderStage, string> = {
    '3d': `${left === 1 ? 'Due tomorrow' : `Due in ${left} days`}: ${input.what}, ${input.trialTitle}`,
    '1d': `Due tomorrow: ${input.what}, ${input.trialTitle}`,
    day: `Due today: ${input.what}, ${input.trialTitle}`,
    overdue: `Overdue: ${input.what}, ${input.trialTitle}`,
  };
  const footer = 'You receive this because you are testing this pattern and have not sent this part yet.';
  return compose(subjects[input.stage], lines, { label: 'Open My trials', url: input.link }, footer, input.optOut);
}

export type DigestLine = { trialTitle: string; tester: string; what: string; dueText: string; daysLate: number };

export function digestMail(input: { name: string; studioName: string; dateText: string; lines: DigestLine[]; link: string; optOut?: OptOut }): MailContent {
  const byTrial = new Map<string, DigestLine[]>();
  for (const l of input.lines) byTrial.set(l.trialTitle, [...(byTrial.get(l.trialTitle) ?? []), l]);
  const days = (n: number) => (n === 0 ? 'passed earlier today' : `${n} day${n === 1 ? '' : 's'} late`);
  const paragraphs = [
    `Hello ${input.name},`,
    `${input.lines.length} overdue ${input.lines.length === 1 ? 'item' : 'items'} in ${input.studioName} on ${input.dateText}:`,
    ...[...byTrial.entries()].map(([title, rows]) => `${title}: ${rows.map((r) => `${r.tester}, ${r.what}, due ${r.dueText} (${days(r.daysLate)})`).join('; ')}.`),
  ];
  const footer = 'Testers get their own reminders; this list is for the studio. Give more time from the Testers section of a trial.';
  return compose(`Overdue in ${input.studioName}: ${input.lines.length} ${input.lines.length === 1 ? 'item' : 'items'}`, paragraphs, { label: 'Open the trials', url: input.link }, footer, input.optOut);
}
