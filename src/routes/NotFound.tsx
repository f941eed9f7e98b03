import { Link } from 'react-router-dom';

export default function NotFound() {
  return (
    <div className="flex flex-col gap-2 py-8">
      <h1 className="text-xl font-semibold text-ink-strong">Nothing here</h1>
      <p className="text-sm text-ink-soft">This address does not lead to a Sigmaline screen.</p>
      <p>
        <Link to="/">Back to your cruises</Link>
      </p>
    </div>
  );
}
