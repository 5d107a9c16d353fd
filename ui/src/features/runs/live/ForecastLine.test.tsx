import { render, screen } from '../../../test-utils/render';
import { ForecastLine } from './Board';

const f = {
  limitKind: 'high_high' as const,
  limit: 145,
  unit: 'degF',
  minutesToLimit: 6.8,
  ratePerMin: 1.2,
  preAlarm: true,
  preAlarmMinutes: 10,
  method: 'Theil–Sen slopes over the two halves of the last 10 minutes of readings, carried forward.',
};

describe('forecast line', () => {
  it('says which limit, how soon, that it is an advisory pre-alarm, and the method', () => {
    render(<ForecastLine forecast={f} />);
    expect(screen.getByText(/Pre-alarm \(advisory\): High-high in about 7 min/)).toBeInTheDocument();
    expect(screen.getByText(/Theil–Sen.*last 10 minutes/)).toBeInTheDocument();
  });
  it('is a plain forecast above the setting', () => {
    render(<ForecastLine forecast={{ ...f, minutesToLimit: 24.2, preAlarm: false }} />);
    expect(screen.getByText(/^High-high in about 24 min/)).toBeInTheDocument();
    expect(screen.getByText(/Pre-alarm under 10 min/)).toBeInTheDocument();
  });
});
