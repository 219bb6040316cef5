import dayjs from 'dayjs';
import { Image, StyleSheet, View } from 'react-native';
import { startDownload } from '@/components/patterns/download';
import { Button } from '@/components/ui/button';
import { ButtonLink } from '@/components/ui/button-link';
import { Card } from '@/components/ui/card';
import { DataTable } from '@/components/ui/data-table';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { colors, fonts, radius, space } from '@/constants/theme';
import { ApiError } from '@/hooks/api';
import { useIsWide } from '@/hooks/use-is-wide';
import { releaseKeys, useTrialSummary, type TrialSummary } from '@/hooks/use-release';
import { canPrint, printPage, PrintStyle } from './print-style';

const VIEW_WORDS: Record<string, string> = { front: 'front', side: 'side', back: 'back', detail: 'detail' };
const date = (d: string | null) => (d ? dayjs(d).format('D MMM YYYY') : '');

function Downloads({ studioId, trialId }: { studioId: string; trialId: string }) {
  const csv = (table: string, label: string) => (
    <Button key={table} label={label} tone="quiet" accessibleLabel={`Download ${label.toLowerCase()} as CSV`} onPress={() => startDownload(releaseKeys.summaryCsv(studioId, trialId, table))} />
  );
  return (
    <View nativeID="print-hide-downloads" style={styles.actions}>
      <Button label="Download the PDF" onPress={() => startDownload(releaseKeys.summaryPdf(studioId, trialId))} />
      {canPrint ? <Button label="Print" tone="quiet" onPress={printPage} /> : null}
      {csv('coverage', 'Coverage')}
      {csv('reports', 'Reports')}
      {csv('findings', 'Findings')}
      {csv('changes', 'Changes')}
      {csv('drafts', 'Drafts')}
    </View>
  );
}

function FindingsCard({ s }: { s: TrialSummary }) {
  return (
    <Card title="Findings and their triage">
      {s.findings.drafts.length === 0 ? <Empty>No submitted reports, so no findings.</Empty> : null}
      {s.findings.drafts.map((d) => (
        <View key={d.draft} style={styles.block}>
          <AppText style={styles.strong}>{`Draft ${d.draft}: ${d.testers} ${d.testers === 1 ? 'tester' : 'testers'} reported`}</AppText>
          {d.findings.length ? (
            <DataTable
              label={`Findings of draft ${d.draft}`}
              columns={[{ title: 'Finding', flex: 3, minWidth: 120 }, { title: 'Class', flex: 2 }, { title: 'Testers', flex: 1, align: 'right' }, { title: 'Triage', flex: 2 }]}
              rows={d.findings.map((f) => [f.name, `${f.classLabel}${f.sizes.length ? ` (${f.sizes.join(', ')})` : ''}`, `${f.count} of ${f.testers}`, f.triageLabel])}
            />
          ) : (
            <AppText variant="caption">Nothing points at the pattern.</AppText>
          )}
          {d.others ? <AppText variant="caption">{`${d.others} other ${d.others === 1 ? 'kind' : 'kinds'} of alteration point at no pattern problem or had too few reports.`}</AppText> : null}
        </View>
      ))}
    </Card>
  );
}

/**
 * One page of a trial to read, print or share: what was covered, what came in, what it found and
 * what the studio decided, the drafts, and the photos testers allowed to be shared.
 */
