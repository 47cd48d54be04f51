import { Pressable, StyleSheet, View } from 'react-native';

import { useSessionQuery, useSwitchOrganizationMutation } from '@/api/session';
import { describeError } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Card } from '@/components/ui/card';
import { AppText } from '@/components/ui/text';
import { ROLE_LABELS } from '@/shared/permissions';
import { colors, radius, space, TOUCH_MIN } from '@/theme';

const KIND_LABELS = { feed_mill: 'Feed mill', farm: 'Farm', advisory: 'Advisory office' } as const;

/** The organizations a person belongs to, with their role in each; tapping one makes it the active one. */
export function OrganizationsCard() {
  const { data } = useSessionQuery();
  const switchTo = useSwitchOrganizationMutation();
  if (!data) return null;
  return (
    <Card title="Organizations" testID="organizations-card">
      {data.memberships.length === 0 ? <AppText muted>You belong to no organization yet. Ask an owner to invite you.</AppText> : null}
      {data.memberships.map((m) => {
        const active = m.organizationId === data.activeOrganizationId;
        return (
          <Pressable
            key={m.organizationId}
            role="radio"
            aria-checked={active}
            disabled={active || switchTo.isPending}
            onPress={() => switchTo.mutate(m.organizationId)}
            style={[styles.row, active && styles.rowActive]}
            testID={`organization-${m.organizationId}`}
          >
            <View style={styles.rowText}>
              <AppText variant="label">{m.organizationName}</AppText>
              <AppText variant="small" muted>{KIND_LABELS[m.organizationKind]} · {ROLE_LABELS[m.role]}</AppText>
            </View>
            <AppText variant="small" style={active ? styles.activeMark : styles.switchMark}>{active ? 'Active' : 'Switch'}</AppText>
          </Pressable>
        );
      })}
      <FormMessage tone="danger" text={switchTo.isError ? describeError(switchTo.error) : null} />
    </Card>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', alignItems: 'center', gap: space.md, minHeight: TOUCH_MIN, padding: space.md, borderRadius: radius.md, borderWidth: 1, borderColor: colors.rule },
  rowActive: { backgroundColor: colors.brandSoft, borderColor: colors.brand },
  rowText: { flex: 1 },
  activeMark: { color: colors.brand },
  switchMark: { color: colors.inkMuted, textDecorationLine: 'underline' },
});
