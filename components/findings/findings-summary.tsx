import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { ButtonLink } from '@/components/ui/button-link';
import { Card } from '@/components/ui/card';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { space } from '@/constants/theme';
import { useFindings } from '@/hooks/use-findings';
import { useIsWide } from '@/hooks/use-is-wide';
import type { Role } from '@/server/domain/roles';
import { can } from '@/server/domain/policy';
import type { LengthUnit } from '@/server/domain/units';
import { FindingRow } from './finding-row';
import { findingKey, isPatternProblem } from './words';

type Props = { studioId: string; trialId: string; role: Role; lengthUnit: LengthUnit };

/**
 * The trial page's view of its findings: the latest draft's findings that point at the pattern or
 * at personal fit, in the same rows and words as the findings screen, and the way there for the rest.
 */
export function FindingsSummary({ studioId, trialId, role, lengthUnit }: Props) {
  const wide = useIsWide();
  const { data, error, mutate } = useFindings(studioId, trialId);
  const [openKey, setOpenKey] = useState<string | null>(null);
  const result = data?.result;
  const shown = result?.findings.filter((f) => isPatternProblem(f.class) || f.class === 'personal-fit') ?? [];
  const link = <ButtonLink href={{ pathname: '/findings/[trialId]', params: { trialId } }} label="Open the findings" tone="quiet" />;
  return (
    <Card title="Findings">
      {error ? <LoadError error={error} onRetry={() => mutate()} /> : null}
      {!data && !error ? <Loading label="Adding up the reports…" /> : null}
      {data?.pending ? <AppText variant="caption">Newer reports are being counted; this updates by itself.</AppText> : null}
      {data && !result ? <Empty>No report is submitted yet. Findings appear once testers send their check-ins or final reports.</Empty> : null}
      {result ? (
        <AppText variant="caption">
          {`Draft ${result.draft}: ${result.testers} ${result.testers === 1 ? 'tester' : 'testers'} reported. ${
            shown.length === 0
              ? 'Nothing points at the pattern or at personal fit.'
              : `${shown.length} ${shown.length === 1 ? 'finding points' : 'findings point'} at the pattern or at personal fit; the findings screen has the rest, the charts and the draft comparison.`
          }`}
        </AppText>
      ) : null}
      <View style={styles.list}>
        {shown.map((f) => {
          const key = findingKey(f);
          return (
            <FindingRow
              key={key}
              studioId={studioId}
              trialId={trialId}
              finding={f}
              drafts={result?.drafts ?? []}
              unit={lengthUnit}
              canTriage={can(role, 'findings.triage')}
              open={openKey === key}
              onToggle={() => setOpenKey(openKey === key ? null : key)}
              wide={wide}
            />
          );
        })}
      </View>
      {link}
    </Card>
  );
}

const styles = StyleSheet.create({ list: { gap: space.sm } });