export function TrialSummaryView({ studioId, trialId }: { studioId: string; trialId: string }) {
  const wide = useIsWide();
  const { data: s, error, mutate } = useTrialSummary(studioId, trialId);
  const back = (
    <View nativeID="print-hide-back" style={styles.actions}>
      <ButtonLink href={{ pathname: '/trials/[id]', params: { id: trialId } }} label="Back to the trial" tone="quiet" />
      <ButtonLink href={{ pathname: '/release/[trialId]', params: { trialId } }} label="Release checklist" tone="quiet" />
    </View>
  );
  if (error) {
    return (
      <Screen title="Trial summary">
        {back}
        {error instanceof ApiError && error.status === 404 ? <Notice tone="error">There is no such trial in this studio.</Notice> : <LoadError error={error} onRetry={() => mutate()} />}
      </Screen>
    );
  }
  if (!s) {
    return (
      <Screen title="Trial summary">
        <Loading label="Putting the summary together…" />
      </Screen>
    );
  }
  const t = s.trial;
  const intro = `${t.studioName} · ${t.pattern.name} · ${t.releasedAt ? `released ${date(t.releasedAt)}` : 'not released yet'}`;
  const coverage = (
    <Card title="Coverage reached">
      <AppText>{`${s.coverage.finished} of ${s.coverage.target} places filled by testers who finished (${s.coverage.enrolled} enrolled).`}</AppText>
      {s.coverage.gapNote ? <AppText variant="caption">{`Gap accepted: ${s.coverage.gapNote}`}</AppText> : null}
      <DataTable
        label="Coverage per size"
        columns={[{ title: 'Size', flex: 1 }, { title: 'Wanted', flex: 1, align: 'right' }, { title: 'Enrolled', flex: 1, align: 'right' }, { title: 'Finished', flex: 1, align: 'right' }]}
        rows={s.coverage.sizes.map((c) => [c.size, String(c.target), String(c.enrolled), String(c.finished)])}
      />
    </Card>
  );
  const reports = (
    <Card title="Reports in">
      <DataTable
        label="Reports per stage"
        columns={[{ title: 'Stage', flex: 2, minWidth: 100 }, { title: 'Expected', flex: 1, align: 'right' }, { title: 'In', flex: 1, align: 'right' }, { title: 'On time', flex: 1, align: 'right' }, { title: 'Late', flex: 1, align: 'right' }]}
        rows={s.reports.stages.map((r) => [r.label, String(r.expected), String(r.submitted), String(r.onTime), String(r.late)])}
      />
      {t.milestones.length ? <AppText variant="caption">{t.milestones.map((m) => `${m.label}: ${date(m.dueAt)}`).join(' · ')}</AppText> : null}
    </Card>
  );
  return (
    <Screen title={`Summary: ${t.title}`} intro={intro}>
      <PrintStyle />
      {back}
      <Downloads studioId={studioId} trialId={trialId} />
      <View style={wide ? styles.columns : styles.stack}>
        <View style={wide ? styles.half : null}>{coverage}</View>
        <View style={wide ? styles.half : null}>{reports}</View>
      </View>
      <FindingsCard s={s} />
      <Card title={`Changes for the next draft${s.findings.latestDraft ? ` (from draft ${s.findings.latestDraft})` : ''}`}>
        {s.findings.changes.length === 0 ? (
          <Empty>No finding is marked “will fix”.</Empty>
        ) : (
          <DataTable
            label="Changes per size"
            testID="summary-changes"
            columns={[{ title: 'Finding', flex: 3, minWidth: 110 }, { title: 'Size', flex: 1 }, { title: 'Change', flex: 1.4, align: 'right' }, ...(wide ? [{ title: 'Range', flex: 2.5 }] : [])]}
            rows={s.findings.changes.map((c) => [c.finding, c.size, c.change, ...(wide ? [c.range ?? '–'] : [])])}
          />
        )}
      </Card>
      <Card title="Draft history">
        {s.drafts.length === 0 ? <Empty>No draft uploaded.</Empty> : null}
        {s.drafts.map((d) => (
          <View key={d.id} style={styles.draft}>
            <AppText style={styles.strong}>{`Draft ${d.version}${d.final ? ' · final' : ''} · ${date(d.createdAt)} · ${d.files.length} ${d.files.length === 1 ? 'file' : 'files'}`}</AppText>
            <AppText variant="caption">{d.changeNote}</AppText>
          </View>
        ))}
      </Card>
      <Card title="Photos testers allowed to be shared">
        {t.photosRemovedAt ? <Empty>{`The photos were removed on ${date(t.photosRemovedAt)}: the studio keeps them for a set time after a release.`}</Empty> : null}
        {!t.photosRemovedAt && s.photos.length === 0 ? <Empty>No tester allowed a photo to be shared.</Empty> : null}
        <View style={styles.photos}>
          {s.photos.map((p) => (
            <View key={p.id} style={[styles.photo, { width: wide ? 180 : 150 }]}>
              {p.thumbUrl ? (
                <Image
                  source={{ uri: p.thumbUrl }}
                  style={[styles.image, { aspectRatio: p.width / p.height }]}
                  accessibilityLabel={`Size ${p.size}, ${VIEW_WORDS[p.view] ?? p.view}, ${p.stage === 'final' ? 'finished garment' : 'toile'}`}
                />
              ) : null}
              <AppText variant="caption">{`Size ${p.size}, ${VIEW_WORDS[p.view] ?? p.view}, ${p.stage === 'final' ? 'garment' : 'toile'}`}</AppText>
            </View>
          ))}
        </View>
      </Card>
    </Screen>
  );
}

const styles = StyleSheet.create({
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  columns: { flexDirection: 'row', gap: space.lg, alignItems: 'flex-start' },
  stack: { gap: space.lg },
  half: { flex: 1 },
  block: { gap: space.xs },
  strong: { fontFamily: fonts.semibold },
  draft: { gap: 2, paddingVertical: space.xs, borderBottomWidth: 1, borderBottomColor: colors.line },
  photos: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  photo: { gap: space.xs },
  image: { width: '100%', borderRadius: radius.sm, backgroundColor: colors.surfaceSunken },
});
