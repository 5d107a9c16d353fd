import { useState } from 'react';
import { useLocation, useNavigate } from 'react-router-dom';
import { Alert, Anchor, Button, Center, Paper, PasswordInput, Stack, Text, TextInput, Title } from '@mantine/core';
import { useForm } from '@mantine/form';
import { Brand } from '../../../components/Brand';
import { errorText } from '../../../api/http';
import { signIn } from '../api/auth.api';

export default function SignInPage() {
  const navigate = useNavigate();
  const location = useLocation();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const form = useForm({
    initialValues: { email: '', password: '' },
    validate: {
      email: (v) => (/^\S+@\S+\.\S+$/.test(v.trim()) ? null : 'Enter your e-mail address'),
      password: (v) => (v ? null : 'Enter your password'),
    },
  });
  const from = (location.state as { from?: string } | null)?.from ?? '/';

  return (
    <Center mih="100vh" p="md">
      <Paper withBorder shadow="sm" p="xl" radius="md" w={420} maw="100%">
        <Stack gap="lg">
          <Brand size={36} />
          <div>
            <Title order={2}>Sign in</Title>
            <Text c="dimmed" fz="sm">
              The engine house logbook. Use the account your chief engineer or administrator gave you.
            </Text>
          </div>
          {error && (
            <Alert color="signal" variant="light" title="Not signed in" role="alert">
              {error}
            </Alert>
          )}
          <form
            onSubmit={form.onSubmit(async (v) => {
              setBusy(true);
              setError(null);
              try {
                await signIn({ email: v.email.trim(), password: v.password });
                void navigate(from, { replace: true });
              } catch (e) {
                setError(errorText(e));
              } finally {
                setBusy(false);
              }
            })}
          >
            <Stack>
              <TextInput label="E-mail" type="email" autoComplete="username" inputMode="email" {...form.getInputProps('email')} />
              <PasswordInput label="Password" autoComplete="current-password" {...form.getInputProps('password')} />
              <Button type="submit" loading={busy} size="lg" fullWidth>
                Sign in
              </Button>
            </Stack>
          </form>
          <Text fz="xs" c="dimmed">
            Forgotten your password? Ask an administrator to send you a new invitation.{' '}
            <Anchor href="/api/docs" fz="xs">
              API documentation
            </Anchor>
          </Text>
        </Stack>
      </Paper>
    </Center>
  );
}
