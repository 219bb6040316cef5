import Ionicons from '@expo/vector-icons/Ionicons';
import { zodResolver } from '@hookform/resolvers/zod';
import dayjs from 'dayjs';
import { useRouter, type Href } from 'expo-router';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { applyApiError } from '@/components/forms/api-errors';
import { FormTextField } from '@/components/forms/form-text-field';
import { CsvFileInput } from '@/components/patterns/csv-file-input';
import { Button } from '@/components/ui/button';
import { ButtonLink } from '@/components/ui/button-link';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { DataTable } from '@/components/ui/data-table';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { ToggleChips } from '@/components/ui/toggle-chips';
import { colors, fonts, radius, space } from '@/constants/theme';
import { ApiError } from '@/hooks/api';
import {
  copyTrial,
  excuseTester,
  importRewardCodes,
  releaseTrial,
  saveReleaseSettings,
  sendRewardCodes,
  useReleaseStatus,
  useRewardCodes,
  type ReleaseResult,
  type ReleaseStatus,
} from '@/hooks/use-release';
import type { ChecklistItem, ChecklistKey, FixLink } from '@/server/domain/release';
import { copyTrialSchema, releaseSettingsSchema, type CopyTrialInput } from '@/server/domain/schemas/release';

type Props = { studioId: string; trialId: string; canEdit: boolean; canManage: boolean };

/** Where an item is fixed; items fixed on this page point at their card below. */
function fixHref(link: FixLink): Href | null {
  switch (link.screen) {
    case 'findings':
      return { pathname: '/findings/[trialId]', params: { trialId: link.trialId } };
    case 'pattern':
      return { pathname: '/patterns/[id]', params: { id: link.patternId } };
    case 'trial':
      return { pathname: '/trials/[id]', params: { id: link.trialId } };
    case 'release':
      return null;
  }
}

function ItemRow({ item }: { item: ChecklistItem }) {
  const href = fixHref(item.fix.link);
  return (
    <View style={[styles.item, item.ok ? styles.itemOk : styles.itemOpen]} testID={`check-${item.key}`} aria-label={`${item.title}: ${item.ok ? 'done' : 'open'}`}>
      <View style={styles.itemHead}>
        <Ionicons name={item.ok ? 'checkmark-circle' : 'alert-circle'} size={22} color={item.ok ? colors.thread : colors.warning} />
        <AppText style={styles.itemTitle}>{item.title}</AppText>
        <AppText variant="caption" style={item.ok ? styles.okWord : styles.openWord}>
          {item.ok ? 'Done' : 'Open'}
        </AppText>
      </View>
      <AppText variant="caption">{item.detail}</AppText>
      {item.open.map((o) => (
        <AppText key={o} variant="caption">{`• ${o}`}</AppText>
      ))}
      {!item.ok ? href ? <ButtonLink href={href} label={item.fix.label} tone="quiet" /> : <AppText variant="caption" style={styles.hint}>{`${item.fix.label}: below on this page.`}</AppText> : null}
    </View>
  );
}

function FinalDraftCard({ studioId, trialId, status, canEdit }: { studioId: string; trialId: string; status: ReleaseStatus; canEdit: boolean }) {
  const [error, setError] = useState<string | null>(null);
  const withFiles = status.drafts.filter((d) => d.files > 0);
  return (
    <Card title="Final draft">
      <AppText variant="caption">The files of this draft go to every tester who finished, once the trial is released.</AppText>
      {withFiles.length === 0 ? (
        <ButtonLink href={{ pathname: '/patterns/[id]', params: { id: status.trial.patternId } }} label="Upload a draft on the pattern’s page" tone="quiet" />
      ) : (
        <ChoiceGroup
          label="The final draft"
          options={[...withFiles].reverse().map((d) => ({ value: d.id, label: `Draft ${d.version} · ${dayjs(d.createdAt).format('D MMM')}` }))}
          value={status.finalDraftId}
          onChange={(id) => {
            if (!canEdit || status.released) return;
            setError(null);
            saveReleaseSettings(studioId, trialId, { finalDraftId: id }).catch((e: Error) => setError(e.message));
          }}
        />
      )}
      {error ? <Notice tone="error">{error}</Notice> : null}
    </Card>
  );
}

