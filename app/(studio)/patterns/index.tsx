import { Link } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';
import { NewPatternForm } from '@/components/patterns/new-pattern-form';
import { StudioSettingsCard } from '@/components/patterns/studio-settings-card';
import { Card } from '@/components/ui/card';
import { Screen } from '@/components/ui/screen';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { colors, radius, space } from '@/constants/theme';
import { usePatterns } from '@/hooks/use-patterns';
import { useSession } from '@/hooks/use-session';
import { offersFullerBelly } from '@/server/domain/category-wording';
import { FABRIC_KINDS, GARMENT_CATEGORIES, isGarmentCategory } from '@/server/domain/garments';
import { can } from '@/server/domain/policy';

const categoryLabel = (key: string) => GARMENT_CATEGORIES.find((c) => c.key === key)?.label ?? key;
const fabricLabel = (key: string) => FABRIC_KINDS.find((k) => k.key === key)?.label ?? key;

export default function PatternsScreen() {
  const { session, currentStudio } = useSession();
  const { data, error, mutate } = usePatterns(currentStudio?.id);
  return (
    <Screen title="Patterns" intro="Each pattern with its size chart, finished measurements, fabric needs and drafts.">
      {currentStudio && can(currentStudio.role, 'patterns.write') ? <NewPatternForm studioId={currentStudio.id} /> : null}
      <Card title="The studio’s patterns">
        {error ? <LoadError error={error} onRetry={() => mutate()} /> : null}
        {!data && !error ? <Loading /> : null}
        {data && data.length === 0 ? <Empty>No patterns yet.</Empty> : null}
        <View style={styles.list}>
          {data?.map((p) => (
            <Link key={p.id} href={{ pathname: '/patterns/[id]', params: { id: p.id } }} asChild>
              <Pressable role="link" style={styles.row}>
                <AppText variant="heading">{p.name}</AppText>
                <AppText variant="caption">
                  {`${categoryLabel(p.category)} · ${fabricLabel(p.fabricKind)}${p.minStretchPct != null ? ` (${p.minStretchPct} % stretch)` : ''} · ${
                    p.sizes.length ? `sizes ${p.sizes[0]}–${p.sizes[p.sizes.length - 1]}` : 'no sizes yet'
                  }${p.archived ? ' · archived' : ''}`}
                </AppText>
              </Pressable>
            </Link>
          ))}
        </View>
      </Card>
      {/* The fuller-belly setting concerns only garments that are offered that variant. */}
      {currentStudio && session && can(currentStudio.role, 'studio.update') && data?.some((p) => isGarmentCategory(p.category) && offersFullerBelly(p.category)) ? (
        <StudioSettingsCard studioId={currentStudio.id} unit={session.user.lengthUnit} />
      ) : null}
    </Screen>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  row: { padding: space.md, borderRadius: radius.sm, borderWidth: 1, borderColor: colors.line, backgroundColor: colors.surface, gap: 2 },
});
