import { navigationFor } from './navigation';

describe('navigation by role', () => {
  it('shows people administration only to administrators', () => {
    const labels = (role: Parameters<typeof navigationFor>[0]) => navigationFor(role).flatMap((g) => g.items.map((i) => i.label));
    expect(labels('administrator')).toContain('People and roles');
    for (const r of ['chief_engineer', 'operator', 'maintenance_lead', 'mill_lead', 'observer'] as const) {
      expect(labels(r)).not.toContain('People and roles');
      expect(labels(r)).toContain('Today');
    }
  });
  it('drops groups left empty for a role', () => {
    expect(navigationFor('observer').map((g) => g.label)).not.toContain('Administration');
  });
});
