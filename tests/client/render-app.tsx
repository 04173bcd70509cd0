import { render } from '@testing-library/react';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import { Providers } from '../../src/app/providers';
import { routes } from '../../src/app/router';
import { createQueryClient } from '../../src/lib/queryClient';

/** The real route table in memory, with a fresh query cache, starting at `path`. */
export function renderApp(path: string) {
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  const client = createQueryClient();
  const utils = render(
    <Providers client={client}>
      <RouterProvider router={router} />
    </Providers>,
  );
  return { ...utils, router, client };
}

export const people = {
  admin: { id: 1, email: 'admin@ternvalley.test', name: 'Avery Quill', roles: ['admin', 'conductor'] },
  operator: { id: 2, email: 'pad@ternvalley.test', name: 'Rowan Fenn', roles: ['operator'] },
} as const;
