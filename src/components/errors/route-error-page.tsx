import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { isApiError } from '../../lib/api-client';
import { buttonClasses } from '../ui/button';
import { NotFoundContent } from './not-found-page';

interface ErrorView {
  title: string;
  message: string;
  status?: number;
}

function describe(error: unknown): ErrorView | 'not-found' {
  if (isRouteErrorResponse(error)) {
    if (error.status === 404) return 'not-found';
    if (error.status === 403) {
      return { status: 403, title: 'This page is not part of your role', message: 'Ask an owner of your organisation if you need it.' };
    }
    return { status: error.status, title: 'This page could not be shown', message: typeof error.data === 'string' ? error.data : error.statusText };
  }
  if (isApiError(error)) {
    if (error.status === 404) return 'not-found';
    if (error.status === 403) return { status: 403, title: 'This page is not part of your role', message: error.message };
    return { status: error.status || undefined, title: 'This page could not be loaded', message: error.message };
  }
  return {
    title: 'Something went wrong on this page',
    message: 'Reload the page to try again. If it keeps happening, tell whoever runs Ridgeload for your firm.',
  };
}

/** The errorElement of every route: a page-sized explanation with a way out. */
export function RouteErrorPage() {
  const error = useRouteError();
  const view = describe(error);
  if (view === 'not-found') return <NotFoundContent />;
  return (
    <section role="alert" aria-labelledby="route-error-title" className="rounded-lg border border-brick-600 bg-white p-6 shadow-card sm:p-8">
      {view.status ? <p className="text-sm font-semibold tracking-wide text-brick-700 uppercase">Error {view.status}</p> : null}
      <h1 id="route-error-title" className="mt-1 text-2xl font-bold">
        {view.title}
      </h1>
      <p className="mt-3 text-ink-700">{view.message}</p>
      <div className="mt-6 flex flex-wrap gap-3">
        {view.status === 403 ? null : (
          <button type="button" onClick={() => window.location.reload()} className={buttonClasses('primary')}>
            Reload the page
          </button>
        )}
        <Link to="/" className={buttonClasses(view.status === 403 ? 'primary' : 'secondary')}>
          Go to my home page
        </Link>
      </div>
    </section>
  );
}

/** The same, for an error above every layout: it brings its own frame. */
export function RootErrorPage() {
  return (
    <div className="mx-auto max-w-xl px-4 py-12">
      <RouteErrorPage />
    </div>
  );
}
