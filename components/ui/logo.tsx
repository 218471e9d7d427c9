/** Beadline's mark: a bead of liquid resting on a line, with the angle it makes drawn in. */
export function LogoMark({ className = 'h-8 w-8' }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true" focusable="false">
      <rect width="32" height="32" rx="7" fill="#134f52" />
      <path d="M6 22.5 C6 12.5 11 8 16 8 C21 8 26 12.5 26 22.5 Z" fill="#67d5d2" />
      <path d="M4 22.5 H28" stroke="#ecfbfa" strokeWidth="1.6" strokeLinecap="round" />
      <path d="M10.5 22.5 A4.5 4.5 0 0 0 8.2 18.6" fill="none" stroke="#feecc7" strokeWidth="1.4" />
      <circle cx="13" cy="13.5" r="1.6" fill="#ecfbfa" opacity="0.85" />
    </svg>
  );
}

export function Wordmark() {
  return (
    <span className="flex items-center gap-2">
      <LogoMark />
      <span className="text-lg font-semibold tracking-tight text-ink-950">Beadline</span>
    </span>
  );
}
