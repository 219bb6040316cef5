import dayjs from 'dayjs';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { spacePresses } from '@/components/ui/keyboard';
import { ToggleChips } from '@/components/ui/toggle-chips';
import { colors, fonts, radius, space } from '@/constants/theme';
import { useIsWide } from '@/hooks/use-is-wide';
import { inviteFromPool, usePool, usePoolCalls, type PoolFilter, type PoolPerson } from '@/hooks/use-release';
import { POOL_HEIGHT_BANDS } from '@/server/domain/schemas/release';

function PersonRow({ p, chosen, onToggle, wide }: { p: PoolPerson; chosen: boolean; onToggle: () => void; wide: boolean }) {
  const owed = p.reports.onTime + p.reports.late + p.reports.missed;
  return (
    <Pressable
      role="checkbox"
      aria-checked={chosen}
      onPress={onToggle}
      {...spacePresses(onToggle)}
      style={[styles.person, chosen ? styles.chosen : null, wide ? styles.personWide : null]}
    >
      <View style={styles.personHead}>
        <View style={[styles.box, chosen ? styles.boxOn : null]}>{chosen ? <AppText style={styles.tick}>✓</AppText> : null}</View>
        <AppText style={styles.name}>{p.name}</AppText>
      </View>
      <AppText variant="caption">{`Sizes ${p.sizes.join(', ') || '–'}${p.variants.length ? ` · ${p.variants.join(', ')}` : ''} · ${p.heightBand?.label ?? 'height not given'}`}</AppText>
      <AppText variant="caption">
        {`${p.trialsFinished} of ${p.trials.length} ${p.trials.length === 1 ? 'trial' : 'trials'} finished · ${owed ? `${p.reports.onTime} of ${owed} reports on time` : 'no report due yet'}${p.lastTrialAt ? ` · last ${dayjs(p.lastTrialAt).format('MMM YYYY')}` : ''}`}
      </AppText>
      {p.invitedTo.length ? <AppText variant="caption" style={styles.invited}>{`Invited to ${p.invitedTo.map((i) => i.title).join(', ')}`}</AppText> : null}
    </Pressable>
  );
}

