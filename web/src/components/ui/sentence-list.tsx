/** A bulleted list of sentences the server wrote (assumptions, cautions), each its own key. */
export function SentenceList({ items, className }: { items: readonly string[]; className: string }) {
  return (
    <ul className={className}>
      {items.map((a) => (
        <li key={a}>{a}</li>
      ))}
    </ul>
  );
}
