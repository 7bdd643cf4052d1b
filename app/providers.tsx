'use client';
/** Client-side providers: one TanStack Query client per browser tab. */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { useState } from 'react';

export function Providers({ children }: { children: React.ReactNode }) {
  const [client] = useState(
    () => new QueryClient({ defaultOptions: { queries: { staleTime: 15_000, retry: (n, e) => n < 2 && (e as { status?: number }).status !== 404 } } }),
  );
  return <QueryClientProvider client={client}>{children}</QueryClientProvider>;
}
