/** Our own warning triangle (ISO 3864 shape: black border, yellow field, exclamation mark). */
export function HazardTriangle({ className = '' }: { className?: string }) {
  return (
    <svg viewBox="0 0 48 44" className={className} role="img" aria-label="Hazard">
      <path d="M24 3 L45 41 H3 Z" fill="#f9c300" stroke="#111" strokeWidth="4" strokeLinejoin="round" />
      <rect x="21.5" y="15" width="5" height="15" rx="1.5" fill="#111" />
      <circle cx="24" cy="35" r="2.8" fill="#111" />
    </svg>
  );
}
