import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Link, useLocalSearchParams } from 'expo-router';
import { Formik } from 'formik';
import * as yup from 'yup';

import { usePasswordResetConfirmMutation } from '@/api/session';
import { AuthFrame } from '@/components/auth/auth-frame';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { applyServerErrors } from '@/lib/form-errors';
import { colors, space } from '@/theme';

import { newPasswordField } from './validation';

const schema = yup.object({
  password: newPasswordField,
  repeat: yup.string().required('Type the password again.').oneOf([yup.ref('password')], 'The two passwords differ.'),
});

export function ResetPasswordScreen() {
  const { token } = useLocalSearchParams<{ token?: string }>();
  const confirm = usePasswordResetConfirmMutation();
  const [message, setMessage] = useState<{ tone: 'ok' | 'danger'; text: string } | null>(token ? null : { tone: 'danger', text: 'This page needs the link from the e-mail. Ask for a new one.' });
  const done = message?.tone === 'ok';
  return (
    <AuthFrame title="Choose a new password" testID="screen-reset-password">
      <Formik
        initialValues={{ password: '', repeat: '' }}
        validationSchema={schema}
        onSubmit={async (values, helpers) => {
          setMessage(null);
          try {
            const answer = await confirm.mutateAsync({ token: token ?? '', password: values.password });
            setMessage({ tone: 'ok', text: answer.message });
          } catch (error) {
            setMessage({ tone: 'danger', text: applyServerErrors(error, helpers) });
          }
        }}
      >
        {({ handleChange, handleBlur, handleSubmit, values, errors, touched, isSubmitting }) => (
          <View style={styles.form}>
            {done ? null : (
              <>
                <TextField label="New password" hint="at least 10 characters" testID="reset-password" autoComplete="new-password" secureTextEntry value={values.password} onChangeText={handleChange('password')} onBlur={handleBlur('password')} error={touched.password && errors.password} />
                <TextField label="New password again" testID="reset-repeat" autoComplete="new-password" secureTextEntry value={values.repeat} onChangeText={handleChange('repeat')} onBlur={handleBlur('repeat')} error={touched.repeat && errors.repeat} />
              </>
            )}
            <FormMessage tone={message?.tone ?? 'ok'} text={message?.text} testID="reset-message" />
            {done ? null : <Button label={isSubmitting ? 'Saving…' : 'Save the new password'} disabled={isSubmitting || !token} onPress={() => handleSubmit()} testID="reset-submit" />}
          </View>
        )}
      </Formik>
      <Link href="/sign-in"><AppText style={styles.link}>Go to sign in</AppText></Link>
    </AuthFrame>
  );
}

const styles = StyleSheet.create({ form: { gap: space.lg }, link: { color: colors.brand, textDecorationLine: 'underline' } });
