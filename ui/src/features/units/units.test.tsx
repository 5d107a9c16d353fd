import type { UnitConversionTable, UnitSystem } from '@crankjournal/shared-types';
import { render, screen } from '../../test-utils/render';
import { UnitValue } from '../../components/UnitValue/UnitValue';
import { signIn, signOut, stubFetch } from '../../test-utils/http';
import { convertForDisplay } from './units';

// A table shaped like the server's answer to GET /units/conversions.
const table: UnitConversionTable = {
  imperial: {},
  metric: {
    degF: { from: 'degF', to: 'degC', factor: 5 / 9, offset: -17.7778 },
    psig: { from: 'psig', to: 'bar', factor: 0.0689476, offset: 0 },
  },
};

describe('convertForDisplay', () => {
  it('shows 212 °F as 100 °C to a metric user', () => {
    // 212 °F = 100 °C: the boiling point of water at one standard atmosphere (common practice, no source).
    const d = convertForDisplay(212, 'degF', table, 'metric');
    expect(d.value).toBeCloseTo(100, 3);
    expect(d.unit).toBe('degC');
    expect(d.label).toBe('100.0 °C');
    expect(d.converted).toBe(true);
  });

  it('shows 32 °F as 0 °C, without a minus sign', () => {
    // 32 °F = 0 °C: the freezing point of water (common practice, no source).
    expect(convertForDisplay(32, 'degF', table, 'metric').text).toBe('0.0');
  });

  it('leaves an imperial user’s value as stored', () => {
    const d = convertForDisplay(212, 'degF', table, 'imperial');
    expect(d).toMatchObject({ value: 212, unit: 'degF', label: '212 °F', converted: false });
  });

  it('applies only the factor to a difference or rate', () => {
    // A difference of 9 °F is a difference of 5 °C (1 °F = 5/9 K; common practice, no source).
    const d = convertForDisplay(9, 'degF', table, 'metric', { delta: true });
    expect(d.value).toBeCloseTo(5, 6);
  });

  it('shows a unit with no conversion as stored, and a missing value as a dash', () => {
    expect(convertForDisplay(75, 'rpm', table, 'metric').label).toBe('75.0 rpm');
    expect(convertForDisplay(null, 'degF', table, 'metric').text).toBe('—');
  });
});

describe('<UnitValue />', () => {
  afterEach(() => {
    vi.restoreAllMocks();
    signOut();
  });
  const signInAs = (unitSystem: UnitSystem) => signIn('operator', { unitSystem });

  it('renders a stored °F reading in °C for a metric user, with the unit beside it', async () => {
    signInAs('metric');
    const { spy: fetchSpy } = stubFetch({ '*': table });
    render(<UnitValue value={212} unit="degF" />);
    expect(await screen.findByText('100.0')).toBeInTheDocument();
    expect(screen.getByText('°C')).toBeInTheDocument();
    expect(screen.getByTestId('unit-value')).toHaveAttribute('title', 'Recorded as 212.00 °F');
    expect(String(fetchSpy.mock.calls[0]![0])).toBe('/api/units/conversions');
  });

  it('renders the stored unit for an imperial user', async () => {
    signInAs('imperial');
    stubFetch({ '*': table });
    render(<UnitValue value={212} unit="degF" />);
    expect(await screen.findByText('212')).toBeInTheDocument();
    expect(screen.getByText('°F')).toBeInTheDocument();
  });
});
