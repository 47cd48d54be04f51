// The Expo lint set, plus the boundaries between the parts of Troughline (see DEVELOPERS.md).
const { defineConfig } = require('eslint/config');
const expoConfig = require('eslint-config-expo/flat');

const SERVER_CODE = { group: ['server/*', '**/server/*', '**/server/**'], message: 'The app never imports server code; share through src/shared.' };
const FRAMEWORKS = ['react', 'react-*', 'react-native', 'react-native-*', 'expo', 'expo-*', '@expo/*', '@tanstack/*', 'express', 'drizzle-orm', 'drizzle-orm/*', 'mysql2', 'mysql2/*', 'formik', 'yup'];

module.exports = defineConfig([
  expoConfig,
  { ignores: ['dist/*', '.data/*', 'test-output/*', '.expo/*', 'node_modules/*'] },
  {
    // Screens, hooks and components: no server code, and zod stays out of the bundle (schema types only).
    files: ['app/**/*.{ts,tsx}', 'src/**/*.{ts,tsx}'],
    ignores: ['src/shared/**'],
    rules: {
      'no-restricted-imports': 'off',
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          paths: [{ name: 'zod', message: 'Validate forms with yup; zod is for the server.', allowTypeImports: true }],
          patterns: [SERVER_CODE, { group: ['@/shared/schemas', '@/shared/schemas/*'], message: 'Import only types from the schemas, so zod stays out of the app bundle.', allowTypeImports: true }],
        },
      ],
    },
  },
  {
    // Domain logic runs unchanged in the server, the app and the tests: plain TypeScript only.
    files: ['src/shared/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [SERVER_CODE, { group: FRAMEWORKS, message: 'src/shared is plain TypeScript with no framework imports.' }] }],
    },
  },
]);
