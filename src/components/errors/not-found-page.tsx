import { buttonClasses } from '../ui/button';
import { Link } from 'react-router-dom';

export function NotFoundContent() {
  return (
    <section aria-labelledby="not-found-title" className="rounded-lg border border-mortar-300 bg-white p-6 shadow-card sm:p-8">
      <p className="text-sm font-semibold tracking-wide text-clay-700 uppercase">Error 404</p>
      <h1 id="not-found-title" className="mt-1 text-2xl font-bold sm:text-3xl">
        There is no page at this address
      </h1>
      <p className="mt-3 text-ink-700">The link may be mistyped or out of date. Start again from your home page.</p>
      <Link to="/" className={buttonClasses('primary', 'md', 'mt-6')}>
        Go to my home page
      </Link>
    </section>
  );
}
