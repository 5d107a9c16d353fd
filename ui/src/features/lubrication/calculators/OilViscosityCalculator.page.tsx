import { useState } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Button, Group, NumberInput, Paper, Select, SimpleGrid, Stack, Text } from '@mantine/core';
import type { OilViscosityRequest } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { calculateOilViscosity, oilsQuery } from '../api/lubrication.api';
import { useCalculation } from '../components/useCalculation';
import { ResultFigure, fmtN, fmtSci } from '../components/ResultFigure';

type Num = number | '';
export interface ViscosityForm {
  v40: Num;
  v100: Num;
  temperatureC: Num;
  density: Num;
}
/** ISO VG 150 (150 cSt at 40 °C by the grade's definition; 14.5 cSt at 100 °C typical of the grade) at a main bearing's 45 °C. */
export const VISCOSITY_EXAMPLE: ViscosityForm = { v40: 150, v100: 14.5, temperatureC: 45, density: 890 };

export function toViscosityRequest(f: ViscosityForm): OilViscosityRequest | null {
  if (f.v40 === '' || f.v100 === '' || f.temperatureC === '') return null;
  return {
    viscosity40cSt: Number(f.v40),
    viscosity100cSt: Number(f.v100),
    temperatureC: Number(f.temperatureC),
    ...(f.density === '' ? {} : { densityKgM3At15C: Number(f.density) }),
  };
}

/** /calculators/oil-viscosity — POST /api/calculations/oil-viscosity. */
export default function OilViscosityCalculatorPage() {
  const [form, setForm] = useState<ViscosityForm>(VISCOSITY_EXAMPLE);
  const oils = useQuery(oilsQuery());
  const { result, error } = useCalculation(calculateOilViscosity, toViscosityRequest(form));
  const num = (label: string, key: keyof ViscosityForm, description?: string) => (
    <NumberInput
      label={label}
      description={description}
      value={form[key]}
      onChange={(v) => setForm((f) => ({ ...f, [key]: v === '' ? '' : Number(v) }))}
      hideControls
      inputMode="decimal"
    />
  );
  return (
    <>
      <PageHeader
        title="Oil viscosity at temperature"
        subtitle={
          'From the two data-sheet figures at 40 °C and 100 °C by the ASTM D341 (Walther) relation, and the ' +
          'absolute viscosity from the density.'
        }
        action={
          <Button component={Link} to="/calculators" variant="default">
            All calculators
          </Button>
        }
      />
      <Stack gap="md">
        <Paper withBorder p="md" radius="md">
          <Group align="flex-end" mb="sm">
            <Select
              label="Fill from an oil"
              placeholder="Choose an oil"
              data={(oils.data ?? []).map((o) => ({ value: o.id, label: `${o.name} (${o.grade})` }))}
              onChange={(id) => {
                const o = oils.data?.find((x) => x.id === id);
                if (o) setForm((f) => ({ ...f, v40: o.viscosity40cSt, v100: o.viscosity100cSt, density: o.densityKgM3At15C ?? '' }));
              }}
              w={340}
              clearable
            />
            <Button variant="default" onClick={() => setForm(VISCOSITY_EXAMPLE)}>
              Example figures
            </Button>
          </Group>
          <SimpleGrid cols={{ base: 2, sm: 4 }} spacing="sm">
            {num('Viscosity at 40 °C, cSt', 'v40')}
            {num('Viscosity at 100 °C, cSt', 'v100')}
            {num('Temperature, °C', 'temperatureC', 'the oil film’s')}
            {num('Density at 15 °C, kg/m³', 'density', '880 assumed if empty')}
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
                <ResultFigure label="Kinematic" value={fmtN(result.kinematicCst, 1)} unit="cSt" testId="visc-cst" />
                <ResultFigure label="Absolute" value={fmtN(result.dynamicPaS * 1000, 1)} unit="mPa·s (cP)" />
                <ResultFigure label="Absolute" value={fmtSci(result.dynamicReyn, 3)} unit="reyn (lbf·s/in²)" testId="visc-reyn" />
                <ResultFigure label="Density at temperature" value={fmtN(result.densityKgM3, 1)} unit="kg/m³" />
              </Group>
              {result.densityAssumed && (
                <Text fz="sm" c="dimmed">
                  No density given: a typical mineral oil’s 880 kg/m³ at 15 °C was assumed.
                </Text>
              )}
              <Text fz="sm" c="dimmed">
                {result.method}
              </Text>
            </Stack>
          ) : (
            <Text c="dimmed">Give both viscosities and a temperature.</Text>
          )}
        </Paper>
      </Stack>
    </>
  );
}
