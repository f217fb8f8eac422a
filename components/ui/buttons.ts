/**
 * Button looks, as class strings so the same look fits a <button> and a <Link>.
 * `buttonClass` is the one main action of a form or page; `quietButtonClass` the secondary ones;
 * `dangerButtonClass` anything that deletes, revokes or disables.
 */
export const buttonClass = 'rounded-md bg-tide px-4 py-2 font-medium text-white hover:bg-tide-deep disabled:opacity-50';
export const quietButtonClass = 'rounded-md border border-rule bg-card px-3 py-1.5 text-sm font-medium hover:border-tide disabled:opacity-50';
export const dangerButtonClass = 'rounded-md border border-clay px-3 py-1.5 text-sm font-medium text-clay hover:bg-clay-pale disabled:opacity-50';
