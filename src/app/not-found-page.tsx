import { Link, useLocation } from 'react-router-dom';
import { FullPageMessage } from './full-page-message.tsx';

export function NotFoundPage() {
  const { pathname } = useLocation();
  return (
    <FullPageMessage title="No such page">
      <p className="text-muted">
        Nothing lives at <code className="font-mono">{pathname}</code>.
      </p>
      <p>
        <Link className="font-medium text-accent underline underline-offset-2" to="/jobs">
          Go to jobs
        </Link>
      </p>
    </FullPageMessage>
  );
}
