/** Why a revision was made, as its author gave it at submission; nothing shown while there is none. */
export function ChangeReason({ reason }: { reason: string }) {
  if (!reason) return null;
  return (
    <p className="text-sm break-words" data-change-reason>
      <span className="font-semibold">Change reason:</span> {reason}
    </p>
  );
}
