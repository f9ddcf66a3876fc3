import { useEffect } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useParams } from 'react-router-dom';
import { Notice } from '@/components/ui/notice';
import { paths } from '@/config/paths';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { revisionQueryOptions } from '@/features/procedures/api/get-revision';
import { DraftWorkspace } from '@/features/procedures/draft/draft-workspace';
import { Loading } from '@/components/ui/loading';

/** The only route that loads the editor (and with it TipTap): readers never download it. */
export default function EditRevisionPage() {
  const { revisionId = '' } = useParams();
  const session = useSession();
  // Always start from the server's latest copy, asked for as the editor mounts: a cached one, even
  // the route loader's, could carry an old lock version.
  const revision = useQuery({ ...revisionQueryOptions(revisionId), refetchOnMount: 'always' });
  const data = revision.isFetchedAfterMount ? revision.data : undefined;
  useEffect(() => {
    document.title = `Editing ${data?.revision.title ?? 'draft'} · Benchwright`;
  }, [data?.revision.title]);

  if (!hasRole(session.data?.user, 'author')) return <Notice tone="error">Only authors edit drafts.</Notice>;
  if (!data) {
    if (revision.isError) throw revision.error;
    return <Loading what="the draft" />;
  }
  const r = data.revision;
  if (r.state !== 'draft') {
    return (
      <Notice tone="info">
        Revision {r.number} is no longer a draft, so it cannot be edited.{' '}
        <Link className="underline" to={paths.revision.href(r.id)}>
          Read it
        </Link>
        .
      </Notice>
    );
  }
  return <DraftWorkspace key={r.id} revision={r} />;
}
