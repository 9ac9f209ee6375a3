// ESLint: the Nuxt team's flat config (@nuxt/eslint-config, the config behind the @nuxt/eslint module),
// used standalone so that `npm ci --omit=dev` can still build the app. No stylistic (formatting) rules:
// many people edit the same files, and a mass reformat would conflict everywhere.
import { createConfigForNuxt } from '@nuxt/eslint-config/flat'

export default createConfigForNuxt({
  features: { stylistic: false },
  dirs: { src: ['.'], servers: ['./server'] },
})
  .append(
    { ignores: ['.data/**', '.output/**', '.nuxt/**', 'tests/artifacts/**'] },
    {
      rules: {
        // Formatting, not behaviour (the vue preset keeps this one even without stylistic rules).
        'vue/first-attribute-linebreak': 'off',
        // Module augmentation (`interface User extends SessionUser {}`) needs an empty interface.
        '@typescript-eslint/no-empty-object-type': ['error', { allowInterfaces: 'with-single-extends' }],
      },
    },
    {
      // Server and app code log through server/utils/logger.ts (consola, tagged), not bare console calls.
      files: ['server/**', 'shared/**', 'composables/**', 'stores/**', 'pages/**', 'components/**', 'layouts/**', 'middleware/**', 'plugins/**', 'app.vue'],
      rules: { 'no-console': 'error' },
    },
    {
      // The test HTTP client returns untyped JSON; tests narrow it where they read it.
      files: ['tests/**'],
      rules: { '@typescript-eslint/no-explicit-any': 'off' },
    },
  )
