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
import { sessionStore } from './api/session';

const queryClient = createQueryClient();

/**
 * The app opened straight on a live run page (a link, a reload): the shell's and the page's code and the page's first
 * answers are all asked for now, side by side, instead of one after another as each lazy part renders.
 */
const liveRun = /^\/runs\/([0-9a-f-]{36})\/?$/i.exec(window.location.pathname);
if (liveRun && sessionStore.get()) {
  // The answers' small module first: the browser sends six requests at a time, and the code comes in dozens of files.
  void import('./features/runs/live/live-preload').then((m) => m.preloadLiveRun(queryClient, liveRun[1]!));
  void import('./components/AppShell/Shell');
  void import('./features/runs/live/LiveRun.page');
}

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
