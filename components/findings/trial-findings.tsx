import dayjs from 'dayjs';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { ButtonLink } from '@/components/ui/button-link';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { ToggleChips } from '@/components/ui/toggle-chips';
import { space } from '@/constants/theme';
import { ApiError } from '@/hooks/api';
import { findingsKeys, useFindings, type FindingsResult } from '@/hooks/use-findings';
import { useIsWide } from '@/hooks/use-is-wide';
import { useTrial } from '@/hooks/use-trials';
import type { FindingClass } from '@/server/analysis/types';
import { can } from '@/server/domain/policy';
import type { Role } from '@/server/domain/roles';
import type { FabricUnit, LengthUnit } from '@/server/domain/units';
import { ChangeTable } from './change-table';
import { ComparisonSection } from './comparison-section';
import { FindingRow } from './finding-row';
import { HeatGrid } from './heat-grid';
import { FabricSection, FitRatingsSection, UnclearStepsSection } from './result-sections';
import { CLASS_LABELS, CLASS_ORDER, findingKey, findingName } from './words';

type Props = {
  studioId: string;
  trialId: string;
  role: Role;
  lengthUnit: LengthUnit;
  fabricUnit: FabricUnit;
  /** The draft to open with (from the page address), and who to tell when another is chosen. */
  initialDraft?: string;
  onDraftChange?: (draft: string) => void;
};

/** Sizes of the range in grading order, as the engine lists them for every finding. */
function sizesOf(result: FindingsResult): string[] {
  return result.findings[0]?.bySize.map((s) => s.size) ?? [...new Set(result.fitRatings?.map((c) => c.size) ?? [])];
}

