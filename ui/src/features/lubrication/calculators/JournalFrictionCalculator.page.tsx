import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert, Button, Group, NumberInput, Paper, SimpleGrid, Stack, Text } from '@mantine/core';
import type { JournalFrictionRequest } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { calculateJournalFriction } from '../api/lubrication.api';
import { useCalculation } from '../components/useCalculation';
import { ResultFigure, fmtN, fmtSci } from '../components/ResultFigure';

type Num = number | '';
export type FrictionForm = Record<keyof JournalFrictionRequest, Num>;
/**
 * A main bearing of the demo engine: 16 × 26 in, 0.008 in radial clearance, 75 rpm, half of 225,000 lb; ISO VG
 * 150 (150 / 14.5 cSt, 890 kg/m³) at 45 °C is 1.45 × 10⁻⁵ reyn by the oil-viscosity calculator.
 */
export const FRICTION_EXAMPLE: FrictionForm = {
  diameterIn: 16,
  lengthIn: 26,
  radialClearanceIn: 0.008,
  speedRpm: 75,
  viscosityReyn: 0.0000145,
  loadLbf: 112_500,
};

export function toFrictionRequest(f: FrictionForm): JournalFrictionRequest | null {
  if (Object.values(f).some((v) => v === '')) return null;
  return {
    diameterIn: Number(f.diameterIn),
    lengthIn: Number(f.lengthIn),
    radialClearanceIn: Number(f.radialClearanceIn),
    speedRpm: Number(f.speedRpm),
    viscosityReyn: Number(f.viscosityReyn),
    loadLbf: Number(f.loadLbf),
  };
}

/** /calculators/journal-friction — POST /api/calculations/journal-friction (Petroff, Sommerfeld). */
export default function JournalFrictionCalculatorPage() {
  const [form, setForm] = useState<FrictionForm>(FRICTION_EXAMPLE);
  const { result, error } = useCalculation(calculateJournalFriction, toFrictionRequest(form));
  const num = (label: string, key: keyof FrictionForm, decimals?: number) => (
    <NumberInput
      label={label}
      value={form[key]}
      onChange={(v) => setForm((f) => ({ ...f, [key]: v === '' ? '' : Number(v) }))}
      hideControls
      inputMode="decimal"
      decimalScale={decimals}
    />
  );
  return (
    <>
      <PageHeader
        title="Journal bearing friction"
        subtitle="Petroff friction torque, friction coefficient and power lost in a journal bearing, its unit load and Sommerfeld number."
        action={
          <Button component={Link} to="/calculators" variant="default">
            All calculators
          </Button>
        }
      />
      <Stack gap="md">
        <Paper withBorder p="md" radius="md">
          <Group mb="sm">
            <Button variant="default" onClick={() => setForm(FRICTION_EXAMPLE)}>
              Example: a main bearing of No. 2 engine
            </Button>
            <Button component={Link} to="/calculators/oil-viscosity" variant="subtle">
              Viscosity in reyn from the oil
            </Button>
          </Group>
          <SimpleGrid cols={{ base: 2, sm: 3 }} spacing="sm">
            {num('Journal diameter, in', 'diameterIn')}
            {num('Bearing length, in', 'lengthIn')}
            {num('Radial clearance, in', 'radialClearanceIn', 5)}
            {num('Speed, rpm', 'speedRpm')}
            {num('Absolute viscosity, reyn', 'viscosityReyn', 10)}
            {num('Load on the bearing, lbf', 'loadLbf')}
          </SimpleGrid>
        </Paper>
        <Paper withBorder p="md" radius="md" data-testid="calc-result">
          {error ? (
            <Alert color="amber" variant="outline" title="Check the figures">
              <span data-testid="calc-error">{error}</span>
            </Alert>
          ) : result ? (
            <Stack gap="sm">
              <Group gap="xl">
                <ResultFigure label="Friction torque" value={fmtN(result.frictionTorqueLbfIn, 0)} unit="lbf·in" testId="friction-torque" />
                <ResultFigure
                  label="Power lost"
                  value={fmtN(result.powerLossHp, 2)}
                  unit={`hp (${fmtN(result.powerLossKw, 2)} kW)`}
                  testId="friction-hp"
                />
                <ResultFigure label="Friction coefficient" value={fmtN(result.frictionCoefficient, 4)} />
                <ResultFigure label="Sommerfeld number" value={fmtSci(result.sommerfeldNumber, 3)} testId="sommerfeld" />
                <ResultFigure label="Unit load" value={fmtN(result.unitLoadPsi, 0)} unit="psi" />
              </Group>
              <Text fz="sm" c="dimmed">
                {result.method}
              </Text>
            </Stack>
          ) : (
            <Text c="dimmed">Give every figure.</Text>
          )}
        </Paper>
      </Stack>
    </>
  );
}
