import { Component, type ReactNode } from 'react';
import { Alert, Button, Center, Code, Stack, Title } from '@mantine/core';

interface State {
  error: Error | null;
}

/** Catches a screen that fails to render, so the rest of the app stays usable. */
export class ErrorBoundary extends Component<{ children: ReactNode }, State> {
  state: State = { error: null };
  static getDerivedStateFromError(error: Error): State {
    return { error };
  }
  render() {
    if (!this.state.error) return this.props.children;
    return (
      <Center mih={300} p="lg">
        <Stack maw={560}>
          <Title order={2}>This screen could not be shown</Title>
          <Alert color="signal" title="What happened">
            Something in this screen failed. Nothing you saved before is lost. Reload to try again; if it keeps happening, tell your
            administrator what you were doing.
            <Code block mt="sm">
              {this.state.error.message}
            </Code>
          </Alert>
          <Button onClick={() => window.location.reload()}>Reload the page</Button>
        </Stack>
      </Center>
    );
  }
}
