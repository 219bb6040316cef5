import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { colors, space } from '@/constants/theme';
import { ApiError } from '@/hooks/api';
import { importChartCsv, patternKeys } from '@/hooks/use-patterns';
import { CsvFileInput } from './csv-file-input';
import { startDownload } from './download';

type Props = { studioId: string; patternId: string; canEdit: boolean; onImported: () => void };

/** The chart as a spreadsheet: download it, or replace the sizes and columns from a file. */
export function CsvPanel({ studioId, patternId, canEdit, onImported }: Props) {
  const [text, setText] = useState('');
  const [busy, setBusy] = useState(false);
  const [result, setResult] = useState<{ tone: 'error' | 'success'; message: string; problems: string[] } | null>(null);

  const importText = async (csv: string) => {
    setBusy(true);
    setResult(null);
    try {
      await importChartCsv(studioId, patternId, csv);
      setResult({ tone: 'success', message: 'Chart imported.', problems: [] });
      setText('');
      onImported();
    } catch (error) {
      const problems = error instanceof ApiError && error.fields ? Object.entries(error.fields).map(([where, what]) => `${where}: ${what}`) : [];
      setResult({ tone: 'error', message: error instanceof Error ? error.message : 'The file could not be imported.', problems });
    } finally {
      setBusy(false);
    }
  };

  return (
    <Card title="Spreadsheet">
      <AppText variant="caption">
        One row per size, a Size column first, then one column per measurement with its unit in the header, e.g. “Hip (in)” or “Finished hip (cm)”.
      </AppText>
      <Button label="Download the chart as CSV" tone="quiet" onPress={() => startDownload(`${patternKeys.one(studioId, patternId)}/chart.csv`)} />
      {canEdit ? (
        <>
          <CsvFileInput onText={importText} />
          <TextField label="Or paste CSV here" value={text} onChangeText={setText} multiline autoCapitalize="none" />
          <Button label="Import pasted CSV" busyLabel="Importing…" busy={busy} disabled={!text.trim()} onPress={() => importText(text)} />
          <AppText variant="caption">Importing replaces the sizes and columns; sizes with the same label keep their variants and fabric needs. A file with any problem changes nothing.</AppText>
        </>
      ) : null}
      {result ? (
        <View style={styles.result}>
          <Notice tone={result.tone}>{result.message}</Notice>
          {result.problems.map((p) => (
            <AppText key={p} variant="caption" style={styles.problem}>
              {`\u2022 ${p}`}
            </AppText>
          ))}
        </View>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  result: { gap: space.xs },
  problem: { color: colors.warning },
});
