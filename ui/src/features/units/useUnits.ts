import { useCallback } from 'react';
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UnitConversionTable, UnitSystem } from '@crankjournal/shared-types';
import { api } from '../../api/http';
import { useSession } from '../auth/useSession';
import { convertForDisplay, type DisplayOptions, type DisplayValue } from './units';

export const unitKeys = {
  all: ['units'] as const,
  conversions: () => [...unitKeys.all, 'conversions'] as const,
};

/** The server's conversion table; it never changes while the app runs. */
export const unitConversionsQuery = () =>
  queryOptions({
    queryKey: unitKeys.conversions(),
    queryFn: () => api<UnitConversionTable>('/units/conversions'),
    staleTime: Infinity,
    gcTime: Infinity,
  });

/** The signed-in person's unit system and a function that shows a stored value in it. */
export function useUnits() {
  const session = useSession();
  const system: UnitSystem = session?.user.unitSystem ?? 'imperial';
  const { data: table, isSuccess } = useQuery({ ...unitConversionsQuery(), enabled: !!session });
  const display = useCallback(
    (value: number | null | undefined, storedUnit: string, opts?: DisplayOptions): DisplayValue =>
      convertForDisplay(value, storedUnit, table, system, opts),
    [table, system],
  );
  return { system, display, ready: isSuccess, table };
}

export type { DisplayValue, DisplayOptions } from './units';
export { convertForDisplay, unitLabel, formatNumber } from './units';
