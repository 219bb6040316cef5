import dayjs from 'dayjs';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { colors, radius, space } from '@/constants/theme';
import { notesOf, personName, triageOf, useFindingActions, type FindingView, type TriageState } from '@/hooks/use-findings';
import { TRIAGE_LABELS, findingName } from './words';

type Props = {
  studioId: string;
  trialId: string;
  finding: FindingView;
  /** Drafts with reports, for "fixed in draft …". */
  drafts: readonly string[];
  canTriage: boolean;
};

const STATES: TriageState[] = ['open', 'will-fix', 'personal-fit', 'fixed'];

/** "Fixed in draft 3", "Will fix", … */
export function triageText(t: { state: TriageState; fixedInDraft?: number | null }): string {
  return t.state === 'fixed' && t.fixedInDraft != null ? `Fixed in draft ${t.fixedInDraft}` : TRIAGE_LABELS[t.state];
}

/** What the studio decided about a finding, and the notes of the people who looked at it. */
export function TriagePanel({ studioId, trialId, finding, drafts, canTriage }: Props) {
  const triage = triageOf(finding);
  const notes = notesOf(finding);
  const [state, setState] = useState<TriageState>(triage.state);
  const latest = drafts[drafts.length - 1];
  const [fixedIn, setFixedIn] = useState<string | undefined>(triage.fixedInDraft != null ? String(triage.fixedInDraft) : latest);
  const [saving, setSaving] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [note, setNote] = useState('');
  const [noteError, setNoteError] = useState<string | undefined>();
  const [posting, setPosting] = useState(false);
  const { setTriage, addNote } = useFindingActions(studioId, trialId);
  const who = { kind: finding.kind, direction: finding.direction };
  const changed = state !== triage.state || (state === 'fixed' && fixedIn !== (triage.fixedInDraft != null ? String(triage.fixedInDraft) : undefined));

  const save = async () => {
    setSaving(true);
    setError(null);
    try {
      await setTriage({ ...who, state, ...(state === 'fixed' && fixedIn ? { fixedInDraft: Number(fixedIn) } : {}) });
    } catch (e) {
      setError((e as Error).message);
    } finally {
      setSaving(false);
    }
  };

  const post = async () => {
    if (!note.trim()) {
      setNoteError('write something first');
      return;
    }
    setPosting(true);
    setNoteError(undefined);
    try {
      await addNote({ ...who, body: note.trim() });
      setNote('');
    } catch (e) {
      setNoteError((e as Error).message);
    } finally {
      setPosting(false);
    }
  };

  const by = personName(triage.updatedBy);
  return (
    <View style={styles.box}>
      <AppText variant="label">{`Triage: ${triageText(triage)}${by ? ` · ${by}` : ''}${triage.updatedAt ? `, ${dayjs(triage.updatedAt).format('D MMM YYYY')}` : ''}`}</AppText>
      {canTriage ? (
        <View style={styles.stack}>
          <ChoiceGroup label={`Triage of ${findingName(finding)}`} options={STATES.map((s) => ({ value: s, label: TRIAGE_LABELS[s] }))} value={state} onChange={setState} />
          {state === 'fixed' && drafts.length ? (
            <ChoiceGroup label="Fixed in draft" options={drafts.map((d) => ({ value: d, label: `Draft ${d}` }))} value={fixedIn} onChange={setFixedIn} />
          ) : null}
          {error ? <Notice tone="error">{`The triage was not saved: ${error}`}</Notice> : null}
          <Button label="Save the triage" busy={saving} busyLabel="Saving…" disabled={!changed} onPress={save} />
        </View>
      ) : null}
      <AppText variant="label">{notes.length ? `Notes (${notes.length})` : 'No notes yet.'}</AppText>
      {notes.map((n) => (
        <View key={n.id} style={styles.note}>
          <AppText variant="caption">{`${personName(n.author) ?? 'Someone'} · ${dayjs(n.createdAt).format('D MMM YYYY, HH:mm')}`}</AppText>
          <AppText>{n.body}</AppText>
        </View>
      ))}
      {canTriage ? (
        <View style={styles.stack}>
          <TextField label={`Note on ${findingName(finding)}`} value={note} onChangeText={setNote} multiline error={noteError} />
          <Button label="Add the note" tone="quiet" busy={posting} busyLabel="Adding…" onPress={post} />
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm, paddingTop: space.sm, borderTopWidth: 1, borderTopColor: colors.line },
  stack: { gap: space.sm },
  note: { gap: 2, padding: space.sm, borderRadius: radius.sm, backgroundColor: colors.surfaceSunken },
});
