import { zodResolver } from '@hookform/resolvers/zod';
import dayjs from 'dayjs';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { applyApiError } from '@/components/forms/api-errors';
import { EMAIL_INPUT, FormTextField } from '@/components/forms/form-text-field';
import { CommunitySettingsCard } from '@/components/studio/community-settings-card';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ConfirmPanel } from '@/components/ui/confirm-panel';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { Empty, LoadError, Loading } from '@/components/ui/states';
import { AppText } from '@/components/ui/text';
import { colors, space } from '@/constants/theme';
import { useSession } from '@/hooks/use-session';
import { changeRole, invite, removeMember, useInvitations, useMembers, withdrawInvitation, type Member } from '@/hooks/use-studio';
import { can } from '@/server/domain/policy';
import { INVITABLE_ROLES, ROLE_LABELS, ROLES, type InvitableRole, type Role } from '@/server/domain/roles';
import { inviteSchema, type InviteInput } from '@/server/domain/schemas/studios';

function InviteForm({ studioId, isOwner }: { studioId: string; isOwner: boolean }) {
  const [formError, setFormError] = useState<string | null>(null);
  const [sent, setSent] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState, reset } = useForm<InviteInput>({
    resolver: zodResolver(inviteSchema),
    defaultValues: { email: '', role: 'tester' },
  });
  const roles = INVITABLE_ROLES.filter((r) => isOwner || r !== 'coordinator');
  const submit = handleSubmit(async (values) => {
    setFormError(null);
    setSent(null);
    try {
      await invite(studioId, values);
      setSent(`Invitation sent to ${values.email}.`);
      reset({ email: '', role: values.role });
    } catch (error) {
      setFormError(applyApiError(error, setError, ['email', 'role']));
    }
  });
  return (
    <Card title="Invite someone">
      {sent ? <Notice tone="success">{sent}</Notice> : null}
      {formError ? <Notice tone="error">{formError}</Notice> : null}
      <FormTextField control={control} name="email" label="E-mail" {...EMAIL_INPUT} />
      <Controller
        control={control}
        name="role"
        render={({ field, fieldState }) => (
          <ChoiceGroup<InvitableRole>
            label="Role"
            options={roles.map((r) => ({ value: r, label: ROLE_LABELS[r] }))}
            value={field.value}
            onChange={field.onChange}
            error={fieldState.error?.message}
          />
        )}
      />
      <Button label="Send invitation" busyLabel="Sending…" busy={formState.isSubmitting} onPress={submit} />
    </Card>
  );
}

/** What each role may do in the studio, in the words a confirmation shows (see policy.ts). */
const ROLE_POWERS: Record<Role, string> = {
  owner: 'everything in the studio, members and deletion included',
  coordinator: 'run trials and patterns, but not members or deletion',
  grader: 'read patterns, reports, photos and findings and triage findings, without changing trials',
  tester: 'see only their own trials, reports and photos',
};

