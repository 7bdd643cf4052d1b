/** Crankprint's mark: a crank throw (journal, web and pin) over four cylinder bars, one of them short. */
export function LogoMark({ size = 32, className = '' }: { size?: number; className?: string }) {
  return (
    <svg width={size} height={size} viewBox="0 0 32 32" aria-hidden="true" className={className}>
      <rect x="1" y="1" width="30" height="30" rx="7" fill="rgb(var(--brand))" />
      <circle cx="11" cy="11" r="4.2" fill="none" stroke="rgb(var(--brand-ink))" strokeWidth="2" />
      <path d="M11 11 L20.5 8" stroke="rgb(var(--brand-ink))" strokeWidth="3.2" strokeLinecap="round" />
      <circle cx="21" cy="8" r="2.4" fill="rgb(var(--brand-ink))" />
      <rect x="6" y="19" width="3.4" height="8" rx="1" fill="rgb(var(--brand-ink))" />
      <rect x="11.6" y="19" width="3.4" height="8" rx="1" fill="rgb(var(--brand-ink))" />
      <rect x="17.2" y="23.5" width="3.4" height="3.5" rx="1" fill="rgb(var(--brand-ink))" opacity="0.75" />
      <rect x="22.8" y="19" width="3.4" height="8" rx="1" fill="rgb(var(--brand-ink))" />
    </svg>
  );
}

export function Wordmark() {
  return (
    <span className="flex items-center gap-2 text-lg font-bold tracking-tight">
      <LogoMark size={30} />
      <span>
        Crank<span className="text-brand">print</span>
      </span>
    </span>
  );
}
