import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Formik } from 'formik';
import * as yup from 'yup';

import { useInvitationCreateMutation, useInvitationsQuery, useInvitationWithdrawMutation } from '@/api/members';
import { ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { applyServerErrors } from '@/lib/form-errors';
import { ROLE_DESCRIPTIONS, ROLE_LABELS, ROLES, type Role } from '@/shared/permissions';
import { colors, space } from '@/theme';

import { emailField } from '../auth/validation';

const ROLE_OPTIONS = ROLES.map((role) => ({ value: role, label: ROLE_LABELS[role] }));

/** Owners only: invite someone by e-mail with a role, and see or withdraw invitations not yet accepted. */
export function InviteCard() {
  const create = useInvitationCreateMutation();
  const pending = useInvitationsQuery(true);
  const withdraw = useInvitationWithdrawMutation();
  const [message, setMessage] = useState<{ tone: 'ok' | 'danger'; text: string } | null>(null);

  return (
    <Card title="Invite a member" testID="invite-card">
      <Formik
        initialValues={{ email: '', role: 'nutritionist' as Role }}
        validationSchema={yup.object({ email: emailField, role: yup.mixed<Role>().oneOf([...ROLES]).required() })}
        onSubmit={async (values, helpers) => {
          setMessage(null);
          try {
            await create.mutateAsync({ email: values.email.trim(), role: values.role });
            setMessage({ tone: 'ok', text: `Invitation sent to ${values.email.trim()}.` });
            helpers.resetForm({ values: { email: '', role: values.role } });
          } catch (error) {
            setMessage({ tone: 'danger', text: applyServerErrors(error, helpers) });
          }
        }}
      >
        {({ handleChange, handleBlur, handleSubmit, setFieldValue, values, errors, touched, isSubmitting }) => (
          <View style={styles.form}>
            <TextField label="E-mail" testID="invite-email" inputMode="email" autoCapitalize="none" value={values.email} onChangeText={handleChange('email')} onBlur={handleBlur('email')} error={touched.email && errors.email} />
            <ChoiceChips<Role> label="Role" options={ROLE_OPTIONS} value={values.role} onChange={(role) => setFieldValue('role', role)} testID="invite-role" />
            <AppText variant="small" muted>{ROLE_DESCRIPTIONS[values.role]}</AppText>
            <FormMessage tone={message?.tone ?? 'ok'} text={message?.text} testID="invite-message" />
            <Button label={isSubmitting ? 'Sending…' : 'Send invitation'} disabled={isSubmitting} onPress={() => handleSubmit()} testID="invite-submit" />
          </View>
        )}
      </Formik>
      {pending.isError ? <ErrorState error={pending.error} onRetry={() => pending.refetch()} /> : null}
      {pending.data && pending.data.length > 0 ? (
        <View style={styles.pending} testID="pending-invitations">
          <AppText variant="label">Waiting for an answer</AppText>
          {pending.data.map((invitation) => (
            <View key={invitation.id} style={styles.pendingRow}>
              <AppText style={styles.pendingText}>{invitation.email} · {ROLE_LABELS[invitation.role]}</AppText>
              <Button label="Withdraw" tone="quiet" onPress={() => withdraw.mutate(invitation.id)} />
            </View>
          ))}
        </View>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.md },
  pending: { gap: space.sm, paddingTop: space.md, borderTopWidth: 1, borderTopColor: colors.rule },
  pendingRow: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  pendingText: { flex: 1, minWidth: 180 },
});
