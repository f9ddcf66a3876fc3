import { useEffect } from 'react';
import { useBlocker } from 'react-router-dom';
import { Button } from '@/components/ui/button';

/** Warns before leaving with unsaved changes: the browser's prompt on unload, our own on in-app links. */
export function LeaveGuard({ unsaved, onSave }: { unsaved: boolean; onSave: () => Promise<void> }) {
  const blocker = useBlocker(
    ({ currentLocation, nextLocation }) => unsaved && currentLocation.pathname !== nextLocation.pathname,
  );

  useEffect(() => {
    if (!unsaved) return;
    const warn = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      e.returnValue = '';
    };
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [unsaved]);

  if (blocker.state !== 'blocked') return null;
  return (
    <div
      role="alertdialog"
      aria-labelledby="leave-title"
      className="fixed inset-x-0 bottom-4 z-40 mx-auto w-full max-w-lg rounded-lg border-2 border-graphite bg-card p-4 shadow-xl"
    >
      <h2 id="leave-title" className="font-semibold">
        This draft has unsaved changes
      </h2>
      <p className="mt-1 text-sm">They are kept on this device, but not yet on the server.</p>
      <div className="mt-3 flex flex-wrap gap-2">
        <Button autoFocus onClick={() => blocker.reset()}>
          Stay here
        </Button>
        <Button variant="quiet" onClick={() => void onSave().then(() => blocker.proceed())}>
          Save and leave
        </Button>
        <Button variant="danger" onClick={() => blocker.proceed()}>
          Leave without saving
        </Button>
      </div>
    </div>
  );
}
