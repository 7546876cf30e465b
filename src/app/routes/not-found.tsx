import { Link, useLocation } from 'react-router';
import { Page } from '@/components/ui/page.tsx';

export function NotFoundRoute() {
  const { pathname } = useLocation();
  return (
    <Page title="Page not found">
      <p>
        There is no page at <code className="rounded bg-black/5 px-1">{pathname}</code>. Check the address, or go back to{' '}
        <Link to="/" className="font-medium text-copper underline">
          your home page
        </Link>
        .
      </p>
    </Page>
  );
}
