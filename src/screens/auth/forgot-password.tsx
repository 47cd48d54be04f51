import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Link } from 'expo-router';
import { Formik } from 'formik';
import * as yup from 'yup';

import { usePasswordResetRequestMutation } from '@/api/session';
import { AuthFrame } from '@/components/auth/auth-frame';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { applyServerErrors } from '@/lib/form-errors';
import { colors, space } from '@/theme';

import { emailField } from './validation';

export function ForgotPasswordScreen() {
  const request = usePasswordResetRequestMutation();
  const [message, setMessage] = useState<{ tone: 'ok' | 'danger'; text: string } | null>(null);
  return (
    <AuthFrame title="Forgotten password" lead="We will e-mail you a link to choose a new one." testID="screen-forgot-password">
      <Formik
        initialValues={{ email: '' }}
        validationSchema={yup.object({ email: emailField })}
        onSubmit={async (values, helpers) => {
          setMessage(null);
          try {
            const answer = await request.mutateAsync(values.email.trim());
            setMessage({ tone: 'ok', text: answer.message });
          } catch (error) {
            setMessage({ tone: 'danger', text: applyServerErrors(error, helpers) });
          }
        }}
      >
        {({ handleChange, handleBlur, handleSubmit, values, errors, touched, isSubmitting }) => (
          <View style={styles.form}>
            <TextField label="E-mail" testID="forgot-email" autoComplete="email" inputMode="email" autoCapitalize="none" value={values.email} onChangeText={handleChange('email')} onBlur={handleBlur('email')} error={touched.email && errors.email} />
            <FormMessage tone={message?.tone ?? 'ok'} text={message?.text} testID="forgot-message" />
            <Button label={isSubmitting ? 'Sending…' : 'Send the link'} disabled={isSubmitting} onPress={() => handleSubmit()} testID="forgot-submit" />
          </View>
        )}
      </Formik>
      <Link href="/sign-in"><AppText style={styles.link}>Back to sign in</AppText></Link>
    </AuthFrame>
  );
}

const styles = StyleSheet.create({ form: { gap: space.lg }, link: { color: colors.brand, textDecorationLine: 'underline' } });