function MemberRow({ member, studioId, canEdit, isSelf }: { member: Member; studioId: string; canEdit: boolean; isSelf: boolean }) {
  // A role change or a removal is only asked for here; the confirmation below does it.
  const [asking, setAsking] = useState<{ kind: 'role'; role: Role } | { kind: 'remove' } | null>(null);
  return (
    <View style={styles.row} aria-label={`${member.name}, ${ROLE_LABELS[member.role]}`}>
      <AppText variant="heading">{member.name}</AppText>
      <AppText variant="caption">{`${member.email} · ${ROLE_LABELS[member.role]}${isSelf ? ' · you' : ''}`}</AppText>
      {canEdit ? (
        <>
          <ChoiceGroup<Role>
            label={`Role of ${member.name}`}
            options={ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] }))}
            value={asking?.kind === 'role' ? asking.role : member.role}
            onChange={(role) => setAsking(role === member.role ? null : { kind: 'role', role })}
          />
          {asking?.kind === 'role' ? (
            <ConfirmPanel
              question={`Make ${isSelf ? 'yourself' : member.name} ${ROLE_LABELS[asking.role].toLowerCase()}?`}
              consequences={[
                `${isSelf ? 'You' : member.name} will ${ROLE_POWERS[asking.role]}.`,
                `Now: ${ROLE_LABELS[member.role].toLowerCase()}, who may ${ROLE_POWERS[member.role]}.`,
              ]}
              confirmLabel={`Yes, make ${ROLE_LABELS[asking.role].toLowerCase()}`}
              busyLabel="Changing the role…"
              onCancel={() => setAsking(null)}
              onConfirm={async () => {
                await changeRole(studioId, member.id, asking.role);
                setAsking(null);
              }}
            />
          ) : null}
          {!isSelf && asking?.kind === 'remove' ? (
            <ConfirmPanel
              question={`Remove ${member.name} from the studio?`}
              consequences={[
                `${member.name} loses access to this studio's ${member.role === 'tester' ? 'trials' : 'patterns, trials, reports and findings'} at once.`,
                'Their own account, and anything they wrote, stays.',
                'To have them back, send a new invitation.',
              ]}
              confirmLabel="Yes, remove"
              busyLabel="Removing…"
              onCancel={() => setAsking(null)}
              onConfirm={() => removeMember(studioId, member.id)}
            />
          ) : null}
          {!isSelf && asking?.kind !== 'remove' ? (
            <Button label="Remove from the studio" accessibleLabel={`Remove from the studio: ${member.name}`} tone="danger" onPress={() => setAsking({ kind: 'remove' })} />
          ) : null}
        </>
      ) : null}
    </View>
  );
}

export default function MembersScreen() {
  const { session, currentStudio } = useSession();
  const studioId = currentStudio?.id;
  const members = useMembers(studioId);
  const invitations = useInvitations(studioId);
  const role = currentStudio?.role;
  const isOwner = can(role, 'members.changeRole');
  const open = (invitations.data ?? []).filter((i) => i.state === 'open');

  return (
    <Screen title="Members" intro="Who works in this studio and in which role. Testers see only their own trials and reports.">
      {studioId && can(role, 'invitations.create') ? <InviteForm studioId={studioId} isOwner={isOwner} /> : null}
      {studioId && can(role, 'members.list') ? <CommunitySettingsCard studioId={studioId} canEdit={can(role, 'studio.update')} /> : null}

      <Card title="Open invitations">
        {invitations.error ? <LoadError error={invitations.error} onRetry={() => invitations.mutate()} /> : null}
        {!invitations.data && !invitations.error ? <Loading /> : null}
        {invitations.data && open.length === 0 ? <Empty>No invitation is waiting for an answer.</Empty> : null}
        {open.map((i) => (
          <View key={i.id} style={styles.row}>
            <AppText>{`${i.email} · ${ROLE_LABELS[i.role]}`}</AppText>
            <AppText variant="caption">{`Open until ${dayjs(i.expiresAt).format('D MMM YYYY')}`}</AppText>
            <Button
              label="Withdraw"
              accessibleLabel={`Withdraw the invitation to ${i.email}`}
              tone="quiet"
              onPress={() => studioId && withdrawInvitation(studioId, i.id)}
            />
          </View>
        ))}
      </Card>

      <Card title="Members">
        {members.error ? <LoadError error={members.error} onRetry={() => members.mutate()} /> : null}
        {!members.data && !members.error ? <Loading /> : null}
        {members.data?.map((m) => (
          <MemberRow key={m.id} member={m} studioId={studioId!} canEdit={isOwner} isSelf={m.userId === session?.user.id} />
        ))}
      </Card>
    </Screen>
  );
}

const styles = StyleSheet.create({
  row: { gap: space.xs, paddingVertical: space.sm, borderTopWidth: 1, borderTopColor: colors.line },
});
