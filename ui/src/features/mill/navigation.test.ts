import { navigationFor } from '../../components/AppShell/navigation';

describe('the Mill navigation group', () => {
  it('is there for every role, observers included (they read), before the calculators', () => {
    for (const role of ['observer', 'mill_lead', 'operator'] as const) {
      const groups = navigationFor(role);
      const mill = groups.find((g) => g.label === 'Mill');
      expect(mill?.items.map((i) => i.path)).toEqual(['/mill', '/mill/schedules', '/mill/rolling', '/mill/lots']);
      const calc = groups.findIndex((g) => g.label === 'Calculators');
      if (calc >= 0) expect(groups.indexOf(mill!)).toBeLessThan(calc);
    }
    expect(navigationFor('observer').flatMap((g) => g.items.map((i) => i.path))).toContain('/calculators/rolling-pass');
  });
});
