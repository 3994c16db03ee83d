// ESLint flat config (run with `npm run lint`). Besides the recommended rules it keeps the layers
// apart: shared/ imports nothing from src/ or server/, src/ never imports server/, and server/
// never imports src/.
import tseslint from 'typescript-eslint';
import angular from 'angular-eslint';

const layer = (from, forbidden, message) => ({
  files: [`${from}/**/*.ts`],
  rules: {
    'no-restricted-imports': [
      'error',
      { patterns: forbidden.map((f) => ({ group: [`**/${f}/**`, `**/${f}`], message })) },
    ],
  },
});

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', '.angular/**', 'test/artifacts/**', 'coverage/**'] },
  {
    files: ['**/*.ts'],
    extends: [...tseslint.configs.recommended],
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-explicit-any': 'error',
    },
  },
  {
    files: ['src/**/*.ts'],
    extends: [...angular.configs.tsRecommended],
    processor: angular.processInlineTemplates,
  },
  { files: ['src/**/*.html'], extends: [...angular.configs.templateRecommended, ...angular.configs.templateAccessibility] },
  layer('shared', ['src', 'server'], 'shared/ is pure code for both sides: it must not import src/ or server/.'),
  layer('src', ['server'], 'The client talks to the server over HTTP only.'),
  layer('server', ['src'], 'The server must not import client code.'),
  { files: ['server/**/*.ts'], rules: { 'no-console': 'error' } },
);
