/** Every URL of the app in one place; components never spell one. */
export const paths = {
  home: '/',
  baseline: '/baseline',
} as const;
