import { useEffect } from 'react';
import { Notice } from '@/components/ui/notice';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useOpenApi, type OperationObject } from '@/features/api-reference/api/get-openapi';
import { describeSchema, SchemaFields } from '@/features/api-reference/components/schema-fields';
import { Loading } from '@/components/ui/loading';

const accessText = (access: OperationObject['x-access']) =>
  access === 'public' ? 'anyone' : access === 'signed-in' ? 'anyone signed in' : access.join(', ');

/** Every API operation as /api/openapi.json describes it: method, path, summary, who may call it, inputs. */
export default function ApiReferencePage() {
  const session = useSession();
  const isAdmin = hasRole(session.data?.user, 'admin');
  const doc = useOpenApi(isAdmin);
  useEffect(() => {
    document.title = 'API reference · Benchwright';
  }, []);
  if (!isAdmin) return <Notice tone="error">This page is for admins.</Notice>;
  const base = doc.data?.servers?.[0]?.url ?? '';
  const operations = Object.entries(doc.data?.paths ?? {}).flatMap(([path, item]) =>
    Object.entries(item).map(([method, op]) => ({ path, method, op })),
  );
  return (
    <section className="flex flex-col gap-4">
      <h1 className="text-2xl font-semibold">API reference</h1>
      <p className="text-sm text-graphite-soft">
        Generated from the same schemas the server checks requests with. {doc.data?.info.description} The
        machine-readable description (OpenAPI {doc.data?.openapi ?? '3.1'}) is at{' '}
        <a href="/api/openapi.json">/api/openapi.json</a>.
      </p>
      {doc.isError && <Notice tone="error">{doc.error.message}</Notice>}
      {doc.isPending && <Loading />}
      {operations.map(({ path, method, op }) => {
        const body = op.requestBody?.content['application/json']?.schema;
        return (
          <article
            key={op.operationId}
            className="flex flex-col gap-2 rounded-lg border border-rule bg-card p-4"
          >
            <h2 className="font-mono text-base font-semibold wrap-anywhere">
              <span className="uppercase">{method}</span> {base}
              {path}
            </h2>
            <p>{op.summary}</p>
            <p className="text-sm">
              <span className="font-semibold">Who may call it:</span> {accessText(op['x-access'])}
            </p>
            {!!op.parameters?.length && (
              <div>
                <h3 className="text-sm font-semibold">Parameters</h3>
                <ul className="flex flex-col gap-1 text-sm">
                  {op.parameters.map((p) => (
                    <li key={`${p.in} ${p.name}`}>
                      <code className="font-semibold">{p.name}</code> ({p.in}
                      {p.required ? '' : ', optional'}) — {describeSchema(p.schema)}
                    </li>
                  ))}
                </ul>
              </div>
            )}
            {body && (
              <div>
                <h3 className="text-sm font-semibold">Body (JSON)</h3>
                <SchemaFields schema={body} />
              </div>
            )}
          </article>
        );
      })}
    </section>
  );
}
