import { Suspense, useMemo } from 'react';
import { RouterProvider } from 'react-router-dom';
import { Center, Loader, MantineProvider } from '@mantine/core';
import { Notifications } from '@mantine/notifications';
import { QueryClientProvider } from '@tanstack/react-query';
import { cssVariablesResolver, defaultColorScheme, theme } from './theme';
import { createQueryClient } from './api/queryClient';
import { setSignedOutHandler } from './api/http';
import { createRouter } from './Router';
import { UpdatePrompt } from './components/Offline/UpdatePrompt';

const queryClient = createQueryClient();

export function App() {
  const router = useMemo(() => createRouter(), []);
  setSignedOutHandler(() => {
    queryClient.clear();
    void router.navigate('/sign-in', { replace: true, state: { from: window.location.pathname } });
  });
  return (
    <MantineProvider theme={theme} defaultColorScheme={defaultColorScheme()} cssVariablesResolver={cssVariablesResolver}>
      <Notifications position="top-right" />
      <UpdatePrompt />
      <QueryClientProvider client={queryClient}>
        <Suspense
          fallback={
            <Center h="100vh">
              <Loader />
            </Center>
          }
        >
          <RouterProvider router={router} />
        </Suspense>
      </QueryClientProvider>
    </MantineProvider>
  );
}
