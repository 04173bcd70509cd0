import { useId } from 'react';
import { THEME_LABELS, useTheme, type Theme } from '../../../app/theme';

const descriptions: Record<Theme, string> = {
  daylight: 'High contrast dark-on-light, for reading a phone outdoors in bright sun.',
  night: 'Dim red-amber on near-black, for night tests: keeps your eyes adapted to the dark.',
};

/** The same setting as the header's Night theme button, spelled out with what each theme is for. */
export function ThemeChoice() {
  const [theme, setTheme] = useTheme();
  const name = useId();
  return (
    <fieldset>
      <legend className="mb-2 font-bold">Theme on this device</legend>
      <div className="flex flex-col gap-2">
        {(Object.keys(THEME_LABELS) as Theme[]).map((option) => (
          <label
            key={option}
            className={`flex min-h-12 cursor-pointer items-start gap-3 rounded-md border-2 p-3 ${
              theme === option ? 'border-line border-[3px] bg-selected' : 'border-line-soft'
            }`}
          >
            <input type="radio" name={name} className="mt-0.5" checked={theme === option} onChange={() => setTheme(option)} />
            <span>
              <span className="block font-bold">{THEME_LABELS[option]}</span>
              <span className="block text-ink">{descriptions[option]}</span>
            </span>
          </label>
        ))}
      </div>
      <p className="mt-3 text-ink-muted">The choice is remembered in this browser only.</p>
    </fieldset>
  );
}
