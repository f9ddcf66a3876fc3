import { useEffect } from 'react';
import { Link } from 'react-router-dom';
import type { HomeSection } from '@shared/schemas/home';
import type { Role } from '@shared/schemas/roles';
import { Problem } from '@/components/errors/problem';
import { Loading } from '@/components/ui/loading';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useHome } from '@/features/home/api/get-home';

/** What a role starts from here; every list is in the main menu already. */
const SHORTCUTS: { role: Role; to: string; label: string }[] = [
  { role: 'technician', to: paths.newRun.href(), label: 'Start a bench run' },
];

function Section({ section }: { section: HomeSection }) {
  const headingId = `home-${section.key}`;
  return (
    <article
      aria-labelledby={headingId}
      data-home-section={section.key}
      className="min-w-0 rounded-lg border border-rule bg-card p-4"
    >
      <h2 id={headingId} className="flex items-baseline justify-between gap-3 text-lg font-semibold">
        <span className="min-w-0 text-accent-deep">{section.title}</span>
        <span
          className={`value shrink-0 rounded px-2 text-base ${section.count ? 'bg-pending-wash text-pending' : 'text-graphite-soft'}`}
        >
          {section.count}
          <span className="sr-only"> waiting</span>
        </span>
      </h2>
      {section.count === 0 ? (
        <p className="mt-2 text-sm text-graphite-soft">Nothing waiting.</p>
      ) : (
        <ul className="mt-2 flex flex-col gap-2">
          {section.items.map((i) => (
            <li key={i.id} className="min-w-0 break-words">
              <Link to={i.href} className="font-semibold text-accent underline">
                {i.label}
              </Link>
              <span className={`block text-sm ${i.urgent ? 'font-semibold text-out' : 'text-graphite-soft'}`}>
                {i.detail}
              </span>
            </li>
          ))}
        </ul>
      )}
      <Link to={section.href} className="mt-3 inline-block py-1 text-sm font-semibold text-accent underline">
        {section.linkLabel}
        {section.count > section.items.length && ` (all ${section.count})`}
      </Link>
    </article>
  );
}

/** What waits for the signed-in person, one section per kind of work their roles bring. */
export default function Home() {
  const { data } = useSession();
  const home = useHome();
  const user = data?.user;
  useEffect(() => {
    document.title = 'Start · Benchwright';
  }, []);
  if (!user) return null;
  const shortcuts = SHORTCUTS.filter((s) => hasRole(user, s.role));
  return (
    <section className="flex flex-col gap-4">
      <h1 className="text-2xl font-semibold">Good to see you, {user.displayName.split(' ')[0]}</h1>
      {shortcuts.length > 0 && (
        <nav aria-label="Shortcuts" className="flex flex-wrap gap-x-4 gap-y-1">
          {shortcuts.map((s) => (
            <Link key={s.to} to={s.to} className="py-1 font-semibold text-accent underline">
              {s.label}
            </Link>
          ))}
        </nav>
      )}
      <h2 className="sr-only">What waits for me</h2>
      {home.isPending && <Loading what="what waits for you" />}
      {home.isError && <Problem error={home.error} heading="h2" onRetry={() => void home.refetch()} />}
      {home.data && (
        <div className="grid grid-cols-1 gap-4 md:grid-cols-2">
          {home.data.sections.map((s) => (
            <Section key={s.key} section={s} />
          ))}
        </div>
      )}
    </section>
  );
}
