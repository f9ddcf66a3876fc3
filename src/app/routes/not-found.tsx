import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';

export default function NotFound() {
  return (
    <section className="py-12">
      <h1 className="text-2xl font-semibold">Nothing here</h1>
      <p className="mt-3">That page does not exist, or it has moved.</p>
      <Link to={paths.home.href()} className="mt-6 inline-block underline">
        Back to the start page
      </Link>
    </section>
  );
}