/** A trial's findings: filters, the list with charts and triage, the heat grid, the draft comparison and the other checks. */
export function TrialFindings({ studioId, trialId, role, lengthUnit, fabricUnit, initialDraft, onDraftChange }: Props) {
  const wide = useIsWide();
  const { data: trial } = useTrial(studioId, trialId);
  const [draft, setDraft] = useState<string | undefined>(initialDraft);
  const [compare, setCompare] = useState<[string, string] | undefined>();
  // Classes the person chose to hide; a class that appears later is shown until hidden.
  const [hidden, setHidden] = useState<FindingClass[]>([]);
  const [openKey, setOpenKey] = useState<string | null>(null);
  const { data, error, mutate, isValidating } = useFindings(studioId, trialId, { draft, compare });
  const canTriage = can(role, 'findings.triage');
  const title = trial ? `Findings: ${trial.title}` : 'Findings';
  const back = <ButtonLink href={{ pathname: '/trials/[id]', params: { id: trialId } }} label="Back to the trial" tone="quiet" />;

  if (error && !(error instanceof ApiError && error.status === 400 && data)) {
    return (
      <Screen title={title}>
        {back}
        {error instanceof ApiError && error.status === 404 ? <Notice tone="error">There is no such trial in this studio.</Notice> : <LoadError error={error} onRetry={() => mutate()} />}
      </Screen>
    );
  }
  if (!data) {
    return (
      <Screen title={title}>
        {back}
        <Loading label="Adding up the reports…" />
      </Screen>
    );
  }
  const result = data.result;
  if (!result) {
    return (
      <Screen title={title}>
        {back}
        <Card title="Findings">
          <Empty>No submitted reports yet. Findings appear here once testers send their check-ins or final reports.</Empty>
        </Card>
      </Screen>
    );
  }

  const present = CLASS_ORDER.filter((c) => result.findings.some((f) => f.class === c));
  const shownClasses = present.filter((c) => !hidden.includes(c));
  const shown = result.findings.filter((f) => shownClasses.includes(f.class));
  const sizes = sizesOf(result);
  const snapshot = data.snapshot ? ` Worked out ${dayjs(data.snapshot.computedAt).format('D MMM YYYY, HH:mm')}.` : '';

  return (
    <Screen title={title} intro={`Draft ${result.draft}: ${result.testers} ${result.testers === 1 ? 'tester' : 'testers'} reported (their final report, or their check-in where that is all they sent on this draft; ${data.input.testers} reports over all drafts).${snapshot}`}>
      {back}
      {error ? <Notice tone="error">{error.message}</Notice> : null}
      {data.pending ? <Notice tone="info">Newer reports are being counted. These findings update by themselves in a few seconds.</Notice> : null}
      <Card title="What to show">
        {result.drafts.length > 1 ? (
          <ChoiceGroup
            label="Draft"
            options={result.drafts.map((d) => ({ value: d, label: `Draft ${d}` }))}
            value={draft ?? result.draft}
            onChange={(d) => {
              setDraft(d);
              onDraftChange?.(d);
            }}
          />
        ) : (
          <AppText variant="caption">{`Only draft ${result.draft} has reports.`}</AppText>
        )}
        {present.length ? (
          <ToggleChips
            label="Kinds of finding"
            options={present.map((c) => ({ value: c, label: `${CLASS_LABELS[c]} (${result.findings.filter((f) => f.class === c).length})` }))}
            selected={shownClasses}
            onChange={(sel) => setHidden([...hidden.filter((c) => !present.includes(c)), ...present.filter((c) => !sel.includes(c as FindingClass))])}
          />
        ) : null}
        {isValidating ? <AppText variant="caption">Updating…</AppText> : null}
      </Card>

      <Card title={`Findings of draft ${result.draft}`}>
        {result.findings.length === 0 ? <Empty>{`No tester of draft ${result.draft} reported an alteration.`}</Empty> : null}
        {result.findings.length > 0 && shown.length === 0 ? <Empty>No finding of the chosen kinds. Turn a kind back on above.</Empty> : null}
        {shown.length ? <AppText variant="caption">Open a finding for its reasons, its charts, the triage and notes.</AppText> : null}
        <View style={styles.list}>
          {shown.map((f) => {
            const key = findingKey(f);
            return (
              <FindingRow
                key={key}
                studioId={studioId}
                trialId={trialId}
                finding={f}
                drafts={result.drafts}
                unit={lengthUnit}
                canTriage={canTriage}
                open={openKey === key}
                onToggle={() => setOpenKey(openKey === key ? null : key)}
                wide={wide}
              />
            );
          })}
        </View>
      </Card>

      {shown.length && sizes.length ? (
        <Card title="Alterations by size">
          <AppText variant="caption">{`Every alteration of draft ${result.draft} of the kinds chosen above, size by size.`}</AppText>
          <HeatGrid
            draft={result.draft}
            sizes={sizes}
            rows={shown.map((f) => ({ key: findingKey(f), label: findingName(f), bySize: f.bySize, flaggedSizes: f.class === 'size-specific' ? f.sizes : [] }))}
          />
        </Card>
      ) : null}

      <ChangeTable draft={result.draft} changes={result.changes ?? []} unit={lengthUnit} csvUrl={`${findingsKeys.base(studioId, trialId)}/changes.csv?draft=${encodeURIComponent(result.draft)}`} />

      <ComparisonSection
        key={result.drafts.join(',')}
        drafts={result.drafts}
        compare={compare}
        rows={result.comparison}
        busy={isValidating && compare !== undefined}
        onCompare={(pair) => {
          // The engine reads the first compared draft unless told which one is on screen.
          if (pair && draft === undefined) setDraft(result.draft);
          setCompare(pair);
        }}
      />

      <View style={[styles.extras, wide && styles.extrasWide]}>
        {result.fitRatings ? (
          <View style={wide ? styles.extraWide : undefined}>
            <FitRatingsSection cells={result.fitRatings} areas={result.fitAreas ?? []} sizes={sizes} />
          </View>
        ) : null}
        {result.fabric ? (
          <View style={wide ? styles.extraWide : undefined}>
            <FabricSection cells={result.fabric} lengthUnit={lengthUnit} fabricUnit={fabricUnit} />
          </View>
        ) : null}
        {result.unclearSteps ? (
          <View style={wide ? styles.extraWide : undefined}>
            <UnclearStepsSection steps={result.unclearSteps} />
          </View>
        ) : null}
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  extras: { gap: space.lg },
  extrasWide: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'flex-start' },
  // A basis only in the row: in the phone's column it would be a fixed height, and the cards overlap.
  extraWide: { flexGrow: 1, flexBasis: 320, minWidth: 0 },
});
