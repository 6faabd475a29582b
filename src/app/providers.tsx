import { QueryClientProvider } from '@tanstack/react-query';
import type { QueryClient } from '@tanstack/react-query';
import { PersistQueryClientProvider } from '@tanstack/react-query-persist-client';
import type { PersistQueryClientOptions } from '@tanstack/react-query-persist-client';
import type { ReactNode } from 'react';
import { ToastProvider } from '../components/ui/toast';

interface AppProvidersProps {
  queryClient: QueryClient;
  /** Keeps marked queries on the device (the driver's day without signal); left out, nothing is kept. */
  persist?: Omit<PersistQueryClientOptions, 'queryClient'> | null;
  children: ReactNode;
}

export function AppProviders({ queryClient, persist, children }: AppProvidersProps) {
  const content = <ToastProvider>{children}</ToastProvider>;
  return persist ? (
    <PersistQueryClientProvider client={queryClient} persistOptions={persist}>
      {content}
    </PersistQueryClientProvider>
  ) : (
    <QueryClientProvider client={queryClient}>{content}</QueryClientProvider>
  );
}
