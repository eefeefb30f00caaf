import { Link } from 'react-router-dom';
import { PageHeader } from '../../components/page-header';
import { paths } from '../../config/paths';

export function NotFoundRoute() {
  return (
    <>
      <PageHeader title="Page not found" description="There is no page at this address." />
      <Link to={paths.home.href()} className="font-medium text-moss-700 underline underline-offset-2">
        Back to the home page
      </Link>
    </>
  );
}
