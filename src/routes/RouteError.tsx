import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { Brand } from '../components/Brand';
import { Footer } from '../components/Footer';
import { ErrorNotice } from '../components/Notice';

/** Shown when a screen fails to load or render; keeps the caution and a way back. */
export default function RouteError() {
  const error = useRouteError();
  const title = isRouteErrorResponse(error) ? `${error.status} ${error.statusText}` : 'This screen failed';
  return (
    <div className="flex min-h-screen flex-col">
      <header className="border-b border-paper-rule">
        <div className="mx-auto flex h-12 max-w-[1840px] items-center px-6">
          <Brand />
        </div>
      </header>
      <main className="mx-auto flex w-full max-w-3xl flex-1 flex-col gap-4 px-6 py-10">
        <ErrorNotice error={isRouteErrorResponse(error) ? new Error(String(error.data ?? '')) : error} title={title} />
        <p>
          <Link to="/">Back to your cruises</Link>
        </p>
      </main>
      <Footer />
    </div>
  );
}
