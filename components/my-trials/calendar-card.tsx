import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { startDownload } from '@/components/patterns/download';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { space } from '@/constants/theme';
import { myDataKeys, renewCalendarFeed, stopCalendarFeed, useMyCalendar } from '@/hooks/use-my-data';

/** The tester's due dates for their own calendar: a file to import, or a private address to subscribe to. */
export function CalendarCard() {
  const { data } = useMyCalendar();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const act = async (work: () => Promise<unknown>) => {
    setBusy(true);
    setError(null);
    try {
      await work();
    } catch (e) {
      setError(e instanceof Error ? e.message : 'That did not work.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <Card title="My dates in my calendar">
      <AppText variant="caption">Every report you owe, at your own due time, with a reminder the day before. A subscribed calendar follows any new date the studio gives you.</AppText>
      <Button label="Download my dates (.ics)" tone="quiet" onPress={() => startDownload(myDataKeys.calendarFile)} />
      {data?.feedUrl ? (
        <View style={styles.feed}>
          <TextField label="Private calendar address" value={data.feedUrl} editable={false} selectTextOnFocus hint="Add it in your calendar app as a subscription (by URL). Anyone with it can see your dates: keep it to yourself." />
          <View style={styles.actions}>
            <Button label="Make a new address" tone="quiet" busy={busy} onPress={() => act(renewCalendarFeed)} accessibleLabel="Make a new address for the calendar (the old one stops working)" />
            <Button label="Stop the address" tone="danger" busy={busy} onPress={() => act(stopCalendarFeed)} />
          </View>
        </View>
      ) : (
        <Button label="Get a private calendar address" busy={busy} busyLabel="Making it…" onPress={() => act(renewCalendarFeed)} />
      )}
      {error ? <Notice tone="error">{error}</Notice> : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  feed: { gap: space.sm },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
