import { StyleSheet, View } from 'react-native';

import { useFormulaArchiveMutation } from '@/api/formulas';
import { useActiveMembership } from '@/api/session';
import { describeError } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { AppText } from '@/components/ui/text';
import { PERMISSION_ROLES, ROLE_LABELS } from '@/shared/permissions';
import type { FormulaSummary } from '@/shared/schemas/formulas';
import { colors, radius, space } from '@/theme';

import { when } from './format';

/** Who may archive and restore formulas, in words ("Owners and nutritionists"), from the permission table itself. */
export function whoMayArchive(): string {
  const names = PERMISSION_ROLES['formulas:approve'].map((r) => `${ROLE_LABELS[r].toLowerCase()}s`);
  const list = names.length <= 1 ? (names[0] ?? '') : `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
  return list.charAt(0).toUpperCase() + list.slice(1);
}

/**
 * The top of an archived formula's page: it is read-only, what still works, and Restore for those who
 * may (everyone else reads who can).
 */
export function ArchivedBanner({ formula }: { formula: Pick<FormulaSummary, 'id' | 'name' | 'archived'> }) {
  const { can } = useActiveMembership();
  const restore = useFormulaArchiveMutation(formula.id);
  if (!formula.archived) return null;
  return (
    <View style={styles.banner} testID="archived-banner">
      <AppText variant="label">Archived: read-only</AppText>
      <AppText>
        Archived by {formula.archived.by ?? 'someone no longer in the organization'}, {when(formula.archived.at)}. It is out of the formula list and the mill’s list of approved formulas, and
        its inputs and versions cannot be changed, solved or approved. Batch sheets already handed out, the batch log and links shared with farms still work.
      </AppText>
      {can('formulas:approve') ? (
        <Button label={restore.isPending ? 'Restoring…' : 'Restore'} onPress={() => restore.mutate('restore')} disabled={restore.isPending} testID="restore-formula" />
      ) : (
        <AppText variant="small" muted>{whoMayArchive()} can restore it.</AppText>
      )}
      <FormMessage tone="danger" text={restore.isError ? `Nothing was restored. ${describeError(restore.error)}` : null} testID="restore-error" />
    </View>
  );
}

const styles = StyleSheet.create({
  banner: { gap: space.sm, padding: space.lg, borderRadius: radius.md, borderLeftWidth: 4, borderLeftColor: colors.caution, backgroundColor: colors.cautionSoft },
});
