import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { ThemeToggle } from '../../src/app/layout/ThemeToggle';
import { applyTheme, readStoredTheme, THEME_STORAGE_KEY } from '../../src/app/theme';

describe('theme', () => {
  it('toggles Night with a pressed button, remembers it and sets data-theme', async () => {
    const user = userEvent.setup();
    applyTheme(readStoredTheme());
    render(<ThemeToggle />);
    const toggle = screen.getByRole('button', { name: 'Night theme' });
    expect(toggle).toHaveAttribute('aria-pressed', 'false');
    expect(document.documentElement.dataset.theme).toBe('daylight');

    await user.click(toggle);
    expect(toggle).toHaveAttribute('aria-pressed', 'true');
    expect(window.localStorage.getItem(THEME_STORAGE_KEY)).toBe('night');
    expect(document.documentElement.dataset.theme).toBe('night');

    await user.click(toggle);
    expect(toggle).toHaveAttribute('aria-pressed', 'false');
    expect(window.localStorage.getItem(THEME_STORAGE_KEY)).toBe('daylight');
    expect(document.documentElement.dataset.theme).toBe('daylight');
  });

  it('starts from the remembered theme and ignores junk in storage', () => {
    window.localStorage.setItem(THEME_STORAGE_KEY, 'night');
    expect(readStoredTheme()).toBe('night');
    window.localStorage.setItem(THEME_STORAGE_KEY, 'neon');
    expect(readStoredTheme()).toBe('daylight');
  });
});
