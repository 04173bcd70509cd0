import { useEffect, useRef } from 'react';
import { useBlocker } from 'react-router-dom';
import { Button } from '../../../components/ui/Button';

/**
 * Stops a navigation away while `when` holds: inside the app it asks first; closing or reloading the tab
 * gets the browser's own question.
 */
export function LeaveGuard({ when, message = 'The draft has changes that are not saved.' }: { when: boolean; message?: string }) {
  const blocker = useBlocker(({ currentLocation, nextLocation }) => when && currentLocation.pathname !== nextLocation.pathname);
  const stayRef = useRef<HTMLButtonElement>(null);

  useEffect(() => {
    if (!when) return;
    const onBeforeUnload = (event: BeforeUnloadEvent) => {
      event.preventDefault();
      // Older browsers need a return value to show their prompt.
      event.returnValue = '';
    };
    window.addEventListener('beforeunload', onBeforeUnload);
    return () => window.removeEventListener('beforeunload', onBeforeUnload);
  }, [when]);

  useEffect(() => {
    if (blocker.state === 'blocked') stayRef.current?.focus();
  }, [blocker.state]);

  // The changes were saved meanwhile: let the navigation go on.
  useEffect(() => {
    if (blocker.state === 'blocked' && !when) blocker.proceed();
  }, [blocker, when]);

  if (blocker.state !== 'blocked') return null;
  return (
    <div className="fixed inset-0 z-50 flex items-center justify-center bg-paper/80 p-4">
      <div
        role="alertdialog"
        aria-modal="true"
        aria-labelledby="leave-title"
        aria-describedby="leave-text"
        onKeyDown={(e) => {
          if (e.key === 'Escape') blocker.reset();
        }}
        className="w-full max-w-md rounded-md border-4 border-line bg-surface p-5 shadow-lg"
      >
        <h2 id="leave-title" className="mb-2 text-2xl font-bold">
          Leave without saving?
        </h2>
        <p id="leave-text" className="mb-4">
          {message} If you leave now they are lost.
        </p>
        <div className="flex flex-wrap gap-3">
          <Button ref={stayRef} variant="primary" onClick={() => blocker.reset()}>
            Stay and keep editing
          </Button>
          <Button variant="danger" onClick={() => blocker.proceed()}>
            Leave and discard changes
          </Button>
        </div>
      </div>
    </div>
  );
}
