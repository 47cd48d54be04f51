import { Formik } from 'formik';
import { StyleSheet, View } from 'react-native';
import * as yup from 'yup';

import { ApiError } from '@/api/client';
import { useOrganizationSettingsMutation, useOrganizationSettingsQuery } from '@/api/organization-settings';
import { ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { AppText } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import type { UnitSystem } from '@/shared/measures';
import { space } from '@/theme';

const schema = yup.object({
  currency: yup.string().trim().required('enter a currency code').matches(/^[A-Za-z]{3}$/, 'use a three-letter code such as EUR, USD or KES'),
});

/** Units and currency of the organization: batch sheets, ration checks, shared results and CSV files follow them. */
export function SettingsCard() {
  const settings = useOrganizationSettingsQuery();
  const save = useOrganizationSettingsMutation();
  if (settings.isError) return <ErrorState error={settings.error} onRetry={() => settings.refetch()} />;
  if (!settings.data) return null;
  return (
    <Card title="Units and currency" testID="settings-card">
      <AppText variant="small" muted>Amounts are kept in kg; these settings only change how they are shown, typed, printed and exported (1 lb = 0.45359237 kg, 1 short ton = 2,000 lb).</AppText>
      <Formik
        initialValues={{ unitSystem: settings.data.unitSystem, currency: settings.data.currency }}
        enableReinitialize
        validationSchema={schema}
        onSubmit={async (v, { setErrors }) => {
          try {
            await save.mutateAsync({ unitSystem: v.unitSystem, currency: v.currency.trim().toUpperCase() });
          } catch (e) {
            if (e instanceof ApiError) setErrors(Object.fromEntries(Object.entries(e.fieldErrors).map(([k, m]) => [k, m[0]])));
          }
        }}
      >
        {(f) => (
          <View style={styles.form}>
            <ChoiceChips<UnitSystem>
              label="Units"
              options={[{ value: 'metric', label: 'Metric (kg, t)' }, { value: 'us', label: 'US (lb, short ton)' }]}
              value={f.values.unitSystem}
              onChange={(v) => f.setFieldValue('unitSystem', v)}
              testID="settings-units"
            />
            <TextField label="Currency" hint="ISO code" autoCapitalize="characters" maxLength={3} value={f.values.currency} onChangeText={f.handleChange('currency')} onBlur={f.handleBlur('currency')} error={f.touched.currency && f.errors.currency} testID="settings-currency" />
            <FormMessage tone="danger" text={save.error && !(save.error instanceof ApiError && save.error.status === 400) ? save.error.message : null} />
            <FormMessage tone="ok" text={save.isSuccess && !f.dirty ? 'Saved.' : null} testID="settings-saved" />
            <Button label={f.isSubmitting ? 'Saving…' : 'Save units and currency'} disabled={f.isSubmitting} onPress={() => f.handleSubmit()} testID="settings-save" />
          </View>
        )}
      </Formik>
    </Card>
  );
}

const styles = StyleSheet.create({ form: { gap: space.md } });
