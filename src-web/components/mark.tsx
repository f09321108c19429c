/** Yokeline's mark: a stator lamination seen end-on (yoke ring, bore, four slots). */
export function Mark({ size = 28 }: { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 32 32" aria-hidden="true" focusable="false">
      <circle cx="16" cy="16" r="14" fill="#15756c" />
      <circle cx="16" cy="16" r="6" fill="none" stroke="#d98c55" strokeWidth="3" />
      <g stroke="#d8e6e2" strokeWidth="2">
        <path d="M16 2v6M16 24v6M2 16h6M24 16h6" />
      </g>
    </svg>
  );
}