function CoverageCard({ studioId, trialId, status, canEdit }: { studioId: string; trialId: string; status: ReleaseStatus; canEdit: boolean }) {
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const { control, handleSubmit, setError, formState } = useForm({
    resolver: zodResolver(releaseSettingsSchema),
    defaultValues: { coverageGapNote: status.coverageGapNote ?? '' },
  });
  const gaps = status.coverage.filter((c) => c.finished < c.target);
  const submit = handleSubmit(async (values) => {
    setFormError(null);
    setSaved(false);
    try {
      await saveReleaseSettings(studioId, trialId, { coverageGapNote: values.coverageGapNote ?? null });
      setSaved(true);
    } catch (error) {
      setFormError(applyApiError(error, setError, ['coverageGapNote']));
    }
  });
  return (
    <Card title="Coverage">
      <DataTable
        label="Testers per size"
        columns={[{ title: 'Size' }, { title: 'Wanted', align: 'right' }, { title: 'Finished', align: 'right' }]}
        rows={status.coverage.map((c) => [c.size, String(c.target), `${c.finished}${c.finished < c.target ? ' (short)' : ''}`])}
      />
      {gaps.length || status.coverageGapNote ? (
        canEdit ? (
          <>
            <FormTextField control={control} name="coverageGapNote" label="Why the gap is acceptable" hint="Kept with the release and shown in the summary." multiline />
            {formError ? <Notice tone="error">{formError}</Notice> : null}
            {saved ? <Notice tone="success">Note saved.</Notice> : null}
            <Button label="Save the note" busy={formState.isSubmitting} busyLabel="Saving…" onPress={submit} />
          </>
        ) : (
          <AppText variant="caption">{status.coverageGapNote ? `Gap accepted: ${status.coverageGapNote}` : 'The gap is not accepted yet.'}</AppText>
        )
      ) : (
        <AppText variant="caption">Every size has as many finished testers as wanted.</AppText>
      )}
    </Card>
  );
}

function TestersCard({ studioId, trialId, status, canManage }: { studioId: string; trialId: string; status: ReleaseStatus; canManage: boolean }) {
  const [notes, setNotes] = useState<Record<string, string>>({});
  const [error, setError] = useState<string | null>(null);
  const owing = status.testers.filter((t) => t.status === 'active');
  const done = status.testers.filter((t) => t.status !== 'active');
  return (
    <Card title="Testers">
      <AppText variant="caption">{`${status.testers.filter((t) => t.status === 'finished').length} finished, ${done.filter((t) => t.status === 'dropped').length} left, ${owing.length} still without a final report.`}</AppText>
      {error ? <Notice tone="error">{error}</Notice> : null}
      {owing.map((t) => (
        <View key={t.enrollmentId} style={styles.tester}>
          <AppText style={styles.strong}>{`${t.name} · size ${t.size}${t.excused ? ' · excused' : ''}`}</AppText>
          {t.excused && t.excuseNote ? <AppText variant="caption">{t.excuseNote}</AppText> : null}
          {canManage && !status.released ? (
            t.excused ? (
              <Button label="Take back the excuse" tone="quiet" accessibleLabel={`Take back the excuse of ${t.name}`} onPress={() => excuseTester(studioId, trialId, t.enrollmentId, false, null).catch((e: Error) => setError(e.message))} />
            ) : (
              <View style={styles.excuse}>
                <TextField label={`Note on ${t.name} (optional)`} value={notes[t.enrollmentId] ?? ''} onChangeText={(v) => setNotes((n) => ({ ...n, [t.enrollmentId]: v }))} />
                <Button
                  label="Excuse from finishing"
                  tone="quiet"
                  accessibleLabel={`Excuse ${t.name} from finishing`}
                  onPress={() => excuseTester(studioId, trialId, t.enrollmentId, true, notes[t.enrollmentId]?.trim() || null).catch((e: Error) => setError(e.message))}
                />
              </View>
            )
          ) : null}
        </View>
      ))}
    </Card>
  );
}

