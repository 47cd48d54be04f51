import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Link, useLocalSearchParams, useRouter } from 'expo-router';
import { Formik } from 'formik';
import * as yup from 'yup';

import { useInvitationPreviewQuery, useSignUpMutation } from '@/api/session';
import { AuthFrame } from '@/components/auth/auth-frame';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { applyServerErrors } from '@/lib/form-errors';
import { ROLE_LABELS } from '@/shared/permissions';
import { colors, space } from '@/theme';

import { emailField, newPasswordField } from './validation';

type Kind = 'feed_mill' | 'farm' | 'advisory';
const KINDS: { value: Kind; label: string }[] = [
  { value: 'feed_mill', label: 'Feed mill' },
  { value: 'farm', label: 'Farm' },
  { value: 'advisory', label: 'Advisory office' },
];

/** New account: either with a new organization of one's own, or joining through an invitation link. */
export function SignUpScreen() {
  const router = useRouter();
  const { invitation } = useLocalSearchParams<{ invitation?: string }>();
  const preview = useInvitationPreviewQuery(invitation);
  const signUp = useSignUpMutation();
  const [formError, setFormError] = useState<string | null>(null);
  const joining = !!invitation;

  const schema = yup.object({
    name: yup.string().trim().required('Enter your name.').max(120),
    email: emailField,
    password: newPasswordField,
    organizationName: joining ? yup.string() : yup.string().trim().required('Name your mill, farm or office.').min(2, 'Use at least 2 characters.').max(160),
    organizationKind: yup.mixed<Kind>().oneOf(['feed_mill', 'farm', 'advisory']).required(),
  });

  return (
    <AuthFrame
      title={joining ? 'Create your account to join' : 'Create an account'}
      lead={joining && preview.data ? `${preview.data.organizationName} invites you as ${ROLE_LABELS[preview.data.role].toLowerCase()}.` : 'You will own a new organization: your mill, farm or advisory office. You can invite others later.'}
      testID="screen-sign-up"
    >
      <Formik
        enableReinitialize
        initialValues={{ name: '', email: preview.data?.email ?? '', password: '', organizationName: '', organizationKind: 'feed_mill' as Kind }}
        validationSchema={schema}
        onSubmit={async (values, helpers) => {
          setFormError(null);
          try {
            await signUp.mutateAsync({
              name: values.name.trim(),
              email: values.email.trim(),
              password: values.password,
              ...(joining ? { invitationToken: invitation } : { organizationName: values.organizationName.trim(), organizationKind: values.organizationKind }),
            });
            router.replace('/');
          } catch (error) {
            setFormError(applyServerErrors(error, helpers));
          }
        }}
      >
        {({ handleChange, handleBlur, handleSubmit, setFieldValue, values, errors, touched, isSubmitting }) => (
          <View style={styles.form}>
            <TextField label="Your name" testID="sign-up-name" autoComplete="name" value={values.name} onChangeText={handleChange('name')} onBlur={handleBlur('name')} error={touched.name && errors.name} />
            <TextField label="E-mail" testID="sign-up-email" autoComplete="email" inputMode="email" autoCapitalize="none" editable={!joining} value={values.email} onChangeText={handleChange('email')} onBlur={handleBlur('email')} error={touched.email && errors.email} />
            <TextField label="Password" hint="at least 10 characters" testID="sign-up-password" autoComplete="new-password" secureTextEntry value={values.password} onChangeText={handleChange('password')} onBlur={handleBlur('password')} error={touched.password && errors.password} />
            {joining ? null : (
              <>
                <TextField label="Organization name" testID="sign-up-organization" value={values.organizationName} onChangeText={handleChange('organizationName')} onBlur={handleBlur('organizationName')} error={touched.organizationName && errors.organizationName} />
                <ChoiceChips label="It is a" options={KINDS} value={values.organizationKind} onChange={(kind) => setFieldValue('organizationKind', kind)} testID="sign-up-kind" />
              </>
            )}
            <FormMessage tone="danger" text={formError ?? (preview.isError ? 'This invitation has expired or was already used. Ask for a new one.' : null)} testID="sign-up-error" />
            <Button label={isSubmitting ? 'Creating…' : 'Create account'} disabled={isSubmitting} onPress={() => handleSubmit()} testID="sign-up-submit" />
          </View>
        )}
      </Formik>
      <Link href="/sign-in"><AppText style={styles.link}>Already have an account? Sign in</AppText></Link>
    </AuthFrame>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  link: { color: colors.brand, textDecorationLine: 'underline' },
});
