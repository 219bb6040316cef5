import { useState } from 'react';
import { StyleSheet } from 'react-native';
import useSWR from 'swr';
import { AdviceView } from '@/components/patterns/advice-view';
import { Button } from '@/components/ui/button';
import { ButtonLink } from '@/components/ui/button-link';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { SwitchField } from '@/components/ui/switch-field';
import { TextField } from '@/components/ui/text-field';
import { colors } from '@/constants/theme';
import { describeApiError } from '@/components/forms/api-errors';
import { ApiError } from '@/hooks/api';
import { useProfile } from '@/hooks/use-profile';
import { applyToCall, trialKeys, type PublicCall } from '@/hooks/use-trials';
import { fabricExamples } from '@/server/domain/category-wording';
import { EXPERIENCE_LABELS, EXPERIENCE_LEVELS, type Experience } from '@/server/domain/schemas/profile';
import type { SizeAdvice } from '@/server/domain/size-advice';

type Props = { call: PublicCall; describeDue: (iso: string) => string };

/** The form's labels, for naming refused answers in the banner. */
const APPLY_LABELS: Record<string, string> = {
  sizeId: 'Size you will sew',
  variantId: 'Variant',
  plannedFabric: 'Fabric you plan to use',
  experience: 'Sewing experience',
  deadlinesConfirmed: 'Deadlines',
  photoConsent: 'Who may see your photos',
  note: 'Anything else',
};

/** The application: prefilled from the profile, with the tester's size advice beside it. */
export function ApplyForm({ call, describeDue }: Props) {
  const { data: mine } = useSWR<{ measurementsMm: Record<string, number>; advice: SizeAdvice }>(`${trialKeys.call(call.slug)}/my-advice`);
  const advised = mine?.advice.size && call.sizes.some((s) => s.id === mine.advice.size!.id) ? mine.advice.size.id : null;
  const [sizeId, setSizeId] = useState<string | null>(null);
  const [variantId, setVariantId] = useState<string | null>(null);
  const [plannedFabric, setPlannedFabric] = useState('');
  const { data: profile } = useProfile();
  const [chosenExperience, setExperience] = useState<Experience | null>(null);
  // Prefilled from the profile until the tester picks another level.
  const experience = chosenExperience ?? ((profile?.experience as Experience | null | undefined) ?? null);
  const [confirmed, setConfirmed] = useState(false);
  const [photoConsent, setPhotoConsent] = useState<'staff-only' | 'may-share' | null>(null);
  const [note, setNote] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [result, setResult] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const [done, setDone] = useState(false);

  const submit = async () => {
    setBusy(true);
    setErrors({});
    setResult(null);
    try {
      await applyToCall(call.slug, {
        sizeId: sizeId ?? advised,
        variantId,
        plannedFabric,
        experience: experience as Experience,
        deadlinesConfirmed: confirmed as true,
        photoConsent: photoConsent as 'staff-only',
        note: note.trim() || null,
      });
      setDone(true);
      setResult({ tone: 'success', text: 'Application sent. The studio will let you know by e-mail.' });
    } catch (error) {
      if (error instanceof ApiError && error.fields) setErrors(error.fields);
      setResult({ tone: 'error', text: describeApiError(error, APPLY_LABELS, 'Not sent.') });
    } finally {
      setBusy(false);
    }
  };

  if (done && result) {
    return (
      <Card title="Applied">
        <Notice tone="success">{result.text}</Notice>
        <ButtonLink href="/my-trials" label="See My trials" />
      </Card>
    );
  }

  return (
    <Card title="Apply">
      {mine ? (
        Object.keys(mine.measurementsMm).length ? (
          <AdviceView advice={mine.advice} />
        ) : (
          <Notice tone="info">Your profile has no measurements yet: add them for size advice, and so the studio can see your fit.</Notice>
        )
      ) : null}
      <ButtonLink href="/profile" label="Check my measurements" tone="quiet" />
      <ChoiceGroup label="Size you will sew" options={call.sizes.map((s) => ({ value: s.id, label: s.label }))} value={sizeId ?? advised} onChange={setSizeId} error={errors.sizeId} />
      {call.variants.length ? (
        <ChoiceGroup label="Variant" options={[{ value: '', label: 'None' }, ...call.variants.map((v) => ({ value: v.id, label: v.name }))]} value={variantId ?? ''} onChange={(v) => setVariantId(v || null)} error={errors.variantId} />
      ) : null}
      <TextField label="Fabric you plan to use" hint={`Kind, fibre, weight; e.g. ${fabricExamples(call.pattern.fabricKind)}.`} value={plannedFabric} onChangeText={setPlannedFabric} error={errors.plannedFabric} />
      <ChoiceGroup label="Sewing experience" options={EXPERIENCE_LEVELS.map((e) => ({ value: e, label: EXPERIENCE_LABELS[e] }))} value={experience} onChange={setExperience} error={errors.experience} />
      <AppText variant="label">Deadlines</AppText>
      {call.milestones.filter((m) => m.kind === 'toile-check-in' || m.kind === 'final-report').map((m) => (
        <AppText key={m.kind} variant="caption">{`${m.label}: ${describeDue(m.dueAt)}`}</AppText>
      ))}
      <SwitchField label="I can meet these deadlines" value={confirmed} onValueChange={setConfirmed} />
      {errors.deadlinesConfirmed ? <AppText variant="caption" style={styles.warn}>{`Deadlines: ${errors.deadlinesConfirmed}`}</AppText> : null}
      <ChoiceGroup
        label="Who may see your photos"
        options={[
          { value: 'staff-only', label: 'Only the trial’s staff' },
          { value: 'may-share', label: 'The studio may share them' },
        ]}
        value={photoConsent}
        onChange={setPhotoConsent}
        error={errors.photoConsent}
      />
      <TextField label="Anything else (optional)" value={note} onChangeText={setNote} multiline error={errors.note} />
      {result ? <Notice tone={result.tone}>{result.text}</Notice> : null}
      <Button label="Send application" busyLabel="Sending…" busy={busy} onPress={submit} />
    </Card>
  );
}

const styles = StyleSheet.create({
  warn: { color: colors.warning },
});
