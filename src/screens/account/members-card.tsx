import { StyleSheet, View } from 'react-native';

import { useMemberRemoveMutation, useMemberRoleMutation, useMembersQuery } from '@/api/members';
import { useActiveMembership, useSessionQuery } from '@/api/session';
import { describeError, ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { AppText } from '@/components/ui/text';
import { ROLE_LABELS, ROLES, type Role } from '@/shared/permissions';
import { colors, space } from '@/theme';

const ROLE_OPTIONS = ROLES.map((role) => ({ value: role, label: ROLE_LABELS[role] }));

/** Who is in the active organization. Owners change roles and remove people here. */
export function MembersCard() {
  const members = useMembersQuery();
  const { membership, can } = useActiveMembership();
  const session = useSessionQuery();
  const changeRole = useMemberRoleMutation();
  const remove = useMemberRemoveMutation();
  const manage = can('members:manage');
  const failure = changeRole.error ?? remove.error;

  return (
    <Card title={`Members of ${membership?.organizationName ?? 'this organization'}`} testID="members-card">
      {members.isPending ? <AppText muted>Loading members…</AppText> : null}
      {members.isError ? <ErrorState error={members.error} onRetry={() => members.refetch()} /> : null}
      {members.data?.map((member) => (
        <View key={member.id} style={styles.member} testID={`member-${member.email}`}>
          <View style={styles.who}>
            <AppText variant="label">{member.name}{member.userId === session.data?.user.id ? ' (you)' : ''}</AppText>
            <AppText variant="small" muted>{member.email}</AppText>
          </View>
          {manage ? (
            <View style={styles.controls}>
              <ChoiceChips<Role> label="Role" options={ROLE_OPTIONS} value={member.role} onChange={(role) => changeRole.mutate({ id: member.id, role })} testID={`member-role-${member.id}`} />
              <Button label="Remove" tone="quiet" onPress={() => remove.mutate(member.id)} testID={`member-remove-${member.id}`} />
            </View>
          ) : (
            <AppText variant="small">{ROLE_LABELS[member.role]}</AppText>
          )}
        </View>
      ))}
      <FormMessage tone="danger" text={failure ? describeError(failure) : null} testID="members-error" />
    </Card>
  );
}

const styles = StyleSheet.create({
  member: { gap: space.sm, paddingVertical: space.md, borderTopWidth: 1, borderTopColor: colors.rule },
  who: { gap: 2 },
  controls: { gap: space.sm },
});
