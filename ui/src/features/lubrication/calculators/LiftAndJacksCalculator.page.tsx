import { Link } from 'react-router-dom';
import { Button } from '@mantine/core';
import { PageHeader } from '../../../components/PageHeader';
import { LiftAndJacks } from '../components/LiftAndJacks';

/** /calculators/lift-and-jacks — POST /api/calculations/lift-pressure and /jack-capacity. */
export default function LiftAndJacksCalculatorPage() {
  return (
    <>
      <PageHeader
        title="Pre-lube lift and jacks"
        subtitle={
          'The oil pressure that lifts a journal off its bearing, and whether a set of jacks is rated with ' +
          'margin for the rotating mass.'
        }
        action={
          <Button component={Link} to="/calculators" variant="default">
            All calculators
          </Button>
        }
      />
      <LiftAndJacks />
    </>
  );
}
