import { lazy, type ComponentType, type LazyExoticComponent } from 'react';
import { IconGauge, IconBarbell, IconArrowBigUpLines, IconCircleDot, IconDroplet } from '@tabler/icons-react';
import { ROLES, type Role } from '@crankjournal/shared-types';

/**
 * The calculators, in one list: the Calculators navigation group, the calculators page (/calculators) and
 * the routes are all made from it. To add a calculator, append an entry at the end with CALCULATORS.push
 * (its page is loaded only when opened).
 */
export interface CalculatorEntry {
  key: string;
  title: string;
  /** One sentence: what it works out, from what. */
  description: string;
  /** Where it lives in the app, under /calculators/. */
  path: string;
  icon: ComponentType<{ size?: number | string; stroke?: number }>;
  roles: readonly Role[];
  Page: LazyExoticComponent<ComponentType>;
}

export const CALCULATORS: CalculatorEntry[] = [];

// Indicated power from indicator cards (stateless: POST /api/calculations/indicated-power).
CALCULATORS.push({
  key: 'indicated-power',
  title: 'Indicated power',
  description:
    'Mean effective pressure of each card (planimeter area, mid-ordinates or typed in) and the indicated ' +
    'horsepower per end, per cylinder and for the engine, referred to the largest cylinder.',
  path: '/calculators/indicated-power',
  icon: IconGauge,
  roles: ROLES,
  Page: lazy(() => import('./indicated-power/IndicatedPowerCalculator.page')),
});

// A rolling pass on the mill: roll force, torque, power and the flywheel's share (stateless: POST /api/calculations/rolling-pass).
CALCULATORS.push({
  key: 'rolling-pass',
  title: 'Rolling pass',
  description:
    'Reduction, elongation, contact length, mean flow stress of hot carbon steel, roll force, torque and ' +
    'power for a pass, and how far the flywheel’s speed falls over it.',
  path: '/calculators/rolling-pass',
  icon: IconBarbell,
  roles: ROLES,
  Page: lazy(() => import('../mill/calculators/RollingPassCalculator.page')),
});

// Lubrication (stateless: POST /api/calculations/oil-viscosity, /journal-friction, /lift-pressure, /jack-capacity).
CALCULATORS.push(
  {
    key: 'oil-viscosity',
    title: 'Oil viscosity',
    description: 'Kinematic and absolute viscosity of an oil at its running temperature from its 40 °C and 100 °C figures (ASTM D341).',
    path: '/calculators/oil-viscosity',
    icon: IconDroplet,
    roles: ROLES,
    Page: lazy(() => import('../lubrication/calculators/OilViscosityCalculator.page')),
  },
  {
    key: 'journal-friction',
    title: 'Journal bearing friction',
    description: 'Petroff friction torque, friction coefficient and power lost in a journal bearing, its unit load and Sommerfeld number.',
    path: '/calculators/journal-friction',
    icon: IconCircleDot,
    roles: ROLES,
    Page: lazy(() => import('../lubrication/calculators/JournalFrictionCalculator.page')),
  },
  {
    key: 'lift-and-jacks',
    title: 'Pre-lube lift and jacks',
    description: 'The oil pressure that lifts a journal, and whether a set of jacks is rated with margin for the rotating mass.',
    path: '/calculators/lift-and-jacks',
    icon: IconArrowBigUpLines,
    roles: ROLES,
    Page: lazy(() => import('../lubrication/calculators/LiftAndJacksCalculator.page')),
  },
);
