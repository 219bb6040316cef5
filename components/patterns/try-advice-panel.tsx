import { useState } from 'react';
import { View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { MeasurementField } from '@/components/ui/measurement-field';
import { Notice } from '@/components/ui/notice';
import { api } from '@/hooks/api';
import { patternKeys } from '@/hooks/use-patterns';
import { governingMeasurements, type GarmentCategory } from '@/server/domain/garments';
import { MEASUREMENTS, type MeasurementKey } from '@/server/domain/measurements';
import type { SizeAdvice } from '@/server/domain/size-advice';
import type { LengthUnit } from '@/server/domain/units';
import { AdviceView } from './advice-view';

type Props = { studioId: string; patternId: string; category: GarmentCategory; columns: string[]; unit: LengthUnit };

/** Lets the studio try the saved chart against a body before testers see it. */
export function TryAdvicePanel({ studioId, patternId, category, columns, unit }: Props) {
  const keys = [...new Set<MeasurementKey>([...governingMeasurements(category), ...(columns as MeasurementKey[]), 'height'])];
  const [body, setBody] = useState<Partial<Record<MeasurementKey, number | null>>>({});
  const [advice, setAdvice] = useState<SizeAdvice | null>(null);
  const [failure, setFailure] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const run = async () => {
    setBusy(true);
    setFailure(null);
    try {
      const measurementsMm = Object.fromEntries(Object.entries(body).filter(([, v]) => v != null));
      const res = await api<{ advice: SizeAdvice }>(`${patternKeys.one(studioId, patternId)}/size-advice`, { method: 'POST', body: { measurementsMm } });
      setAdvice(res.advice);
    } catch (error) {
      setFailure(error instanceof Error ? error.message : 'No advice could be given.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <Card title="Try the size advice">
      <View>
        {keys.map((k) => (
          <MeasurementField
            key={k}
            label={`Try ${MEASUREMENTS.find((m) => m.key === k)?.label.toLowerCase() ?? k}`}
            unit={unit}
            valueMm={body[k] ?? null}
            onChangeMm={(mm) => setBody((b) => ({ ...b, [k]: mm }))}
          />
        ))}
      </View>
      <Button label="Advise a size" busyLabel="Working it out…" busy={busy} onPress={run} />
      {failure ? <Notice tone="error">{failure}</Notice> : null}
      {advice ? <AdviceView advice={advice} /> : null}
    </Card>
  );
}
