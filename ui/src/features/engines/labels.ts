import type { BearingKind, CylinderRole, EngineType, LubricationKind } from '@crankjournal/shared-types';

// Words for the engine's enumerations, as the crew says them.
export const ENGINE_TYPE_LABELS: Record<EngineType, string> = {
  simple: 'Simple',
  tandem_compound: 'Tandem compound',
  cross_compound: 'Cross compound',
};
export const CYLINDER_ROLE_LABELS: Record<CylinderRole, string> = {
  high: 'High-pressure',
  intermediate: 'Intermediate-pressure',
  low: 'Low-pressure',
  single: 'Single (simple engine)',
};
export const BEARING_KIND_LABELS: Record<BearingKind, string> = {
  main: 'Main bearing',
  crankpin: 'Crankpin',
  crosshead: 'Crosshead',
  outboard: 'Outboard bearing',
  guide: 'Guide',
  mill_pinion: 'Mill pinion',
  other: 'Other',
};
export const LUBRICATION_KIND_LABELS: Record<LubricationKind, string> = {
  sight_feed: 'Sight-feed lubricator',
  pressure_line: 'Pressure line',
  grease: 'Grease',
  ring_oiled: 'Ring-oiled',
};

/** Mantine Select options from a label map. */
export const options = <K extends string>(labels: Record<K, string>) =>
  (Object.keys(labels) as K[]).map((value) => ({ value, label: labels[value] }));

/** Beside every place where pressure limits are shown or set. */
export const PRESSURE_LIMITS_CAUTION =
  'Crankjournal aids a qualified crew; it does not set safe limits. The maximum allowable working ' +
  'pressure is the figure on the boiler’s current certificate, under local boiler and pressure-vessel ' +
  'law and the insurer’s inspection — not a figure this app decides. The limits here only make the app ' +
  'raise alarms: check them against the certificate whenever it is renewed.';

/** Beside the table of measurement points and their limits. */
export const LIMITS_CAUTION =
  'These limits make the app raise alarms; they do not make the engine safe. Pressure limits must stay ' +
  'within the boiler’s certified maximum allowable working pressure, and a hot bearing calls for the ' +
  'crew’s practised response, whatever the screen shows. Crankjournal aids a qualified crew and never ' +
  'replaces local boiler and pressure-vessel law, the insurer’s inspections or licensed practice.';

/** Plain words for the engine settings and limit fields that the limit-change history names. */
export const FIELD_LABELS: Record<string, string> = {
  name: 'Name',
  ratedSpeedRpm: 'Rated speed (rpm)',
  overspeedRpm: 'Overspeed (rpm)',
  mawpPsig: 'Maximum allowable working pressure (psig)',
  preLubeFreshnessMinutes: 'Pre-lube freshness window (min)',
  normalLow: 'Normal low',
  normalHigh: 'Normal high',
  lowLimit: 'Low limit',
  highLimit: 'High limit',
  highHighLimit: 'High-high limit',
  maxRiseRatePerMin: 'Largest rise per minute',
  maxRiseAboveAmbient: 'Largest rise above ambient',
  deadband: 'Deadband',
  unit: 'Unit',
  retired: 'Retired',
};

/** "highHighLimit" → "High-high limit", or a readable form of an unknown camelCase name. */
export function fieldLabel(field: string): string {
  if (FIELD_LABELS[field]) return FIELD_LABELS[field];
  const words = field.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase();
  return words.charAt(0).toUpperCase() + words.slice(1);
}
