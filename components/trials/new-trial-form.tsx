import { useRouter } from 'expo-router';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { describeApiError } from '@/components/forms/api-errors';
import { ApiError } from '@/hooks/api';
import { usePatterns } from '@/hooks/use-patterns';
import { createTrial } from '@/hooks/use-trials';

/** Starts a trial of one of the studio's patterns; the call, targets and dates are set on its page. */
export function NewTrialForm({ studioId }: { studioId: string }) {
  const router = useRouter();
  const { data: patterns } = usePatterns(studioId);
  const [patternId, setPatternId] = useState<string | null>(null);
  const [title, setTitle] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [failure, setFailure] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const usable = (patterns ?? []).filter((p) => !p.archived && p.sizes.length > 0);

  const submit = async () => {
    setBusy(true);
    setErrors({});
    setFailure(null);
    try {
      const trial = await createTrial(studioId, { patternId: patternId ?? '', title });
      router.push({ pathname: '/trials/[id]', params: { id: trial.id } });
    } catch (error) {
      if (error instanceof ApiError && error.fields) setErrors(error.fields);
      setFailure(describeApiError(error, { patternId: 'Pattern to test', title: 'Trial title' }, 'The trial could not be created.'));
    } finally {
      setBusy(false);
    }
  };

  return (
    <Card title="New trial">
      {usable.length === 0 ? <AppText variant="caption">A trial tests a pattern with a size chart: add one under Patterns first.</AppText> : null}
      <ChoiceGroup label="Pattern to test" options={usable.map((p) => ({ value: p.id, label: p.name }))} value={patternId} onChange={setPatternId} error={errors.patternId} />
      <TextField label="Trial title" hint="Shown on the public call, e.g. “Wide-leg trousers: first fit round”." value={title} onChangeText={setTitle} error={errors.title} />
      {failure ? <Notice tone="error">{failure}</Notice> : null}
      <Button label="Create trial" busyLabel="Creating…" busy={busy} onPress={submit} />
    </Card>
  );
}
