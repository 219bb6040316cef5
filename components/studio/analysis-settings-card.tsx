import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import useSWR, { mutate } from 'swr';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { space } from '@/constants/theme';
import { api, ApiError } from '@/hooks/api';
import { DEFAULT_THRESHOLDS } from '@/server/analysis/thresholds';
import type { AnalysisSettings } from '@/server/domain/studio-settings';

type StudioWithSettings = { id: string; settings: { analysis?: AnalysisSettings } };
type Key = keyof AnalysisSettings;

/** The thresholds a studio may change, in the words of the findings they decide. */
export const THRESHOLD_LABELS: { key: Key; label: string; hint: string }[] = [
  {
    key: 'alpha',
    label: 'Error level',
    hint: 'How often, at most, a finding may be a false alarm. Every test of an alteration is counted together, and the alterations of a draft too, so a trial with nothing wrong shows a finding in well under 1 in 10 trials (measured by npm run -s analyze:calibrate).',
  },
  { key: 'minTestersPerDraft', label: 'Fewest testers for findings', hint: 'Below this many reports on a draft, every finding says “too few to judge”.' },
  { key: 'minMakers', label: 'Fewest testers who made a change', hint: 'A change made by fewer testers than this can never point at the pattern: one body or one sewing choice must not decide it.' },
  { key: 'gradingMinMakerSizes', label: 'Grading: sizes with a tester who made it', hint: 'A trend with size needs makers in at least this many sizes; one size alone is a standout size, not a trend.' },
  { key: 'personalFitMinAbsR', label: 'Personal fit: correlation with the body', hint: 'How closely the changes must follow the testers’ own measurements (0 to 1).' },
  { key: 'personalFitMinPairs', label: 'Personal fit: fewest testers', hint: 'Testers whose body measurement for the change is known.' },
  { key: 'draftWideMinLowerBound', label: 'Whole draft: rate to exceed', hint: 'The share of testers making the change must be shown to be above this (0 to 1).' },
  { key: 'draftWideMinDirectionShare', label: 'Whole draft: share in one direction', hint: 'Of the testers who made the change, the share who made it the same way (0 to 1).' },
  { key: 'sizeSpecificMinCount', label: 'One size: fewest testers who made it', hint: 'A size stands out only if at least this many of its testers made the change.' },
  { key: 'compareMinTesters', label: 'Draft comparison: fewest testers in the later draft', hint: 'Fewer reports say “not enough data yet”.' },
  { key: 'fitFlagMinAbsMean', label: 'Fit ratings: a size is off beyond', hint: 'On the −2 … +2 scale; with few ratings it is a hint to look at, confirmed only with enough of them.' },
  { key: 'fitAreaMinAbsMean', label: 'Fit ratings: an area is off across the range beyond', hint: 'On the −2 … +2 scale, the mean over every size.' },
  { key: 'fabricShortShare', label: 'Fabric: share of testers who needed more', hint: 'Flag a size when more than this share used more than the stated length (0 to 1).' },
  { key: 'fabricMinOver', label: 'Fabric: fewest testers who needed more', hint: 'One generous cutter is not a short yardage.' },
  { key: 'unclearStepMinTesters', label: 'Instructions: testers who found a step unclear', hint: 'Flag a step named by at least this many testers.' },
];

/** The owner tunes the findings' thresholds; everyone on the staff sees which are in force. */
export function AnalysisSettingsCard({ studioId, canEdit }: { studioId: string; canEdit: boolean }) {
  const key = `/api/studios/${studioId}`;
  const { data } = useSWR<StudioWithSettings>(key);
  const [typed, setTyped] = useState<Partial<Record<Key, string>>>({});
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string; fields?: Record<string, string> } | null>(null);
  if (!data?.settings) return null;
  const stored = data.settings.analysis ?? {};

  const send = async (patch: Partial<Record<Key, number | null>>) => {
    setMessage(null);
    try {
      await mutate(key, await api<StudioWithSettings>(key, { method: 'PATCH', body: { settings: { analysis: patch } } }), { revalidate: false });
      setTyped({});
      setMessage({ tone: 'success', text: 'Thresholds saved. The findings are computed again with them.' });
    } catch (error) {
      setMessage({ tone: 'error', text: error instanceof Error ? error.message : 'Not saved.', fields: error instanceof ApiError ? error.fields : undefined });
    }
  };
  const save = () => {
    const patch: Partial<Record<Key, number | null>> = {};
    const unreadable: Record<string, string> = {};
    for (const [k, text] of Object.entries(typed) as [Key, string][]) {
      if (text.trim() === '') patch[k] = null;
      else if (Number.isFinite(Number(text))) patch[k] = Number(text);
      else unreadable[`settings.analysis.${k}`] = 'must be a number';
    }
    if (Object.keys(unreadable).length) setMessage({ tone: 'error', text: 'Some thresholds are not numbers; nothing was saved.', fields: unreadable });
    else void send(patch);
  };

  return (
    <Card title="Thresholds of the findings">
      <AppText variant="caption">
        {canEdit ? 'Leave a field empty to use the default. Changes apply to every trial of the studio.' : 'Set by the studio owner. An empty field uses the default.'}
      </AppText>
      {THRESHOLD_LABELS.map(({ key: k, label, hint }) => (
        <View key={k} style={styles.row}>
          <TextField
            label={label}
            hint={`${hint} Default ${DEFAULT_THRESHOLDS[k]}.`}
            inputMode="decimal"
            editable={canEdit}
            placeholder={String(DEFAULT_THRESHOLDS[k])}
            value={typed[k] ?? (stored[k] === undefined ? '' : String(stored[k]))}
            onChangeText={(text) => setTyped((t) => ({ ...t, [k]: text }))}
            error={message?.fields?.[`settings.analysis.${k}`]}
          />
        </View>
      ))}
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      {canEdit ? (
        <View style={styles.actions}>
          <Button label="Save thresholds" onPress={save} disabled={Object.keys(typed).length === 0} />
          <Button label="Use every default" tone="quiet" onPress={() => void send(Object.fromEntries(Object.keys(stored).map((k) => [k, null])))} disabled={Object.keys(stored).length === 0} />
        </View>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  row: { gap: space.xs },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
