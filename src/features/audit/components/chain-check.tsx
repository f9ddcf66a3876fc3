import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { useAuditChainCheck } from '../api/get-audit';

/** Recomputes the audit log's hash chain on the server and says whether every link holds. */
export function ChainCheck() {
  const check = useAuditChainCheck();
  const report = check.data;
  return (
    <div className="flex flex-wrap items-center gap-3">
      <Button type="button" onClick={() => void check.refetch()} disabled={check.isFetching}>
        {check.isFetching ? 'Checking the chain…' : 'Check the hash chain'}
      </Button>
      {check.isError && <Notice tone="error">{check.error.message}</Notice>}
      {report && !check.isFetching && (
        <Notice tone={report.firstBroken ? 'error' : 'success'}>
          {report.firstBroken
            ? `Broken at entry ${report.firstBroken.seq.toLocaleString()} (${report.firstBroken.action}, ${new Date(report.firstBroken.at).toLocaleString()}): ${report.firstBroken.reason}. Entries from there on cannot be trusted; report this to whoever keeps the database.`
            : `All ${report.checked.toLocaleString()} entries checked: every link holds.${report.head ? ` Latest entry ${report.head.seq.toLocaleString()}, SHA-256 ${report.head.rowHash.slice(0, 16)}…; note it somewhere else to compare with later (a deletion from the end shows only that way).` : ''}`}
        </Notice>
      )}
    </div>
  );
}
