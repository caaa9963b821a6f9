/** Inputs give '' for "nothing typed"; the shared schemas expect the key to be absent or null instead. */
export const emptyToUndefined = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);

export const emptyToNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v);
