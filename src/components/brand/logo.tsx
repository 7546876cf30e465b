/** Our mark: a controller on two modules on feet, the product in miniature. */
export function Logo({ className = 'h-7 w-7' }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <rect width="32" height="32" rx="6" fill="#1c2430" />
      <rect x="8" y="5" width="16" height="5" rx="1" fill="#a8482a" />
      <rect x="8" y="11.5" width="16" height="6" rx="1" fill="#f7f5f0" />
      <rect x="8" y="19" width="16" height="6" rx="1" fill="#f7f5f0" />
      <rect x="9" y="26.5" width="3" height="2" fill="#f7f5f0" />
      <rect x="20" y="26.5" width="3" height="2" fill="#f7f5f0" />
    </svg>
  );
}
