import { StyleSheet, View } from 'react-native';
import { timeOfDay } from '@/components/trials/dates';
import { Button } from '@/components/ui/button';
import { AppText } from '@/components/ui/text';
import { colors, fonts, space } from '@/constants/theme';
import type { SaveStatus } from '@/hooks/use-report';
import type { ReportPart } from '@/server/domain/schemas/reports';

/** The report's parts in the words of the form. */
export const PART_LABELS: Record<ReportPart, string> = {
  sizeSewn: 'size sewn',
  variantSewn: 'variant sewn',
  draftVersion: 'draft version',
  fit: 'fit',
  alterations: 'alterations',
  fabric: 'fabric used',
  unclearSteps: 'unclear steps',
  verdict: 'verdict',
  wouldMakeAgain: 'would make it again',
};

const FIELD_LABELS: Record<string, string> = {
  sizeSewn: 'Size sewn',
  variantSewn: 'Variant sewn',
  draftVersion: 'Draft version sewn',
  fit: 'Fit',
  verdict: 'Overall verdict',
  wouldMakeAgain: 'I would make it again',
  'fabric.kind': 'Fabric',
  'fabric.fibre': 'Fibre content',
  'fabric.widthMm': 'Fabric width',
  'fabric.usedMm': 'Length used',
  'fabric.stretchPct': 'Stretch (%)',
  'fabric.napped': 'One-way layout',
};
const ROW_FIELDS: Record<string, Record<string, string>> = {
  alterations: { area: 'area', kind: 'what', amountMm: 'amount', where: 'where', note: 'note', otherText: 'describe it' },
  unclearSteps: { step: 'number', problem: 'what was unclear' },
};

/** A field of the report ("alterations.0.amountMm") in the words of its label ("Alteration 1: amount"). */
export function reportFieldLabel(path: string): string {
  const [part, index, field] = path.split('.');
  if (part === 'alterations' && index !== undefined) return `Alteration ${Number(index) + 1}${field ? `: ${ROW_FIELDS.alterations[field] ?? field}` : ''}`;
  if (part === 'unclearSteps' && index !== undefined) return `Unclear step ${Number(index) + 1}${field ? `: ${ROW_FIELDS.unclearSteps[field] ?? field}` : ''}`;
  if (part === 'fit' && index !== undefined) return `Fit at the ${index}`;
  return FIELD_LABELS[path] ?? FIELD_LABELS[part] ?? 'The report';
}

/** "Alteration 1: amount: must be at most 50 cm either way; Overall verdict: Give your overall verdict". */
export function describeFields(fields: Record<string, string>): string {
  return Object.entries(fields)
    .map(([path, message]) => `${reportFieldLabel(path)}: ${message}`)
    .join('; ');
}

/** What the status says, from what the server answered: "saved" only once it has every change. */
export function saveStatusText(status: SaveStatus, timeZone: string, submittedAt: string | null): string {
  switch (status.state) {
    case 'saving':
      return 'Saving…';
    case 'saved':
      return `${status.afterOffline ? 'Back online: your changes were sent. ' : ''}Saved at ${timeOfDay(status.at, timeZone)}.`;
    case 'offline':
      return 'Offline: your changes are kept on this device and will be sent when the connection returns.';
    case 'error':
      return `Not saved — ${(status.fields && Object.keys(status.fields).length ? describeFields(status.fields) : status.message).replace(/\.$/, '')}. ${status.retrying ? 'Trying again shortly; your changes are kept on this device.' : 'Your changes are kept on this device.'}`;
    default:
      return submittedAt ? 'Submitted. Changes you make are saved as you type.' : 'Not submitted yet. Changes are saved as you type.';
  }
}

type Props = { status: SaveStatus; unreadable: string[]; timeZone: string; submittedAt: string | null; onRetry: () => void };

/** The save status, kept in view at the foot of the report on every screen size. */
export function SaveStatusBar({ status, unreadable, timeZone, submittedAt, onRetry }: Props) {
  const trouble = status.state === 'error' || status.state === 'offline' || unreadable.length > 0;
  return (
    <View style={[styles.bar, trouble && styles.trouble]}>
      <View role="status" aria-live="polite" aria-label="Save status" style={styles.text}>
        <AppText style={styles.message}>{saveStatusText(status, timeZone, submittedAt)}</AppText>
        {unreadable.length ? <AppText variant="caption" style={styles.warn}>{`Not saved: ${unreadable.join(', ')} could not be read.`}</AppText> : null}
      </View>
      {/* A refused answer needs correcting, not resending: the button is for a lost connection or a server failure. */}
      {status.state === 'offline' || (status.state === 'error' && !status.fields) ? <Button label="Try again" tone="quiet" onPress={onRetry} /> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  bar: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    gap: space.sm,
    paddingHorizontal: space.lg,
    paddingVertical: space.sm,
    borderTopWidth: 1,
    borderTopColor: colors.line,
    backgroundColor: colors.surface,
  },
  trouble: { backgroundColor: colors.warningSoft, borderTopColor: colors.warning },
  text: { flexGrow: 1, flexShrink: 1, minWidth: 200, gap: 2 },
  message: { fontFamily: fonts.medium },
  warn: { color: colors.warning },
});
