// ESLint (flat config): @eslint/js and typescript-eslint recommended rules (syntax only, no type
// information: the project's type check is `tsc --noEmit`), the React hooks rules for the app and
// the view, and the core's purity boundary. See DEVELOPERS.md, "Lint".
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';

export default tseslint.config(
  { ignores: ['dist/', 'node_modules/', 'coverage/', 'test-artifacts/', 'public/'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.{ts,tsx,mts}'],
    rules: {
      // TypeScript checks names itself (and knows the DOM, Node and worker globals); this rule
      // would only repeat it without the types (typescript-eslint's own advice).
      'no-undef': 'off',
      // Unused names are errors, except those meant to be unused: `_name`, and rest siblings
      // used to drop a key from a copy (`const { a, ...rest } = o`).
      // Parameters are not checked: an unused one keeps a signature shared with its siblings.
      '@typescript-eslint/no-unused-vars': ['error', { args: 'none', varsIgnorePattern: '^_', caughtErrors: 'none', ignoreRestSiblings: true }],
    },
  },
  {
    // The rules of hooks (error) and effect dependencies (warning), as the plugin recommends.
    // The plugin's React Compiler rules (immutability, refs, set-state-in-effect, use-memo, …)
    // are left off: the app is not built with React Compiler, and they flag the way
    // @react-three/fiber documents animating a scene (mutating three.js objects from useFrame,
    // reading refs that hold them).
    files: ['src/app/**/*.{ts,tsx}', 'src/view/**/*.{ts,tsx}', 'src/store/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
    },
  },
  {
    // The core is pure: no React, three, zustand, DOM framework or Node built-ins (the purity
    // test checks the same from the import graph).
    files: ['src/core/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['react', 'react-dom', 'react/*', 'three', 'three/*', '@react-three/*', 'zustand', 'zustand/*'], message: 'src/core is pure: no React, three or zustand.' },
            { group: ['node:*'], message: 'src/core is pure: no Node built-ins.' },
            { group: ['**/app/**', '**/view/**', '**/store/**', '**/cli/**', '**/worker/**'], message: 'src/core imports nothing from the layers above it.' },
          ],
        },
      ],
    },
  },
  {
    // A vite/vitest config needs the reference to type-check its `test` key (shared/TOOLING.md).
    files: ['*.config.ts'],
    rules: { '@typescript-eslint/triple-slash-reference': 'off' },
  },
  {
    // Tests, bench and scripts: `any` in fixtures that build hostile or partial files on purpose.
    files: ['tests/**/*.{ts,mts}', 'bench/**/*.ts', 'scripts/**/*.ts'],
    rules: {
      '@typescript-eslint/no-explicit-any': 'off',
    },
  },
);
