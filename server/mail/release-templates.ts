/**
 * The e-mails that close a trial and keep the studio in touch with its testers: thanks with the
 * final files, a reward code, a closing note for those who did not finish, the studio's own
 * announcements and invitations to a new call.
 */
import { compose, type MailContent, type OptOut } from './templates';

type Base = { name: string; trialTitle: string; studioName: string; link: string; optOut?: OptOut };

export function releaseThanksMail(input: Base & { finalVersion: number; fileCount: number }): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `"${input.trialTitle}" is released. Thank you for sewing it and telling ${input.studioName} how it fits: your report is part of the final pattern.`,
    input.fileCount > 0
      ? `Draft ${input.finalVersion} is the final pattern. Its ${input.fileCount === 1 ? 'file is' : `${input.fileCount} files are`} waiting for you in My trials; each download link there works for a few minutes after you ask for it.`
      : 'The final files will be in My trials as soon as the studio adds them.',
  ];
  const footer = 'You receive this because you finished this trial.';
  return compose(`Released, with thanks: ${input.trialTitle}`, lines, { label: 'Get the final files', url: input.link }, footer, input.optOut);
}

export function rewardCodeMail(input: Base & { code: string }): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `As a thank-you for testing "${input.trialTitle}", ${input.studioName} has a reward for you. Your code:`,
    input.code,
    'It is yours alone; it is also kept in My trials.',
  ];
  const footer = 'You receive this because you finished this trial.';
  return compose(`Your reward code: ${input.trialTitle}`, lines, { label: 'Open My trials', url: input.link }, footer, input.optOut);
}

export function closingNoteMail(input: Base): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `"${input.trialTitle}" is released. We know sewing time is hard to find and plans change: thank you for taking part as far as you could.`,
    `${input.studioName} would be glad to see you in a future call.`,
  ];
  const footer = 'You receive this because you were a tester of this trial.';
  return compose(`Closing: ${input.trialTitle}`, lines, { label: 'Open My trials', url: input.link }, footer, input.optOut);
}

export function announcementMail(input: Base & { subject: string; body: string; replyTo: string }): MailContent {
  const paragraphs = input.body
    .split(/\n\s*\n/)
    .map((p) => p.trim())
    .filter(Boolean);
  const lines = [`Hello ${input.name},`, ...paragraphs];
  const footer = `From ${input.studioName} about "${input.trialTitle}". Reply to this e-mail to write to the studio (${input.replyTo}); the message is also kept in My trials.`;
  return compose(`${input.subject} (${input.trialTitle})`, lines, { label: 'Open My trials', url: input.link }, footer, input.optOut);
}

export function poolInvitationMail(input: Base & { closesOn: string | null }): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `You tested for ${input.studioName} before, and they would love to have you again: the call "${input.trialTitle}" is open.`,
    `Read the call and apply if it suits you${input.closesOn ? ` (applications close on ${input.closesOn})` : ''}; the studio still chooses among everyone who applies.`,
  ];
  const footer = 'You receive this because you tested for this studio.';
  return compose(`Invitation to apply: ${input.trialTitle}`, lines, { label: 'Read the call', url: input.link }, footer, input.optOut);
}
