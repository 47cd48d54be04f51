import type { FormikHelpers } from 'formik';

import { ApiError } from '@/api/client';

/**
 * Puts the server's field errors under the matching inputs and returns the message for the form as a
 * whole, so a rejected submit keeps what the person typed and says what to fix.
 */
export function applyServerErrors<T>(error: unknown, helpers: Pick<FormikHelpers<T>, 'setFieldError'>): string {
  if (error instanceof ApiError) {
    for (const [field, messages] of Object.entries(error.fieldErrors)) helpers.setFieldError(field, messages[0]);
    if (error.isNetwork) return 'Troughline’s server cannot be reached. Your entries are kept; try again.';
    return error.message;
  }
  return 'Something went wrong. Your entries are kept; try again.';
}
