export const ENGINE_TYPES = ['simple', 'tandem_compound', 'cross_compound'] as const;
export type EngineType = (typeof ENGINE_TYPES)[number];
export const CYLINDER_ROLES = ['high', 'intermediate', 'low', 'single'] as const;
export type CylinderRole = (typeof CYLINDER_ROLES)[number];
export const BEARING_KINDS = ['main', 'crankpin', 'crosshead', 'outboard', 'guide', 'mill_pinion', 'other'] as const;
export type BearingKind = (typeof BEARING_KINDS)[number];
export const LUBRICATION_KINDS = ['sight_feed', 'pressure_line', 'grease', 'ring_oiled'] as const;
export type LubricationKind = (typeof LUBRICATION_KINDS)[number];
export const MEASUREMENT_KINDS = [
  'throttle_pressure',
  'receiver_pressure',
  'vacuum',
  'barometer',
  'speed',
  'bearing_temperature',
  'oil_pressure',
  'oil_feed_rate',
  'ambient_temperature',
  'other',
] as const;
export type MeasurementKind = (typeof MEASUREMENT_KINDS)[number];

export const MEASUREMENT_KIND_LABELS: Record<MeasurementKind, string> = {
  throttle_pressure: 'Steam pressure at the throttle',
  receiver_pressure: 'Receiver pressure',
  vacuum: 'Vacuum',
  barometer: 'Barometer (site atmosphere)',
  speed: 'Speed',
  bearing_temperature: 'Bearing temperature',
  oil_pressure: 'Oil pressure',
  oil_feed_rate: 'Oil feed rate',
  ambient_temperature: 'Ambient temperature',
  other: 'Other',
};

/** Units a measurement point may be recorded in. */
export const MEASUREMENT_UNITS = [
  'psig',
  'psia',
  'kPa',
  'bar',
  'inHg',
  'rpm',
  'degF',
  'degC',
  'drops/min',
  'pint/h',
  'mL/h',
  'psi',
  'in',
  'mm',
] as const;
export type MeasurementUnit = (typeof MEASUREMENT_UNITS)[number];

export const UNIT_LABELS: Record<string, string> = {
  psig: 'psig',
  psia: 'psia',
  psi: 'psi',
  kPa: 'kPa',
  bar: 'bar',
  inHg: 'inHg',
  rpm: 'rpm',
  degF: '°F',
  degC: '°C',
  'drops/min': 'drops/min',
  'pint/h': 'pt/h',
  'mL/h': 'mL/h',
  in: 'in',
  mm: 'mm',
};
