import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { describeApiError } from '@/components/forms/api-errors';
import { ApiError } from '@/hooks/api';
import { updateTrial, type TrialDetail } from '@/hooks/use-trials';
import { MILESTONE_KINDS, MILESTONE_LABELS, milestoneOrderProblems, TRIAL_STATE_LABELS, TRIAL_STATES, type MilestoneKind } from '@/server/domain/trials';
import { fromLocalText, LOCAL_FORMAT, toLocalText } from './dates';

type Props = { studioId: string; trial: TrialDetail; timeZone: string; canEdit: boolean };

/** The call's words, its state, and the timeline, with dates typed in the studio's time zone. */
export function CallEditor({ studioId, trial, timeZone, canEdit }: Props) {
  const [title, setTitle] = useState(trial.title);
  const [callText, setCallText] = useState(trial.callText);
  const [requirements, setRequirements] = useState(trial.requirements);
  const [state, setState] = useState(trial.state);
  const [dates, setDates] = useState<Record<string, string>>(() =>
    Object.fromEntries(trial.milestones.map((m) => [m.kind, toLocalText(m.dueAt, timeZone)])),
  );
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  // "Now" as of opening the editor: good enough to tell a past date, and stable across renders.
  const [openedAt] = useState(() => Date.now());
  const stored = Object.fromEntries(trial.milestones.map((m) => [m.kind, toLocalText(m.dueAt, timeZone)]));
  // A date changed here to one already past: worth a second look, but not refused (a running
  // trial's earlier dates are past by nature).
  const inThePast = (kind: MilestoneKind) => {
    const text = dates[kind]?.trim();
    if (!text || text === stored[kind]) return false;
    const iso = fromLocalText(text, timeZone);
    return iso !== null && new Date(iso).getTime() < openedAt;
  };

  const save = async () => {
    const milestones: Record<string, string> = {};
    const bad: Record<string, string> = {};
    for (const kind of MILESTONE_KINDS) {
      const text = dates[kind]?.trim();
      if (!text) continue;
      const iso = fromLocalText(text, timeZone);
      if (iso) milestones[kind] = iso;
      else bad[`milestones.${kind}`] = `write it as ${LOCAL_FORMAT}, e.g. 2027-03-01 18:00`;
    }
    setErrors(bad);
    if (Object.keys(bad).length) {
      setMessage({ tone: 'error', text: 'Some dates could not be read; nothing was saved.' });
      return;
    }
    const order = milestoneOrderProblems(milestones, (at) => toLocalText(at, timeZone));
    if (Object.keys(order).length) {
      setErrors(order);
      setMessage({ tone: 'error', text: 'The dates are out of order: each must come on or after the one before it. Nothing was saved.' });
      return;
    }
    const past = MILESTONE_KINDS.filter(inThePast).map((k) => MILESTONE_LABELS[k]);
    setBusy(true);
    setMessage(null);
    try {
      await updateTrial(studioId, trial.id, { title, callText, requirements, state, milestones });
      setMessage({ tone: 'success', text: past.length ? `Call and dates saved. In the past: ${past.join(', ')}.` : 'Call and dates saved.' });
    } catch (error) {
      if (error instanceof ApiError && error.fields) setErrors(error.fields);
      const labels = { title: 'Title', callText: 'Call for testers', requirements: 'Requirements', state: 'State', ...Object.fromEntries(MILESTONE_KINDS.map((k) => [`milestones.${k}`, MILESTONE_LABELS[k]])) };
      setMessage({ tone: 'error', text: describeApiError(error, labels, 'Not saved.') });
    } finally {
      setBusy(false);
    }
  };

  return (
    <Card title="Call and timeline">
      <TextField label="Title" value={title} onChangeText={setTitle} editable={canEdit} error={errors.title} />
      <TextField label="Call for testers" hint="What the pattern is and what testing it involves." value={callText} onChangeText={setCallText} editable={canEdit} multiline error={errors.callText} />
      <TextField label="Requirements" hint="Fabric, skills, photos, time." value={requirements} onChangeText={setRequirements} editable={canEdit} multiline error={errors.requirements} />
      <ChoiceGroup label="State" options={TRIAL_STATES.map((s) => ({ value: s, label: TRIAL_STATE_LABELS[s] }))} value={state} onChange={(s) => canEdit && setState(s)} error={errors.state} />
      <AppText variant="caption">{`Dates and times in the studio’s time zone, ${timeZone}, as ${LOCAL_FORMAT}, each on or after the one above it.`}</AppText>
      {MILESTONE_KINDS.map((kind) => (
        <TextField
          key={kind}
          label={MILESTONE_LABELS[kind]}
          value={dates[kind] ?? ''}
          onChangeText={(text) => setDates((d) => ({ ...d, [kind]: text }))}
          placeholder="2027-03-01 18:00"
          editable={canEdit}
          hint={inThePast(kind) ? 'This date is in the past: check it before saving.' : undefined}
          error={errors[`milestones.${kind}`]}
        />
      ))}
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      {canEdit ? <Button label="Save call and dates" busyLabel="Saving…" busy={busy} onPress={save} /> : null}
    </Card>
  );
}
