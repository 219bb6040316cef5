import { useLocalSearchParams } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { PhotosSection } from '@/components/photos/photos-section';
import { AlterationsEditor } from '@/components/reports/alterations-editor';
import { FabricUsedEditor } from '@/components/reports/fabric-used-editor';
import { describeFields, PART_LABELS, SaveStatusBar } from '@/components/reports/save-status';
import { describeInstant } from '@/components/trials/dates';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { SwitchField } from '@/components/ui/switch-field';
import { TextField } from '@/components/ui/text-field';
import { colors, fonts, space } from '@/constants/theme';
import { ApiError } from '@/hooks/api';
import { useReport } from '@/hooks/use-report';
import { useSession } from '@/hooks/use-session';
import { useMyTrials } from '@/hooks/use-trials';
import { FIT_SCALE, fitAreasFor } from '@/server/domain/alterations';
import type { GarmentCategory } from '@/server/domain/garments';
import type { ReportDraft } from '@/server/domain/schemas/reports';

type Outcome = { tone: 'success' | 'error'; text: string; fields?: Record<string, string> };

/** A tester's check-in or final report, saved as they go; once submitted, shown as sent until they choose to change it. */
export default function ReportScreen() {
  const { enrollmentId, stage } = useLocalSearchParams<{ enrollmentId: string; stage: 'check-in' | 'final' }>();
  const { session } = useSession();
  const { data: trials } = useMyTrials();
  const { report, content, status, unsaved, restored, conflict, error, reload, change, retry, submit } = useReport(enrollmentId, stage);
  const [outcome, setOutcome] = useState<Outcome | null>(null);
  const [busy, setBusy] = useState(false);
  const [editing, setEditing] = useState(false);
  // A step just added from its button: its first field takes the focus.
  const [addedStep, setAddedStep] = useState<number | null>(null);
  // Typed text that could not be read, by field label: it is not data yet, so submitting waits.
  const [unreadable, setUnreadable] = useState<Record<string, string>>({});
  const mine = trials?.find((t) => t.enrollment?.id === enrollmentId);

  if (error && !report) return <Screen title="Report"><LoadError error={error} onRetry={() => reload()} /></Screen>;
  if (!report || !session || !trials) return <Loading label="Opening your report…" />;
  if (!mine) return <Screen title="Report"><Notice tone="error">This report is not one of yours.</Notice></Screen>;

  const zone = session.user.timeZone;
  const submitted = Boolean(report.submittedAt);
  // A sent report opens as sent; the tester changes it on purpose (until the due time).
  const readOnly = !report.editable || (submitted && !editing && unsaved.length === 0);
  const update = (parts: Partial<ReportDraft>) => {
    setOutcome(null);
    change(parts);
  };
  const noteUnreadable = (label: string, message: string | null) =>
    setUnreadable((now) => {
      if (message === null) {
        if (!(label in now)) return now;
        const { [label]: _gone, ...rest } = now;
        return rest;
      }
      return now[label] === message ? now : { ...now, [label]: message };
    });
  const category = mine.trial.category as GarmentCategory;
  const unit = session.user.lengthUnit;
  const choices = report.choices;
  const title = stage === 'final' ? 'Final report' : 'Toile check-in';
  const fieldErrors = { ...(status.state === 'error' ? (status.fields ?? {}) : {}), ...(outcome?.fields ?? {}) };

  const onSubmit = async () => {
    const bad = Object.keys(unreadable);
    if (bad.length) {
      setOutcome({ tone: 'error', text: `Not submitted: ${bad.join(', ')} could not be read. Correct ${bad.length === 1 ? 'it' : 'them'} first.` });
      return;
    }
    setBusy(true);
    setOutcome(null);
    try {
      const done = await submit();
      setEditing(false);
      setOutcome({ tone: 'success', text: `Submitted ${describeInstant(done.submittedAt!, zone)}. Thank you! You can still change it until the due time.` });
    } catch (e) {
      const fields = e instanceof ApiError ? e.fields : undefined;
      const named = fields && Object.keys(fields).length ? ` ${describeFields(fields)}.` : '';
      setOutcome({ tone: 'error', text: `${e instanceof Error ? e.message : 'Not submitted.'}${named}`, fields });
    } finally {
      setBusy(false);
    }
  };

  const intro = report.dueAt ? `Due ${describeInstant(report.dueAt, zone)}. Saved as you type; you can change it until then.` : 'Saved as you type.';
  return (
    <View style={styles.root}>
      <Screen title={`${title}: ${mine.trial.title}`} intro={intro}>
        {submitted ? (
          <View style={styles.receipt} aria-label="Receipt">
            <AppText style={styles.strong}>{`Received ${describeInstant(report.submittedAt!, zone)}.`}</AppText>
            {readOnly && report.editable ? (
              <>
                <AppText variant="caption">This is what the studio has. You can change it until the due time.</AppText>
                <Button label="Change my answers" tone="quiet" onPress={() => setEditing(true)} />
              </>
            ) : null}
          </View>
        ) : null}
        {!report.editable ? <Notice tone="info">The due time has passed: this report can no longer be changed. Ask the studio if you need more time.</Notice> : null}
        {report.prefilledFrom === 'check-in' && !submitted ? (
          <Notice tone="info">{`Started from your check-in: ${report.prefilled.map((p) => PART_LABELS[p]).join(', ')}. Change anything that was different in the finished garment.`}</Notice>
        ) : null}
        {restored ? <Notice tone="info">Changes you made here earlier had not reached Basted; they were kept on this device and are sent now.</Notice> : null}
        {conflict ? (
          <Notice tone="info">
            {`This report was also changed in another window or on another device (${conflict.changedElsewhere.map((p) => PART_LABELS[p]).join(', ')}). Both sets of changes are kept${
              conflict.keptHere.length ? `; where both changed the same answer (${conflict.keptHere.map((p) => PART_LABELS[p]).join(', ')}), the one in this window was kept` : ''
            }.`}
          </Notice>
        ) : null}
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
          <AlterationsEditor category={category} value={content.alterations ?? []} unit={unit} readOnly={readOnly} onChange={(alterations) => update({ alterations })} errors={fieldErrors} onInputError={noteUnreadable} />
        </Card>
        <Card title="Fabric used">
          <FabricUsedEditor fabricKind={mine.trial.fabricKind} value={content.fabric} lengthUnit={unit} fabricUnit={session.user.fabricUnit} readOnly={readOnly} onChange={(fabric) => update({ fabric })} errors={fieldErrors} onInputError={noteUnreadable} />
        </Card>
        <Card title="Instructions">
          <AppText variant="caption">Steps that confused you: the step number and what was unclear.</AppText>
          {(content.unclearSteps ?? []).map((s, i) => (
            <View key={i} style={styles.step}>
              <TextField autoFocus={addedStep === i} label={`Unclear step ${i + 1}: number`} value={s.step} editable={!readOnly} onChangeText={(step) => update({ unclearSteps: (content.unclearSteps ?? []).map((x, j) => (j === i ? { ...x, step } : x)) })} error={fieldErrors[`unclearSteps.${i}.step`]} />
              <TextField label={`Unclear step ${i + 1}: what was unclear`} value={s.problem} editable={!readOnly} multiline onChangeText={(problem) => update({ unclearSteps: (content.unclearSteps ?? []).map((x, j) => (j === i ? { ...x, problem } : x)) })} error={fieldErrors[`unclearSteps.${i}.problem`]} />
            </View>
          ))}
          {!readOnly ? (
            <Button
              label="Add a step"
              tone="quiet"
              onPress={() => {
                setAddedStep((content.unclearSteps ?? []).length);
                update({ unclearSteps: [...(content.unclearSteps ?? []), { step: '', problem: '' }] });
              }}
            />
          ) : null}
        </Card>
        <Card title="Photos">
          <PhotosSection enrollmentId={enrollmentId} stage={stage} readOnly={readOnly} />
        </Card>
        <Card title="Verdict">
          <TextField label="Overall verdict" value={content.verdict ?? ''} editable={!readOnly} multiline onChangeText={(verdict) => update({ verdict })} error={fieldErrors.verdict} />
          <SwitchField label="I would make it again" disabled={readOnly} value={content.wouldMakeAgain} onValueChange={(wouldMakeAgain) => update({ wouldMakeAgain })} />
        </Card>
        {outcome ? <Notice tone={outcome.tone}>{outcome.text}</Notice> : null}
        {!readOnly ? (
          <Button
            label={submitted ? 'Submit again with these changes' : `Submit the ${title.toLowerCase()}`}
            busyLabel="Saving and submitting…"
            busy={busy}
            onPress={onSubmit}
          />
        ) : null}
      </Screen>
      <SaveStatusBar status={status} unreadable={Object.keys(unreadable)} timeZone={zone} submittedAt={report.submittedAt} onRetry={retry} />
    </View>
  );
}

const styles = StyleSheet.create({
  root: { flex: 1 },
  warn: { color: colors.warning },
  strong: { fontFamily: fonts.semibold },
  receipt: { gap: space.xs, padding: space.md, borderRadius: 8, backgroundColor: colors.threadSoft },
  step: { gap: space.xs },
});
