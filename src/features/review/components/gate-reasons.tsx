/** The gate's reasons as a list, with a heading that says what they stop; nothing when there are none. */
export function GateReasons({ id, title, reasons, okText }: { id?: string; title: string; reasons: readonly string[]; okText?: string }) {
  if (reasons.length === 0) {
    return okText ? (
      <p id={id} className="text-ok">
        {okText}
      </p>
    ) : null;
  }
  return (
    <div id={id}>
      <p className="font-medium">
        {title} <span className="font-normal text-muted">({reasons.length})</span>
      </p>
      <ul className="mt-1 list-disc space-y-0.5 pl-5">
        {reasons.map((reason, index) => (
          <li key={index}>{reason}</li>
        ))}
      </ul>
    </div>
  );
}
