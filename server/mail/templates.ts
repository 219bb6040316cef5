/**
 * Basted's e-mails: each a subject, a plain-text body and a simple HTML body of our own.
 * Links are absolute, built from PUBLIC_URL.
 */
export type MailContent = { subject: string; text: string; html: string };

function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function layout(paragraphs: string[], action: { label: string; url: string }, footer: string): string {
  const body = paragraphs.map((p) => `<p style="margin:0 0 14px">${escapeHtml(p)}</p>`).join('');
  return (
    `<div style="font-family:Helvetica,Arial,sans-serif;font-size:15px;line-height:1.5;color:#1F1D1A;max-width:560px">` +
    `<p style="font-weight:bold;color:#2E5E58;font-size:18px;margin:0 0 16px">Basted</p>${body}` +
    `<p style="margin:20px 0"><a href="${escapeHtml(action.url)}" style="background:#2E5E58;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(action.label)}</a></p>` +
    `<p style="color:#5E5850;font-size:13px;margin:0">${escapeHtml(footer)}</p></div>`
  );
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

export function invitationMail(input: {
  studioName: string;
  roleLabel: string;
  inviterName: string;
  link: string;
  days: number;
}): MailContent {
  const lines = [
    `${input.inviterName} invites you to join ${input.studioName} on Basted as ${input.roleLabel.toLowerCase()}.`,
    `Open the invitation within ${input.days} days to accept it. If you have no Basted account yet, you can create one on the way.`,
  ];
  const footer = 'If you were not expecting this invitation, you can ignore this e-mail.';
  return {
    subject: `Invitation to ${input.studioName} on Basted`,
    text: `${lines.join('\n\n')}\n\n${input.link}\n\n${footer}\n`,
    html: layout(lines, { label: 'Open the invitation', url: input.link }, footer),
  };
}

type TrialMail = { name: string; trialTitle: string; studioName: string; link: string };

export function applicationReceivedMail(input: TrialMail & { closesOn: string | null }): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `${input.studioName} has your application to test "${input.trialTitle}". ${input.closesOn ? `Applications close on ${input.closesOn}; ` : ''}you will hear whether you are chosen once the studio has decided.`,
  ];
  const footer = 'You can withdraw your application at any time from My trials.';
  return { subject: `Application received: ${input.trialTitle}`, text: `${lines.join('\n\n')}\n\n${input.link}\n\n${footer}\n`, html: layout(lines, { label: 'Open My trials', url: input.link }, footer) };
}

export function selectedMail(input: TrialMail & { sizeLabel: string; dueLines: string[] }): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `You are chosen to test "${input.trialTitle}" for ${input.studioName}, in size ${input.sizeLabel}. Thank you!`,
    ...(input.dueLines.length ? [`Your dates: ${input.dueLines.join('; ')}.`] : []),
  ];
  const footer = 'If your plans change, withdraw from My trials so that someone else can take your place.';
  return { subject: `You are testing ${input.trialTitle}`, text: `${lines.join('\n\n')}\n\n${input.link}\n\n${footer}\n`, html: layout(lines, { label: 'See your trial', url: input.link }, footer) };
}

export function waitlistedMail(input: TrialMail): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `Every place in your size for "${input.trialTitle}" is taken for now, so ${input.studioName} has put you on the waiting list. If a place opens up in your size, it will be offered to you by e-mail.`,
  ];
  const footer = 'You can withdraw from the waiting list at any time from My trials.';
  return { subject: `On the waiting list: ${input.trialTitle}`, text: `${lines.join('\n\n')}\n\n${input.link}\n\n${footer}\n`, html: layout(lines, { label: 'Open My trials', url: input.link }, footer) };
}

export function declinedMail(input: TrialMail): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `Thank you for applying to test "${input.trialTitle}". ${input.studioName} could not offer you a place this time: the trial needed testers in other sizes or heights.`,
  ];
  const footer = 'Your profile stays ready for the next call.';
  return { subject: `About your application: ${input.trialTitle}`, text: `${lines.join('\n\n')}\n\n${input.link}\n\n${footer}\n`, html: layout(lines, { label: 'Open My trials', url: input.link }, footer) };
}

export function newDraftMail(input: TrialMail & { version: number; changeNote: string }): MailContent {
  const lines = [
    `Hello ${input.name},`,
    `Draft ${input.version} of "${input.trialTitle}" is out. What changed: ${input.changeNote}`,
    'Download the new files from My trials before you cut: sew the newest draft unless the studio tells you otherwise.',
  ];
  const footer = 'You receive this because you are testing this pattern.';
  return { subject: `New draft ${input.version}: ${input.trialTitle}`, text: `${lines.join('\n\n')}\n\n${input.link}\n\n${footer}\n`, html: layout(lines, { label: 'Open My trials', url: input.link }, footer) };
}
