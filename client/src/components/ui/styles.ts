/** Class names for the few control styles Cutline uses, so buttons and fields look the same everywhere. */
export const buttonPrimary =
  'rounded bg-accent-700 px-4 py-2 text-sm font-medium text-white hover:bg-accent-900 disabled:cursor-not-allowed disabled:opacity-50';
export const buttonSecondary =
  'rounded border border-ink-300 bg-panel px-3 py-1.5 text-sm text-ink-900 hover:border-ink-500 disabled:cursor-not-allowed disabled:opacity-50';
export const buttonDanger =
  'rounded border border-serious px-3 py-1.5 text-sm text-serious hover:bg-serious-50 disabled:cursor-not-allowed disabled:opacity-50';
export const field = 'w-full rounded border border-ink-300 bg-panel px-3 py-2 text-sm text-ink-900 focus:border-accent-500';
export const fieldLabel = 'mb-1 block text-sm font-medium text-ink-700';
export const fieldError = 'mt-1 text-sm text-serious';
export const panel = 'rounded-lg border border-rule bg-panel p-5';
