import tseslint from "typescript-eslint";

export default tseslint.config(
  { ignores: [".next/**", ".next-*/**", "test-results/**", "node_modules/**", ".data/**", "local-s3/**", "next-env.d.ts"] },
  ...tseslint.configs.recommended,
  {
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
    },
  },
);
