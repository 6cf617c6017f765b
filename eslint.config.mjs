// Lint for the whole project: Nuxt's recommended flat config (TypeScript, Vue, imports), run by
// `npm run lint` and by CI. Formatting is left to the editor; these rules catch mistakes.
import { createConfigForNuxt } from '@nuxt/eslint-config/flat'

export default createConfigForNuxt({
  features: { stylistic: false, tooling: false },
  dirs: { src: ['.'] },
})
  .prepend({ ignores: ['.output/**', '.nuxt/**', '.data/**', '.reports/**', 'node_modules/**', 'tests/e2e/screenshots/**', 'docs/**'] })
  .append({
    rules: {
      // Tests and JSON-heavy glue use `any` on purpose in a few places.
      '@typescript-eslint/no-explicit-any': 'off',
      // Sub-form components fill in fields of the form object their page owns (useFormState's draft
      // and the like): nested fields may change, the prop itself may not be replaced.
      'vue/no-mutating-props': ['error', { shallowOnly: true }],
      // Layout of templates is the house style's (self-closing void elements, attributes on one
      // line where they fit), not the linter's.
      'vue/html-self-closing': 'off',
      'vue/first-attribute-linebreak': 'off',
      'vue/attributes-order': 'off',
      'vue/max-attributes-per-line': 'off',
      'vue/singleline-html-element-content-newline': 'off',
      'vue/multiline-html-element-content-newline': 'off',
      'vue/html-indent': 'off',
      'vue/html-closing-bracket-newline': 'off',
      // Unit-suffixed names (minMargin_m, throatDiameter_m) are the engine's naming style.
      'vue/prop-name-casing': 'off',
    },
  })
