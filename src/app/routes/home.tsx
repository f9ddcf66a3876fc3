import { useEffect } from 'react';
import { Link } from 'react-router-dom';
import type { Role } from '@shared/schemas/roles';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';

/** What each role comes here to do; a person with several roles sees each of their panels. */
const PANELS: {
  role: Role;
  title: string;
  body: string;
  link?: { to: string; label: string };
  more?: { to: string; label: string }[];
}[] = [
  {
    role: 'technician',
    title: 'Bench work',
    body: 'Run approved procedures on the units in for service, record every reading against its expected value, and sign the run sheet.',
    link: { to: paths.procedures.href(), label: 'Approved procedures' },
    more: [
      { to: paths.newRun.href(), label: 'Start a bench run' },
      { to: paths.runs.href(), label: 'Bench runs' },
      { to: paths.units.href(), label: 'Units on the bench' },
    ],
  },
  {
    role: 'author',
    title: 'Writing procedures',
    body: 'Draft and revise procedures with live calculations, readings, check steps and hazard notes, then submit them for review.',
    link: { to: paths.procedures.href(), label: 'Procedures and drafts' },
  },
  {
    role: 'reviewer',
    title: 'Review and sign-off',
    body: 'Check what changed in each submitted revision and approve or return it with your signed decision. You never review your own work.',
    link: { to: paths.reviewQueue.href(), label: 'Open the review queue' },
  },
  {
    role: 'admin',
    title: 'Shop administration',
    body: 'Invite people, set their roles, and deactivate accounts that should no longer sign in.',
    link: { to: paths.people.href(), label: 'Manage people' },
  },
];

export default function Home() {
  const { data } = useSession();
  const user = data?.user;
  useEffect(() => {
    document.title = 'Start · Benchwright';
  }, []);
  if (!user) return null;
  const panels = PANELS.filter((p) => hasRole(user, p.role));
  return (
    <section>
      <h1 className="text-2xl font-semibold">Good to see you, {user.displayName.split(' ')[0]}</h1>
      <div className="mt-6 grid grid-cols-1 gap-4 md:grid-cols-2">
        {panels.map((p) => (
          <article
            key={p.role}
            data-role-panel={p.role}
            className="rounded-lg border border-rule bg-card p-5"
          >
            <h2 className="text-lg font-semibold text-accent-deep">{p.title}</h2>
            <p className="mt-2 text-sm leading-relaxed">{p.body}</p>
            {p.link && (
              <Link to={p.link.to} className="mt-4 inline-block font-semibold text-accent underline">
                {p.link.label}
              </Link>
            )}
            {p.more?.map((l) => (
              <Link
                key={l.to}
                to={l.to}
                className="ml-4 mt-4 inline-block font-semibold text-accent underline"
              >
                {l.label}
              </Link>
            ))}
          </article>
        ))}
      </div>
    </section>
  );
}
