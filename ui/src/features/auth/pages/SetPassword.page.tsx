import { useState } from 'react';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { Alert, Button, Center, Paper, PasswordInput, Stack, Text, Title } from '@mantine/core';
import { useForm } from '@mantine/form';
import { MIN_PASSWORD_LENGTH } from '@crankjournal/shared-types';
import { Brand } from '../../../components/Brand';
import { errorText } from '../../../api/http';
import { acceptInvitation } from '../api/auth.api';

export default function SetPasswordPage() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const navigate = useNavigate();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const form = useForm({
    initialValues: { password: '', repeat: '' },
    validate: {
      password: (v) => (v.length >= MIN_PASSWORD_LENGTH ? null : `At least ${MIN_PASSWORD_LENGTH} characters`),
      repeat: (v, all) => (v === all.password ? null : 'The two passwords differ'),
    },
  });
  return (
    <Center mih="100vh" p="md">
      <Paper withBorder p="xl" radius="md" w={440} maw="100%">
        <Stack gap="lg">
          <Brand size={36} />
          <Title order={2}>Set your password</Title>
          <Text c="dimmed" fz="sm">
            You were invited to Crankjournal. Choose a password of at least {MIN_PASSWORD_LENGTH} characters; a short sentence is easier to
            type on a tablet than a jumble.
          </Text>
          {!token && <Alert color="signal">This page needs the link from your invitation e-mail.</Alert>}
          {error && (
            <Alert color="signal" role="alert">
              {error}
            </Alert>
          )}
          <form
            onSubmit={form.onSubmit(async (v) => {
              setBusy(true);
              setError(null);
              try {
                await acceptInvitation(token, v.password);
                void navigate('/', { replace: true });
              } catch (e) {
                setError(errorText(e));
              } finally {
                setBusy(false);
              }
            })}
          >
            <Stack>
              <PasswordInput label="New password" autoComplete="new-password" {...form.getInputProps('password')} />
              <PasswordInput label="Repeat it" autoComplete="new-password" {...form.getInputProps('repeat')} />
              <Button type="submit" size="lg" loading={busy} disabled={!token}>
                Set password and sign in
              </Button>
            </Stack>
          </form>
        </Stack>
      </Paper>
    </Center>
  );
}