function RewardCodesCard({ studioId, trialId, released }: { studioId: string; trialId: string; released: boolean }) {
  const { data, error: loadError } = useRewardCodes(studioId, trialId);
  const [pasted, setPasted] = useState('');
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string; fields?: Record<string, string> } | null>(null);
  const [busy, setBusy] = useState(false);
  const send = async (csv: string) => {
    setBusy(true);
    setMessage(null);
    try {
      const res = await importRewardCodes(studioId, trialId, csv);
      setPasted('');
      setMessage({ tone: 'success', text: `${res.added} codes added; ${res.unassigned} not given yet.` });
    } catch (e) {
      setMessage({ tone: 'error', text: e instanceof Error ? e.message : 'Not imported.', fields: e instanceof ApiError ? e.fields : undefined });
    } finally {
      setBusy(false);
    }
  };
  return (
    <Card title="Reward codes">
      <AppText variant="caption">
        One code per tester who finished, each sent once by e-mail when the trial is released (and kept in their My trials). Import a CSV with one code a line, or a column headed “code”.
      </AppText>
      {loadError ? <LoadError error={loadError} /> : null}
      {data ? <AppText>{`${data.total} codes, ${data.assigned} given, ${data.unassigned} left · ${data.finishers} finishers`}</AppText> : null}
      <View nativeID="print-hide-codes" style={styles.codesInput}>
        <CsvFileInput onText={(text) => void send(text)} />
        <TextField label="Or paste codes" value={pasted} onChangeText={setPasted} multiline placeholder={'code\nTHANKS-01\nTHANKS-02'} />
        <Button label="Import the codes" busy={busy} busyLabel="Importing…" disabled={!pasted.trim()} onPress={() => void send(pasted)} />
      </View>
      {message ? <Notice tone={message.tone}>{`${message.text}${message.fields ? ` ${Object.entries(message.fields).map(([k, v]) => `${k} ${v}`).join('; ')}.` : ''}`}</Notice> : null}
      {released && data && data.unassigned > 0 && data.assigned < data.finishers ? (
        <Button
          label="Send codes to finishers still without one"
          onPress={() =>
            sendRewardCodes(studioId, trialId)
              .then((r) => setMessage({ tone: 'success', text: `${r.delivery.sent} codes sent${r.delivery.missing ? `; ${r.delivery.missing} finishers still need one` : ''}.` }))
              .catch((e: Error) => setMessage({ tone: 'error', text: e.message }))
          }
        />
      ) : null}
      {data && data.codes.length ? (
        <DataTable
          label="Reward codes"
          columns={[{ title: 'Code', flex: 2 }, { title: 'Given to', flex: 2 }, { title: 'E-mail', flex: 1 }]}
          rows={data.codes.map((c) => [c.code, c.tester ?? '–', c.mail ? c.mail.status : '–'])}
        />
      ) : null}
    </Card>
  );
}

function ReleaseCard({ studioId, trialId, status, canEdit }: { studioId: string; trialId: string; status: ReleaseStatus; canEdit: boolean }) {
  const open = status.checklist.filter((i) => !i.ok);
  const [confirmed, setConfirmed] = useState<ChecklistKey[]>([]);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [result, setResult] = useState<ReleaseResult['mail'] | null>(null);
  if (status.released) {
    return (
      <Card title="Released">
        <Notice tone="success">{`Released on ${dayjs(status.released.at).format('D MMM YYYY, HH:mm')}${status.released.by ? ` by ${status.released.by}` : ''}.`}</Notice>
        {result ? (
          <AppText>{`Sent: ${result.thanks} thank-you e-mails with the final files, ${result.closing} closing notes, ${result.codes.sent} reward codes${result.codes.missing ? ` (${result.codes.missing} finishers still need a code)` : ''}.`}</AppText>
        ) : null}
        {status.released.openItems.length ? (
          <View style={styles.block}>
            <AppText style={styles.strong}>Released with these items open, as confirmed:</AppText>
            {status.released.openItems.map((i) => (
              <AppText key={i.key} variant="caption">{`• ${i.title}: ${i.detail}`}</AppText>
            ))}
          </View>
        ) : null}
      </Card>
    );
  }
  const allConfirmed = open.every((i) => confirmed.includes(i.key));
  const release = async () => {
    setBusy(true);
    setError(null);
    try {
      const res = await releaseTrial(studioId, trialId, confirmed);
      setResult(res.mail);
    } catch (e) {
      setError(e instanceof Error ? e.message : 'Not released.');
    } finally {
      setBusy(false);
    }
  };
  const finishers = status.testers.filter((t) => t.status === 'finished').length;
  const others = status.testers.length - finishers;
  return (
    <Card title="Release">
      <AppText>
        {`Releasing closes the trial and sends, once: ${finishers} thank-you e-mails with the final files${status.rewardCodes.total ? ` and up to ${Math.min(finishers, status.rewardCodes.total)} reward codes` : ''}, and ${others} closing notes to testers who did not finish.`}
      </AppText>
      {open.length ? (
        <ToggleChips
          label={`${open.length} ${open.length === 1 ? 'item is' : 'items are'} open. To release anyway, confirm each:`}
          options={open.map((i) => ({ value: i.key, label: `I accept: ${i.title.toLowerCase()}` }))}
          selected={confirmed}
          onChange={(sel) => setConfirmed(sel as ChecklistKey[])}
          disabled={!canEdit}
        />
      ) : (
        <Notice tone="success">Every item of the checklist holds.</Notice>
      )}
      {error ? <Notice tone="error">{error}</Notice> : null}
      {canEdit ? (
        <Button
          label={open.length ? `Release with ${open.length} open ${open.length === 1 ? 'item' : 'items'}` : 'Release the trial'}
          busy={busy}
          busyLabel="Releasing…"
          disabled={!allConfirmed}
          onPress={release}
        />
      ) : (
        <AppText variant="caption">The studio owner or a coordinator releases the trial.</AppText>
      )}
    </Card>
  );
}

