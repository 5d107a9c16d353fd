import { navigationFor } from '../../components/AppShell/navigation';
import { CALCULATORS } from './calculators';

describe('the calculators registry', () => {
  it('lists indicated power under /calculators/, for every role', () => {
    const ip = CALCULATORS.find((c) => c.key === 'indicated-power')!;
    expect(ip.path).toBe('/calculators/indicated-power');
    expect(new Set(CALCULATORS.map((c) => c.key)).size).toBe(CALCULATORS.length);
    expect(CALCULATORS.every((c) => c.path.startsWith('/calculators/'))).toBe(true);
  });

  it('makes the Calculators navigation group, before Administration', () => {
    const groups = navigationFor('administrator').map((g) => g.label);
    expect(groups).toContain('Calculators');
    expect(groups.indexOf('Calculators')).toBeLessThan(groups.indexOf('Administration'));
    const items = navigationFor('observer').find((g) => g.label === 'Calculators')!.items;
    expect(items.map((i) => i.label)).toContain('Indicated power');
  });
});
