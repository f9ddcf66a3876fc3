import { useEffect } from 'react';
import { Notice } from '@/components/ui/notice';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { NewProcedureForm } from '@/features/procedures/components/new-procedure-form';

export default function NewProcedurePage() {
  const session = useSession();
  useEffect(() => {
    document.title = 'New procedure · Benchwright';
  }, []);
  if (!hasRole(session.data?.user, 'author'))
    return <Notice tone="error">Only authors create procedures.</Notice>;
  return (
    <section className="flex flex-col gap-4">
      <h1 className="text-2xl font-semibold">New procedure</h1>
      <NewProcedureForm />
    </section>
  );
}
