import * as yup from 'yup';

/** Client-side checks that mirror the server's, so mistakes show before a round trip. */
export const emailField = yup.string().trim().required('Enter your e-mail address.').email('Enter an e-mail address such as name@example.org.');
export const newPasswordField = yup.string().required('Choose a password.').min(10, 'Use at least 10 characters.').max(200, 'Use at most 200 characters.');
