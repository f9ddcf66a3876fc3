import { useEffect, useState } from 'react';
import { INSTRUMENT_KINDS, type InstrumentView } from '@shared/schemas/registers';
import { DataTable } from '@/components/ui/data-table';
import { Loading } from '@/components/ui/loading';
import { Notice } from '@/components/ui/notice';
import { hasRole, useSession } from '@/features/auth/api/get-session';
import { useInstruments, useUploadCertificate } from '@/features/registers/api/instruments';
import { InstrumentForm } from '@/features/registers/components/instrument-form';

/** A certificate picker for one instrument (PDF or image; the server judges the bytes). */
function CertificateUpload({ instrument }: { instrument: InstrumentView }) {
  const upload = useUploadCertificate();
  return (
    <label className="inline-flex min-h-11 cursor-pointer items-center rounded-md border border-rule bg-card px-3 text-sm font-semibold hover:bg-paper-deep">
      {upload.isPending ? 'Sending…' : 'Upload certificate'}
      <input
        type="file"
        accept="application/pdf,image/png,image/jpeg,image/webp"
        className="sr-only"
        aria-label={`Calibration certificate for ${instrument.identifier}`}
        onChange={(e) => {
          const file = e.target.files?.[0];
          e.target.value = '';
          if (file) upload.mutate({ id: instrument.id, file });
        }}
      />
      {upload.isError && (
        <span role="alert" className="ml-2 font-normal text-out">
          {upload.error.message}
        </span>
      )}
    </label>
  );
}

export default function InstrumentsPage() {
  const session = useSession();
  const list = useInstruments();
  const [editing, setEditing] = useState<string | null>(null);
  useEffect(() => {
    document.title = 'Instruments · Benchwright';
  }, []);
  if (list.isPending) return <Loading />;
  if (list.isError) throw list.error;
  const keeper = hasRole(session.data?.user, 'reviewer', 'admin');
  const instruments = list.data.instruments;
  const being = instruments.find((i) => i.id === editing);
  return (
    <section className="flex flex-col gap-6">
      <header>
        <h1 className="text-2xl font-semibold">Instruments</h1>
        <p className="text-sm text-graphite-soft">
          Test instruments with their calibration due dates. An instrument past its due date cannot take a
          reading until it is calibrated again.
        </p>
      </header>
      <DataTable
        label="Instruments"
        columns={['Identifier', 'Kind', 'Calibration due', 'Certificate', ...(keeper ? [''] : [])]}
      >
        {instruments.map((i) => (
          <tr key={i.id} data-instrument={i.identifier} className="border-b border-rule last:border-0">
            <td className="px-3 py-2">
              <span className="value font-semibold">{i.identifier}</span>
              {i.description && <span className="block text-graphite-soft">{i.description}</span>}
            </td>
            <td className="px-3 py-2">{INSTRUMENT_KINDS[i.kind]}</td>
            <td className="px-3 py-2">
              <span className="value">{i.calibrationDue}</span>
              {i.refusal && (
                <span data-refusal className="block font-semibold text-out">
                  Past due: cannot take readings
                </span>
              )}
            </td>
            <td className="px-3 py-2">
              {i.certificate ? (
                <a href={i.certificate.url} className="break-all underline">
                  {i.certificate.fileName}
                </a>
              ) : (
                <span className="text-graphite-soft">none</span>
              )}
            </td>
            {keeper && (
              <td className="px-3 py-2">
                <div className="flex flex-wrap gap-2">
                  <button
                    type="button"
                    className="min-h-11 rounded-md border border-rule px-3 text-sm font-semibold hover:bg-paper-deep"
                    onClick={() => setEditing(i.id)}
                    aria-label={`Edit ${i.identifier}`}
                  >
                    Edit
                  </button>
                  <CertificateUpload instrument={i} />
                </div>
              </td>
            )}
          </tr>
        ))}
      </DataTable>
      {instruments.length === 0 && <Notice>No instruments registered yet.</Notice>}
      {keeper &&
        (being ? (
          <InstrumentForm key={being.id} instrument={being} onDone={() => setEditing(null)} />
        ) : (
          <InstrumentForm />
        ))}
    </section>
  );
}
