import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';
import { createQueryClient } from '../lib/queryClient';

export function Providers({ children, client }: { children: ReactNode; client?: QueryClient }) {
  // One client per app mount (tests pass their own so caches never leak between tests).
  const [queryClient] = useState(() => client ?? createQueryClient());
  return <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>;
}
