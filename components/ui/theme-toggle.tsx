'use client';
/** Light / dark switch, remembered on this device. */
export function ThemeToggle() {
  return (
    <button
      type="button"
      aria-label="Switch between light and dark"
      className="min-h-touch min-w-touch rounded-lg font-bold hover:bg-raised"
      onClick={() => {
        const next = document.documentElement.dataset.theme === 'dark' ? 'light' : 'dark';
        document.documentElement.dataset.theme = next;
        localStorage.setItem('crankprint-theme', next);
      }}
    >
      <span aria-hidden="true">◐</span>
    </button>
  );
}
