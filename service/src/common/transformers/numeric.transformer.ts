import type { ValueTransformer } from 'typeorm';

/** pg returns NUMERIC as a string; our columns hold numbers. */
export const numeric: ValueTransformer = {
  to: (v: number | null | undefined) => v,
  from: (v: string | null) => (v === null || v === undefined ? null : Number(v)),
};
