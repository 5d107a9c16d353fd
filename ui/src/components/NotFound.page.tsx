import { Link } from 'react-router-dom';
import { Button, Center, Stack, Text, Title } from '@mantine/core';

export default function NotFoundPage() {
  return (
    <Center mih={360}>
      <Stack align="center" gap="sm">
        <Text fz={64} fw={700} c="dimmed" className="cj-num">
          404
        </Text>
        <Title order={2}>No such page</Title>
        <Text c="dimmed">The address may be mistyped, or the record may have moved.</Text>
        <Button component={Link} to="/">
          Back to today
        </Button>
      </Stack>
    </Center>
  );
}