/** The studio's testers from past trials, filtered, and chosen ones invited to a call. */
export function TesterPool({ studioId }: { studioId: string }) {
  const wide = useIsWide();
  const [filter, setFilter] = useState<PoolFilter>({});
  const [sizeText, setSizeText] = useState('');
  const [variantText, setVariantText] = useState('');
  const { data, error, mutate } = usePool(studioId, filter);
  const { data: calls } = usePoolCalls(studioId);
  const [chosen, setChosen] = useState<string[]>([]);
  const [callId, setCallId] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);

  const invite = async () => {
    if (!callId) return;
    setBusy(true);
    setMessage(null);
    try {
      const r = await inviteFromPool(studioId, callId, chosen);
      const parts = [
        r.sent ? `${r.sent} invited by e-mail` : null,
        r.waitingForCall ? `${r.waitingForCall} will be invited when the call opens` : null,
        r.alreadyInvited ? `${r.alreadyInvited} invited before` : null,
        r.alreadyApplied ? `${r.alreadyApplied} applied already` : null,
      ].filter(Boolean);
      setMessage({ tone: 'success', text: `${parts.join('; ') || 'Nobody new to invite'}.` });
      setChosen([]);
    } catch (e) {
      setMessage({ tone: 'error', text: e instanceof Error ? e.message : 'Not sent.' });
    } finally {
      setBusy(false);
    }
  };

  return (
    <Screen title="Tester pool" intro="Everyone who tested for the studio: what they sewed, their height band, how their reports came in. Choose people to invite to a call; they still apply.">
      <Card title="Filter">
        <View style={wide ? styles.filterRow : styles.filterStack}>
          <View style={wide ? styles.filterField : null}>
            <TextField label="Size sewn" value={sizeText} onChangeText={setSizeText} onBlur={() => setFilter((f) => ({ ...f, size: sizeText.trim() || undefined }))} placeholder="e.g. 14" />
          </View>
          <View style={wide ? styles.filterField : null}>
            <TextField label="Variant" value={variantText} onChangeText={setVariantText} onBlur={() => setFilter((f) => ({ ...f, variant: variantText.trim() || undefined }))} placeholder="e.g. fuller belly" />
          </View>
        </View>
        <ChoiceGroup
          label="Height band"
          options={[{ value: 'any', label: 'Any' }, ...POOL_HEIGHT_BANDS.map((b) => ({ value: b.id, label: b.label }))]}
          value={filter.band ?? 'any'}
          onChange={(v) => setFilter((f) => ({ ...f, band: v === 'any' ? undefined : v }))}
        />
        <ToggleChips
          label="Record"
          options={[
            { value: 'finished', label: 'Finished a trial' },
            { value: 'onTime', label: 'Every report on time' },
          ]}
          selected={[...(filter.minFinished ? ['finished'] : []), ...(filter.onTime ? ['onTime'] : [])]}
          onChange={(sel) => setFilter((f) => ({ ...f, minFinished: sel.includes('finished') ? 1 : undefined, onTime: sel.includes('onTime') || undefined }))}
        />
        <Button
          label="Apply the filter"
          tone="quiet"
          onPress={() => setFilter((f) => ({ ...f, size: sizeText.trim() || undefined, variant: variantText.trim() || undefined }))}
        />
      </Card>

      <Card title="Invite to a call">
        {calls && calls.length === 0 ? <Empty>No call is open or being prepared. Create a trial (or copy one) first.</Empty> : null}
        {calls && calls.length ? (
          <ChoiceGroup label="Call" options={calls.map((c) => ({ value: c.id, label: `${c.title}${c.state === 'draft' ? ' (not public yet)' : ''}` }))} value={callId} onChange={setCallId} />
        ) : null}
        <AppText variant="caption">{`${chosen.length} chosen. People invited to a call that is not public yet get the e-mail when it opens.`}</AppText>
        {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
        <Button label={`Invite ${chosen.length || ''} to apply`.replace('  ', ' ')} busy={busy} busyLabel="Inviting…" disabled={!callId || chosen.length === 0} onPress={invite} />
      </Card>

      <Card title={data ? `${data.length} ${data.length === 1 ? 'person' : 'people'}` : 'People'}>
        {error ? <LoadError error={error} onRetry={() => mutate()} /> : null}
        {!data && !error ? <Loading /> : null}
        {data && data.length === 0 ? <Empty>Nobody matches. Loosen the filter; people appear here once they tested for the studio.</Empty> : null}
        {data && data.length ? (
          <View style={styles.actions}>
            <Button label="Choose all shown" tone="quiet" onPress={() => setChosen([...new Set([...chosen, ...data.map((p) => p.userId)])])} />
            <Button label="Choose none" tone="quiet" disabled={chosen.length === 0} onPress={() => setChosen([])} />
          </View>
        ) : null}
        <View style={wide ? styles.grid : styles.list}>
          {data?.map((p) => (
            <PersonRow
              key={p.userId}
              p={p}
              wide={wide}
              chosen={chosen.includes(p.userId)}
              onToggle={() => setChosen((c) => (c.includes(p.userId) ? c.filter((x) => x !== p.userId) : [...c, p.userId]))}
            />
          ))}
        </View>
      </Card>
    </Screen>
  );
}

const styles = StyleSheet.create({
  filterRow: { flexDirection: 'row', gap: space.md },
  filterStack: { gap: space.sm },
  filterField: { flex: 1 },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  list: { gap: space.sm },
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  person: { gap: 2, padding: space.md, borderRadius: radius.sm, borderWidth: 1, borderColor: colors.line, backgroundColor: colors.surface },
  personWide: { width: '49%' },
  chosen: { borderColor: colors.thread, backgroundColor: colors.threadSoft },
  personHead: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  box: { width: 22, height: 22, borderRadius: 4, borderWidth: 2, borderColor: colors.inkMuted, alignItems: 'center', justifyContent: 'center' },
  boxOn: { borderColor: colors.thread, backgroundColor: colors.thread },
  tick: { color: colors.chalk, fontFamily: fonts.bold, fontSize: 14, lineHeight: 16 },
  name: { fontFamily: fonts.semibold },
  invited: { color: colors.thread },
});