function CopyCard({ studioId, trialId, title }: { studioId: string; trialId: string; title: string }) {
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<CopyTrialInput>({
    resolver: zodResolver(copyTrialSchema),
    defaultValues: { title: `${title} (next round)`.slice(0, 160), shiftDays: 60, inviteFinishers: true },
  });
  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      const res = await copyTrial(studioId, trialId, values);
      router.push({ pathname: '/trials/[id]', params: { id: res.trial.id } });
    } catch (error) {
      setFormError(applyApiError(error, setError, ['title', 'shiftDays', 'inviteFinishers']));
    }
  });
  return (
    <Card title="Next round">
      <AppText variant="caption">A copy of this trial’s call, requirements and targets, every date moved by the days you choose. It starts as a draft, not public.</AppText>
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <FormTextField control={control} name="title" label="Title of the new trial" />
      <Controller
        control={control}
        name="shiftDays"
        render={({ field, fieldState }) => (
          <TextField
            label="Move every date by (days)"
            inputMode="numeric"
            value={Number.isFinite(field.value) ? String(field.value) : ''}
            onChangeText={(v) => field.onChange(v.trim() === '' ? Number.NaN : Number(v))}
            error={fieldState.error?.message}
          />
        )}
      />
      <Controller
        control={control}
        name="inviteFinishers"
        render={({ field }) => (
          <ChoiceGroup
            label="Invite this round’s finishers"
            options={[{ value: 'yes', label: 'Yes, when the new call opens' }, { value: 'no', label: 'No' }]}
            value={field.value ? 'yes' : 'no'}
            onChange={(v) => field.onChange(v === 'yes')}
          />
        )}
      />
      <Button label="Copy the trial" busy={formState.isSubmitting} busyLabel="Copying…" onPress={submit} />
    </Card>
  );
}

/** The release of a trial: the checklist computed from its data, the choices it needs, and the release itself. */
export function ReleaseChecklist({ studioId, trialId, canEdit, canManage }: Props) {
  const { data: status, error, mutate } = useReleaseStatus(studioId, trialId);
  const links = (
    <View style={styles.actions}>
      <ButtonLink href={{ pathname: '/trials/[id]', params: { id: trialId } }} label="Back to the trial" tone="quiet" />
      <ButtonLink href={{ pathname: '/summary/[trialId]', params: { trialId } }} label="Trial summary" tone="quiet" />
    </View>
  );
  if (error) {
    return (
      <Screen title="Release">
        {links}
        {error instanceof ApiError && error.status === 404 ? <Notice tone="error">There is no such trial in this studio.</Notice> : <LoadError error={error} onRetry={() => mutate()} />}
      </Screen>
    );
  }
  if (!status) {
    return (
      <Screen title="Release">
        <Loading label="Checking the trial…" />
      </Screen>
    );
  }
  const open = status.checklist.filter((i) => !i.ok).length;
  return (
    <Screen
      title={`Release: ${status.trial.title}`}
      intro={status.released ? 'This trial is released.' : open ? `${open} of ${status.checklist.length} items still open.` : 'Every item holds: the trial is ready to release.'}
    >
      {links}
      <Card title="Checklist">
        {status.checklist.map((item) => (
          <ItemRow key={item.key} item={item} />
        ))}
      </Card>
      <FinalDraftCard studioId={studioId} trialId={trialId} status={status} canEdit={canEdit} />
      <CoverageCard studioId={studioId} trialId={trialId} status={status} canEdit={canEdit && !status.released} />
      <TestersCard studioId={studioId} trialId={trialId} status={status} canManage={canManage} />
      {canManage ? <RewardCodesCard studioId={studioId} trialId={trialId} released={Boolean(status.released)} /> : null}
      <ReleaseCard studioId={studioId} trialId={trialId} status={status} canEdit={canEdit} />
      {canEdit ? <CopyCard studioId={studioId} trialId={trialId} title={status.trial.title} /> : null}
    </Screen>
  );
}

const styles = StyleSheet.create({
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  item: { gap: space.xs, padding: space.md, borderRadius: radius.sm, borderWidth: 1 },
  itemOk: { borderColor: colors.line, backgroundColor: colors.surface },
  itemOpen: { borderColor: colors.warning, backgroundColor: colors.warningSoft },
  itemHead: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  itemTitle: { flex: 1, fontFamily: fonts.semibold },
  okWord: { color: colors.thread, fontFamily: fonts.semibold },
  openWord: { color: colors.warning, fontFamily: fonts.semibold },
  hint: { fontFamily: fonts.medium },
  strong: { fontFamily: fonts.semibold },
  block: { gap: 2 },
  tester: { gap: space.xs, paddingVertical: space.sm, borderBottomWidth: 1, borderBottomColor: colors.line },
  excuse: { gap: space.xs },
  codesInput: { gap: space.sm },
});
