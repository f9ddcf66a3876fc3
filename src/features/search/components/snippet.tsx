/** A search extract with the matched words marked; the text is rendered as text, never HTML. */
export function Snippet({ parts }: { parts: { text: string; hit: boolean }[] }) {
  return (
    <span>
      {parts.map((p, i) =>
        p.hit ? (
          <mark key={i} className="rounded-sm bg-accent-wash px-0.5 text-accent-deep">
            {p.text}
          </mark>
        ) : (
          <span key={i}>{p.text}</span>
        ),
      )}
    </span>
  );
}
