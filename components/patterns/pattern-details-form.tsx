import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Notice } from '@/components/ui/notice';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { ApiError } from '@/hooks/api';
import { updatePattern, type PatternDetail } from '@/hooks/use-patterns';
import { FABRIC_KINDS, GARMENT_CATEGORIES, type FabricKind, type GarmentCategory } from '@/server/domain/garments';

type YesNo = 'yes' | 'no';
export const FOR_CHILDREN: readonly { value: YesNo; label: string }[] = [
  { value: 'no', label: 'No' },
  { value: 'yes', label: 'Yes, in children’s sizes' },
];
export const FOR_CHILDREN_HINT =
  'Yes shows the children’s safety cautions (cords and drawstrings, small parts, flammability) whatever the garment, e.g. for a children’s hoodie filed as a top. They also show when the size chart has children’s sizes such as 2T, 6M, 7-8 yrs or heights under 150 cm (59 in).';

/** Name, garment, fabric and notes of a pattern; saved on request, errors beside their fields. */
export function PatternDetailsForm({ studioId, pattern }: { studioId: string; pattern: PatternDetail }) {
  const [name, setName] = useState(pattern.name);
  const [category, setCategory] = useState(pattern.category as GarmentCategory);
  const [fabricKind, setFabricKind] = useState(pattern.fabricKind as FabricKind);
  const [forChildren, setForChildren] = useState<YesNo>(pattern.childrensWear ? 'yes' : 'no');
  const [stretch, setStretch] = useState(pattern.minStretchPct == null ? '' : String(pattern.minStretchPct));
  const [notes, setNotes] = useState(pattern.notes ?? '');
  const [busy, setBusy] = useState(false);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);

  const save = async () => {
    setBusy(true);
    setErrors({});
    setMessage(null);
    try {
      await updatePattern(studioId, pattern.id, {
        name,
        category,
        fabricKind,
        childrensWear: forChildren === 'yes',
        minStretchPct: fabricKind === 'knit' && stretch.trim() !== '' ? Number(stretch) : null,
        notes: notes.trim() || null,
      });
      setMessage({ tone: 'success', text: 'Details saved.' });
    } catch (error) {
      if (error instanceof ApiError && error.fields) setErrors(error.fields);
      setMessage({ tone: 'error', text: error instanceof Error ? error.message : 'Not saved.' });
    } finally {
      setBusy(false);
    }
  };

  return (
    <Card title="Details">
      <TextField label="Pattern name" value={name} onChangeText={setName} error={errors.name} />
      <ChoiceGroup label="Garment" options={GARMENT_CATEGORIES.map((c) => ({ value: c.key, label: c.label }))} value={category} onChange={setCategory} error={errors.category} />
      <ChoiceGroup label="Made for children" options={FOR_CHILDREN} value={forChildren} onChange={setForChildren} error={errors.childrensWear} />
      <AppText variant="caption">{FOR_CHILDREN_HINT}</AppText>
      <ChoiceGroup label="Fabric" options={FABRIC_KINDS.map((k) => ({ value: k.key, label: k.label }))} value={fabricKind} onChange={setFabricKind} error={errors.fabricKind} />
      {fabricKind === 'knit' ? <TextField label="Minimum stretch (%)" value={stretch} onChangeText={setStretch} inputMode="numeric" error={errors.minStretchPct} /> : null}
      <TextField label="Notes" value={notes} onChangeText={setNotes} multiline error={errors.notes} />
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      <Button label="Save details" busyLabel="Saving…" busy={busy} onPress={save} />
    </Card>
  );
}
