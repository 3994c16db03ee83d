// ESLint flat config (run with `npm run lint`). Besides the recommended rules it keeps the layers
// apart: shared/ imports nothing from src/, server/ or Node itself; src/ never imports server/ and
// server/ never imports src/; a route file reaches data only through its service (no repository,
// no db/knex); a repository never calls a service; and in the client only a feature's data service
// (a *-api.ts file) holds the HttpClient.
import tseslint from 'typescript-eslint';
import angular from 'angular-eslint';

const folder = (f, message) => ({ group: [`**/${f}/**`, `**/${f}`], message });

// One no-restricted-imports entry per set of files: a later entry for the same file would replace
// an earlier one rather than add to it, so each set lists every pattern that applies to it.
const restrict = (files, patterns, paths = [], ignores = []) => ({
  files,
  ignores,
  rules: { 'no-restricted-imports': ['error', { patterns, paths }] },
});

const SHARED = 'shared/ is pure code for both sides: it must not import src/ or server/.';
const CLIENT = 'The client talks to the server over HTTP only.';
const SERVER = 'The server must not import client code.';
const ROUTE =
  'A route file declares the route and calls its service; data goes through the service, not a repository or db/knex.';
const REPOSITORY = 'A repository holds queries only; it must not call a service.';
const HTTP = "Only a feature's data service (a *-api.ts file) talks HTTP; inject that service instead.";

const serverPatterns = [folder('src', SERVER)];
const httpClient = {
  name: '@angular/common/http',
  importNames: ['HttpClient'],
  message: HTTP,
};

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
  restrict(
    ['shared/**/*.ts'],
    [folder('src', SHARED), folder('server', SHARED), { group: ['node:*'], message: 'shared/ runs in the browser too: no Node modules.' }],
  ),
  // The app's providers and the session (which signs in before any feature loads) set HTTP up.
  restrict(['src/**/*.ts'], [folder('server', CLIENT)], [httpClient], [
    'src/**/*-api.ts',
    'src/app/app.config.ts',
    'src/app/core/session.ts',
    'src/**/*.spec.ts',
  ]),
  restrict(['src/**/*-api.ts', 'src/app/app.config.ts', 'src/app/core/session.ts', 'src/**/*.spec.ts'], [
    folder('server', CLIENT),
  ]),
  restrict(['server/**/*.ts'], serverPatterns, [], ['server/**/*-routes.ts', 'server/**/*-repository.ts']),
  restrict(['server/**/*-routes.ts'], [
    ...serverPatterns,
    { group: ['**/*-repository', '**/db/knex'], message: ROUTE },
  ]),
  restrict(['server/**/*-repository.ts'], [...serverPatterns, { group: ['**/*-service'], message: REPOSITORY }]),
  { files: ['server/**/*.ts'], rules: { 'no-console': 'error' } },
);
