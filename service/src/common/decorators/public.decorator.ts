import { SetMetadata } from '@nestjs/common';

export const IS_PUBLIC_KEY = 'crankjournal:public';
/** A route that needs no sign-in. Everything else is guarded by default. */
export const Public = () => SetMetadata(IS_PUBLIC_KEY, true);
