import { Link } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { paths } from '@/config/paths';

export function Component() {
  return (
    <div>
      <PageHeader title="Nothing at this address" documentTitle="Not found" />
      <p className="text-sm text-ink-soft">
        The page may have moved, or the link is mistyped.{' '}
        <Link to={paths.home.getHref()} className="text-accent underline underline-offset-2">
          Go to your start page
        </Link>
        .
      </p>
    </div>
  );
}
