import { Link, isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { Alert } from '@/components/ui/alert';
import { PageHeader } from '@/components/ui/page-header';
import { paths } from '@/config/paths';
import { isApiError } from '@/lib/api-client';

/** What a screen shows when its loader or render fails; the navigation stays usable around it. */
export function RouteError() {
  const error = useRouteError();
  let title = 'This screen could not be shown';
  let message = 'Something went wrong while preparing the screen. Try again, or go back.';
  let status: number | null = null;

  if (isRouteErrorResponse(error)) {
    status = error.status;
    message = typeof error.data === 'string' ? error.data : error.statusText;
  } else if (isApiError(error)) {
    status = error.status;
    message = error.message;
  }
  if (status === 404) title = 'Not found';
  if (status === 403) title = 'Not for your role';

  return (
    <div>
      <PageHeader title={title} />
      <Alert>{message}</Alert>
      <p className="mt-4 text-sm">
        <Link to={paths.home.getHref()} className="text-accent underline underline-offset-2">
          Go to your start page
        </Link>
      </p>
    </div>
  );
}
