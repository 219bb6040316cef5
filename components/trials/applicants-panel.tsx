import dayjs from 'dayjs';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { spacePresses } from '@/components/ui/keyboard';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { ToggleChips } from '@/components/ui/toggle-chips';
import { colors, fonts, radius, space } from '@/constants/theme';
import { decide, proposeSelection, useApplications, useCoverage, type ApplicationRow } from '@/hooks/use-trials';
import type { SelectionProposal } from '@/server/domain/coverage';
import { formatLength, type LengthUnit } from '@/server/domain/units';
import { CoverageGridView } from './coverage-grid-view';

const STATUSES: ApplicationRow['status'][] = ['applied', 'shortlisted', 'selected', 'waitlisted', 'declined', 'withdrawn'];
const ACTIONS: { status: ApplicationRow['status']; label: string }[] = [
  { status: 'shortlisted', label: 'Shortlist' },
  { status: 'selected', label: 'Select' },
  { status: 'waitlisted', label: 'Waitlist' },
  { status: 'declined', label: 'Decline' },
];

type Props = { studioId: string; trialId: string; unit: LengthUnit };

/** Who applied, the coverage they give, the explained proposal, and decisions one by one or in bulk. */
export function ApplicantsPanel({ studioId, trialId, unit }: Props) {
  const apps = useApplications(studioId, trialId);
  const grid = useCoverage(studioId, trialId);
  const [filter, setFilter] = useState<string[]>(['applied', 'shortlisted', 'selected', 'waitlisted']);
  const [chosen, setChosen] = useState<string[]>([]);
  const [proposal, setProposal] = useState<SelectionProposal | null>(null);
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string; details?: string[] } | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  const nameOf = (id: string) => apps.data?.find((a) => a.id === id)?.applicant.name ?? id;

  const run = async (label: string, work: () => Promise<string>) => {
    setBusy(label);
    setMessage(null);
    try {
      setMessage({ tone: 'success', text: await work() });
    } catch (error) {
      const details = error && typeof error === 'object' && 'fields' in error && error.fields ? Object.entries(error.fields as Record<string, string>).map(([k, v]) => `${k}: ${v}`) : undefined;
      setMessage({ tone: 'error', text: error instanceof Error ? error.message : 'That did not work.', details });
    } finally {
      setBusy(null);
    }
  };

  const act = (status: ApplicationRow['status'], ids: string[]) =>
    run(status, async () => {
      const r = await decide(studioId, trialId, ids, status);
      setChosen([]);
      setProposal(null);
      return `Done: ${r.selected} selected, ${r.waitlisted} waitlisted, ${r.declined} declined. Each tester was told by e-mail.`;
    });

  const newPicks = proposal?.picks.filter((p) => p.kind === 'new') ?? [];
  const shown = (apps.data ?? []).filter((a) => filter.includes(a.status));

  return (
    <>
      <Card title="Coverage">
        {grid.error ? <LoadError error={grid.error} onRetry={() => grid.mutate()} /> : null}
        {!grid.data && !grid.error ? <Loading /> : null}
        {grid.data ? <CoverageGridView grid={grid.data} /> : null}
      </Card>

      <Card title="Automatic selection">
        <AppText variant="caption">Fills the emptiest sizes first, covers each height band where someone of that height applied, and breaks ties by reliability in the studio’s past trials, then by who applied first.</AppText>
        <Button label="Propose a selection" tone="quiet" busy={busy === 'propose'} busyLabel="Working it out…" onPress={() => run('propose', async () => {
          const p = await proposeSelection(studioId, trialId);
          setProposal(p);
          return `Proposal: ${p.picks.filter((x) => x.kind === 'new').length} to select, ${p.leftOut.length} left out. Nothing changes until you accept it.`;
        })} />
        {proposal ? (
          <View style={styles.proposal} aria-label="Proposed selection">
            {newPicks.map((p) => (
              <AppText key={p.applicantId} variant="caption">{`\u2713 ${nameOf(p.applicantId)}: ${p.reason}`}</AppText>
            ))}
            {proposal.leftOut.map((l) => (
              <AppText key={l.applicantId} variant="caption" style={styles.muted}>{`\u2013 ${nameOf(l.applicantId)}: ${l.reason}`}</AppText>
            ))}
            <Button label={`Accept: select ${newPicks.length}`} disabled={newPicks.length === 0} busy={busy === 'selected'} busyLabel="Selecting…" onPress={() => act('selected', newPicks.map((p) => p.applicantId))} />
            <Button label="Edit it instead (pick below)" tone="quiet" onPress={() => { setChosen(newPicks.map((p) => p.applicantId)); setProposal(null); }} />
          </View>
        ) : null}
      </Card>

      <Card title="Applicants">
        {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
        {message?.details?.map((d) => <AppText key={d} variant="caption" style={styles.warn}>{d}</AppText>)}
        <ToggleChips label="Show" options={STATUSES.map((s) => ({ value: s, label: s }))} selected={filter} onChange={setFilter} />
        <View style={styles.bulk}>
          {ACTIONS.map((a) => (
            <Button key={a.status} label={`${a.label} (${chosen.length})`} tone="quiet" disabled={chosen.length === 0} busy={busy === a.status} onPress={() => act(a.status, chosen)} />
          ))}
        </View>
        {apps.error ? <LoadError error={apps.error} onRetry={() => apps.mutate()} /> : null}
        {!apps.data && !apps.error ? <Loading /> : null}
        {apps.data && shown.length === 0 ? <Empty>No applicants match.</Empty> : null}
        {shown.map((a) => {
          const on = chosen.includes(a.id);
          const height = a.measurementsMm.height;
          const toggle = () => setChosen((c) => (on ? c.filter((x) => x !== a.id) : [...c, a.id]));
          return (
            <Pressable
              key={a.id}
              role="checkbox"
              aria-checked={on}
              disabled={a.status === 'withdrawn'}
              onPress={toggle}
              {...(a.status === 'withdrawn' ? {} : spacePresses(toggle))}
              style={[styles.app, on && styles.appOn]}
            >
              <AppText style={styles.strong}>{`${a.applicant.name} · size ${a.size?.label ?? '—'} · ${a.status}`}</AppText>
              <AppText variant="caption">
                {`${height ? `${formatLength(height, unit)} tall · ` : ''}advised ${a.advisedSize ?? '—'} · ${a.experience} · ${a.plannedFabric} · applied ${dayjs(a.appliedAt).format('D MMM HH:mm')}`}
              </AppText>
            </Pressable>
          );
        })}
      </Card>
    </>
  );
}

const styles = StyleSheet.create({
  proposal: { gap: space.xs, paddingTop: space.sm },
  muted: { color: colors.inkMuted },
  warn: { color: colors.warning },
  bulk: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs },
  app: { padding: space.md, borderRadius: radius.sm, borderWidth: 1, borderColor: colors.line, backgroundColor: colors.surface, gap: 2 },
  appOn: { borderColor: colors.thread, backgroundColor: colors.threadSoft },
  strong: { fontFamily: fonts.semibold },
});
