import { QueryClientProvider } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';
import { createAppQueryClient } from './query-client.ts';

export function AppProviders({ children }: { children: ReactNode }) {
  // One client for the life of the page; useState keeps it across re-renders and StrictMode.
  const [queryClient] = useState(createAppQueryClient);
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
