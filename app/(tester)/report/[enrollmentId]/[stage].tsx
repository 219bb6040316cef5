import { useLocalSearchParams } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, Switch, View } from 'react-native';
import { PhotosSection } from '@/components/photos/photos-section';
import { AlterationsEditor } from '@/components/reports/alterations-editor';
import { FabricUsedEditor } from '@/components/reports/fabric-used-editor';
import { describeInstant } from '@/components/trials/dates';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { colors, space } from '@/constants/theme';
import { useReport } from '@/hooks/use-report';
import { useSession } from '@/hooks/use-session';
import { useMyTrials } from '@/hooks/use-trials';
import { FIT_SCALE, fitAreasFor } from '@/server/domain/alterations';
import type { GarmentCategory } from '@/server/domain/garments';
import type { ReportDraft } from '@/server/domain/schemas/reports';

/** A tester's check-in or final report, saved as they go. */
export default function ReportScreen() {
  const { enrollmentId, stage } = useLocalSearchParams<{ enrollmentId: string; stage: 'check-in' | 'final' }>();
  const { session } = useSession();
  const { data: trials } = useMyTrials();
  const { report, error, reload, change, status, submit } = useReport(enrollmentId, stage);
  const [local, setLocal] = useState<ReportDraft | null>(null);
  const [submitted, setSubmitted] = useState<{ tone: 'success' | 'error'; text: string; fields?: Record<string, string> } | null>(null);
  const mine = trials?.find((t) => t.enrollment?.id === enrollmentId);

  if (error) return <Screen title="Report"><LoadError error={error} onRetry={() => reload()} /></Screen>;
  if (!report || !session || !trials) return <Loading label="Opening your report…" />;
  if (!mine) return <Screen title="Report"><Notice tone="error">This report is not one of yours.</Notice></Screen>;

  const content = local ?? report.content;
  const readOnly = !report.editable;
  const update = (parts: Partial<ReportDraft>) => {
    setLocal({ ...content, ...parts });
    change(parts);
  };
  const category = mine.trial.category as GarmentCategory;
  const unit = session.user.lengthUnit;
  const choices = report.choices;
  const title = stage === 'final' ? 'Final report' : 'Toile check-in';
  const fieldErrors = { ...(status.fields ?? {}), ...(submitted?.fields ?? {}) };

  return (
    <Screen title={`${title}: ${mine.trial.title}`} intro={report.dueAt ? `Due ${describeInstant(report.dueAt, session.user.timeZone)}. Saved as you type; you can change it until then.` : 'Saved as you type.'}>
      <View aria-live="polite" role="status">
        <AppText variant="caption" style={status.state === 'error' ? styles.warn : undefined}>
          {status.state === 'saving' ? 'Saving…' : status.state === 'saved' ? 'All changes saved.' : status.state === 'error' ? `Not saved: ${status.message}` : report.submittedAt ? `Submitted ${describeInstant(report.submittedAt, session.user.timeZone)}.` : 'Not submitted yet.'}
        </AppText>
      </View>
      {readOnly ? <Notice tone="info">The due time has passed: this report can no longer be changed. Ask the studio if you need more time.</Notice> : null}
      <Card title="What you sewed">
        <TextField label="Size sewn" value={content.sizeSewn ?? ''} editable={!readOnly} onChangeText={(sizeSewn) => update({ sizeSewn })} error={fieldErrors.sizeSewn} hint={mine.size ? `You were chosen for size ${mine.size.label}${choices?.sizes.length ? ` (chart sizes: ${choices.sizes.join(', ')})` : ''}; say if you blended sizes, e.g. “10 waist, 12 hip”.` : undefined} />
        {choices?.drafts.length ? (
          <ChoiceGroup
            label="Draft version sewn"
            options={choices.drafts.map((d) => ({ value: String(d.version), label: `Draft ${d.version}` }))}
            value={content.draftVersion == null ? null : String(content.draftVersion)}
            onChange={(v) => !readOnly && update({ draftVersion: Number(v) })}
            error={fieldErrors.draftVersion}
          />
        ) : (
          <TextField
            label="Draft version sewn"
            value={content.draftVersion == null ? '' : String(content.draftVersion)}
            editable={!readOnly}
            inputMode="numeric"
            onChangeText={(text) => update({ draftVersion: /^\d+$/.test(text.trim()) ? Number(text) : null })}
            error={fieldErrors.draftVersion}
          />
        )}
        {choices?.variants.length ? (
          <ChoiceGroup
            label="Variant sewn"
            options={[{ value: '', label: 'The main pattern' }, ...choices.variants.map((v) => ({ value: v, label: v }))]}
            value={content.variantSewn === undefined ? null : (content.variantSewn ?? '')}
            onChange={(v) => !readOnly && update({ variantSewn: v === '' ? null : v })}
            error={fieldErrors.variantSewn}
          />
        ) : null}
      </Card>
      <Card title="Fit">
        {fieldErrors.fit ? <AppText variant="caption" style={styles.warn}>{`Fit: ${fieldErrors.fit}`}</AppText> : null}
        {fitAreasFor(category).map((area) => (
          <ChoiceGroup
            key={area}
            label={`Fit at the ${area}`}
            options={FIT_SCALE.map((s) => ({ value: String(s.value), label: `${s.value > 0 ? '+' : ''}${s.value} ${s.label}` }))}
            value={content.fit?.[area] == null ? null : String(content.fit[area])}
            onChange={(v) => !readOnly && update({ fit: { ...(content.fit ?? {}), [area]: Number(v) } })}
          />
        ))}
      </Card>
      <Card title="Alterations you made">
        <AlterationsEditor category={category} value={content.alterations ?? []} unit={unit} readOnly={readOnly} onChange={(alterations) => update({ alterations })} errors={fieldErrors} />
      </Card>
      <Card title="Fabric used">
        <FabricUsedEditor value={content.fabric} lengthUnit={unit} fabricUnit={session.user.fabricUnit} readOnly={readOnly} onChange={(fabric) => update({ fabric })} errors={fieldErrors} />
      </Card>
      <Card title="Instructions">
        <AppText variant="caption">Steps that confused you: the step number and what was unclear.</AppText>
        {(content.unclearSteps ?? []).map((s, i) => (
          <View key={i} style={styles.step}>
            <TextField label={`Unclear step ${i + 1}: number`} value={s.step} editable={!readOnly} onChangeText={(step) => update({ unclearSteps: (content.unclearSteps ?? []).map((x, j) => (j === i ? { ...x, step } : x)) })} />
            <TextField label={`Unclear step ${i + 1}: what was unclear`} value={s.problem} editable={!readOnly} multiline onChangeText={(problem) => update({ unclearSteps: (content.unclearSteps ?? []).map((x, j) => (j === i ? { ...x, problem } : x)) })} />
          </View>
        ))}
        {!readOnly ? <Button label="Add a step" tone="quiet" onPress={() => update({ unclearSteps: [...(content.unclearSteps ?? []), { step: '', problem: '' }] })} /> : null}
      </Card>
      <Card title="Photos">
        <PhotosSection enrollmentId={enrollmentId} stage={stage} readOnly={readOnly} />
      </Card>
      <Card title="Verdict">
        <TextField label="Overall verdict" value={content.verdict ?? ''} editable={!readOnly} multiline onChangeText={(verdict) => update({ verdict })} error={fieldErrors.verdict} />
        <View style={styles.switchRow}>
          <Switch aria-label="I would make it again" disabled={readOnly} value={content.wouldMakeAgain ?? false} onValueChange={(wouldMakeAgain) => update({ wouldMakeAgain })} trackColor={{ true: colors.thread, false: colors.line }} />
          <AppText>I would make it again</AppText>
        </View>
      </Card>
      {submitted ? <Notice tone={submitted.tone}>{submitted.text}</Notice> : null}
      {!readOnly ? (
        <Button
          label={report.submittedAt ? 'Submit again with these changes' : `Submit the ${title.toLowerCase()}`}
          onPress={async () => {
            try {
              await submit();
              setSubmitted({ tone: 'success', text: 'Submitted. Thank you! You can still change it until the due time.' });
            } catch (e) {
              const fields = e && typeof e === 'object' && 'fields' in e ? (e.fields as Record<string, string> | undefined) : undefined;
              setSubmitted({ tone: 'error', text: e instanceof Error ? e.message : 'Not submitted.', fields });
            }
          }}
        />
      ) : null}
    </Screen>
  );
}

const styles = StyleSheet.create({
  warn: { color: colors.warning },
  step: { gap: space.xs },
  switchRow: { flexDirection: 'row', alignItems: 'center', gap: space.md, minHeight: 44 },
});
