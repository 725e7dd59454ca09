/** What deleting a take removes, said the same way wherever a take can be deleted. */
export function takeDeleteMessage(take: { name: string }) {
  return (
    <>
      <strong>{take.name}</strong> will be deleted for good: the recording, every analysis, the draft notes and all
      revisions. This cannot be undone.
    </>
  );
}
