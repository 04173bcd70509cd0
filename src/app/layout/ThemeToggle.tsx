import { useTheme } from '../theme';

/**
 * One press between Daylight and Night. A real toggle button (aria-pressed) named "Night theme"; the
 * On/Off word beside the moon says the state without relying on colour.
 */
/** `collapse`: on narrow phones show only the moon (filled = on) to leave room for the menu button. */
export function ThemeToggle({ collapse = false }: { collapse?: boolean }) {
  const [theme, setTheme] = useTheme();
  const night = theme === 'night';
  return (
    <button
      type="button"
      aria-pressed={night}
      aria-label="Night theme"
      onClick={() => setTheme(night ? 'daylight' : 'night')}
      className={`inline-flex min-h-12 min-w-12 shrink-0 items-center justify-center gap-2 rounded-md border-2 border-line px-2.5 font-bold text-ink hover:bg-selected sm:px-3 ${night ? 'bg-selected' : 'bg-surface'}`}
    >
      <svg viewBox="0 0 20 20" aria-hidden="true" className="size-5 shrink-0">
        <path
          d="M15.5 12.6A6.5 6.5 0 0 1 7.4 4.5a6.5 6.5 0 1 0 8.1 8.1z"
          fill={night ? 'currentColor' : 'none'}
          stroke="currentColor"
          strokeWidth="2"
          strokeLinejoin="round"
        />
      </svg>
      {/* The accessible name stays "Night theme" whatever is visible. */}
      <span className={collapse ? 'hidden sm:inline' : ''}>Night</span>
      <span aria-hidden="true" className={`rounded-sm border-2 border-current px-1 text-sm leading-tight ${collapse ? 'hidden sm:inline' : ''}`}>
        {night ? 'On' : 'Off'}
      </span>
    </button>
  );
}
