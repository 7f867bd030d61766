// @ts-check
// Prettier, chosen to match how the code was already written: single quotes, semicolons,
// trailing commas, parentheses around every arrow parameter, two spaces. The code keeps many
// lines between 100 and 160 characters (JSX attributes, long conditions); 140 moves the fewest.
/** @type {import('prettier').Config} */
export default {
  printWidth: 140,
  singleQuote: true,
  semi: true,
  trailingComma: 'all',
  arrowParens: 'always',
  plugins: ['prettier-plugin-astro'],
  overrides: [{ files: '*.astro', options: { parser: 'astro' } }],
};
