import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Link, useLocalSearchParams, useRouter } from 'expo-router';
import { Formik } from 'formik';
import * as yup from 'yup';

import { useSignInMutation } from '@/api/session';
import { AuthFrame } from '@/components/auth/auth-frame';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { applyServerErrors } from '@/lib/form-errors';
import { colors, space } from '@/theme';

import { emailField } from './validation';

const schema = yup.object({ email: emailField, password: yup.string().required('Enter your password.') });

export function SignInScreen() {
  const router = useRouter();
  const { next } = useLocalSearchParams<{ next?: string }>();
  // Only a path inside the app: an open redirect would let a mailed link send people elsewhere.
  const target = next && next.startsWith('/') && !next.startsWith('//') ? next : '/';
  const signIn = useSignInMutation();
  const [formError, setFormError] = useState<string | null>(null);

  return (
    <AuthFrame title="Sign in" testID="screen-sign-in">
      <Formik
        initialValues={{ email: '', password: '' }}
        validationSchema={schema}
        onSubmit={async (values, helpers) => {
          setFormError(null);
          try {
            await signIn.mutateAsync({ email: values.email.trim(), password: values.password });
            router.replace(target as '/');
          } catch (error) {
            setFormError(applyServerErrors(error, helpers));
          }
        }}
      >
        {({ handleChange, handleBlur, handleSubmit, values, errors, touched, isSubmitting }) => (
          <View style={styles.form}>
            <TextField label="E-mail" testID="sign-in-email" autoComplete="email" inputMode="email" autoCapitalize="none" value={values.email} onChangeText={handleChange('email')} onBlur={handleBlur('email')} error={touched.email && errors.email} />
            <TextField label="Password" testID="sign-in-password" autoComplete="current-password" secureTextEntry value={values.password} onChangeText={handleChange('password')} onBlur={handleBlur('password')} error={touched.password && errors.password} onSubmitEditing={() => handleSubmit()} />
            <FormMessage tone="danger" text={formError} testID="sign-in-error" />
            <Button label={isSubmitting ? 'Signing in…' : 'Sign in'} disabled={isSubmitting} onPress={() => handleSubmit()} testID="sign-in-submit" />
          </View>
        )}
      </Formik>
      <View style={styles.links}>
        <Link href="/forgot-password" testID="link-forgot-password"><AppText style={styles.link}>Forgot your password?</AppText></Link>
        <Link href="/sign-up" testID="link-sign-up"><AppText style={styles.link}>New here? Create an account</AppText></Link>
      </View>
    </AuthFrame>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  links: { gap: space.sm },
  link: { color: colors.brand, textDecorationLine: 'underline' },
});
