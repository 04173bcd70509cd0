import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { Button } from '../components/ui/Button';
import { Notice } from '../components/ui/Notice';
import { Page } from '../components/ui/Page';
import { errorMessage, isApiError } from '../lib/api';
import { NotFound } from './NotFound';
import { PublicLayout } from './layout/PublicLayout';

/** Shown in place of a page that threw while rendering or loading. */
export function RouteError() {
  const error = useRouteError();
  if (isRouteErrorResponse(error) && error.status === 404) return <NotFound />;
  const detail = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : isApiError(error)
      ? errorMessage(error)
      : 'The page hit an unexpected error. Nothing was changed by showing this message.';
  return (
    <Page title="Something went wrong" kicker="Error">
      <div className="max-w-prose space-y-4">
        <Notice tone="danger" title="This page could not be shown">
          <p>{detail}</p>
        </Notice>
        <div className="flex flex-wrap gap-3">
          <Button variant="primary" onClick={() => window.location.reload()}>
            Reload the page
          </Button>
          <Link to="/" className="inline-flex min-h-12 items-center font-bold">
            Go to the home page
          </Link>
        </div>
      </div>
    </Page>
  );
}

/** For errors above the shell: the page frame itself failed, so draw the plain public frame. */
export function RootError() {
  return (
    <PublicLayout>
      <RouteError />
    </PublicLayout>
  );
}
