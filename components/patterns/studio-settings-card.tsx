import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { MeasurementField } from '@/components/ui/measurement-field';
import { Notice } from '@/components/ui/notice';
import { api } from '@/hooks/api';
import useSWR, { mutate } from 'swr';
import type { LengthUnit } from '@/server/domain/units';

type StudioWithSettings = { id: string; settings: { fullerBellyMarginMm: number } };

/** The owner's studio-wide thresholds for size advice. */
export function StudioSettingsCard({ studioId, unit }: { studioId: string; unit: LengthUnit }) {
  const key = `/api/studios/${studioId}`;
  const { data } = useSWR<StudioWithSettings>(key);
  const [margin, setMargin] = useState<number | null>(null);
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  // Shown once the studio's settings are in; the rest of the page does not wait for them.
  if (!data?.settings) return null;
  const value = margin ?? data.settings.fullerBellyMarginMm;
  const save = async () => {
    setMessage(null);
    try {
      await mutate(key, await api<StudioWithSettings>(key, { method: 'PATCH', body: { settings: { fullerBellyMarginMm: value } } }), { revalidate: false });
      setMessage({ tone: 'success', text: 'Settings saved.' });
    } catch (error) {
      setMessage({ tone: 'error', text: error instanceof Error ? error.message : 'Not saved.' });
    }
  };
  return (
    <Card title="Size advice settings">
      <MeasurementField
        label="Suggest the fuller-belly variant when the waist exceeds the size’s waist by more than"
        unit={unit}
        valueMm={value}
        onChangeMm={setMargin}
      />
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      <Button label="Save settings" tone="quiet" onPress={save} />
    </Card>
  );
}
