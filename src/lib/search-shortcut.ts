// The catalogue search shortcut, a setting kept in this browser. WCAG 2.1.4: a single-key
// shortcut can be turned off or changed to one with a modifier.
import { useSyncExternalStore } from 'react';

export const SEARCH_SHORTCUTS = ['/', 'ctrl+/', 'off'] as const;
export type SearchShortcut = (typeof SEARCH_SHORTCUTS)[number];

export const SHORTCUT_LABELS: Record<SearchShortcut, string> = { '/': '/', 'ctrl+/': 'Ctrl + /', off: 'Off' };

const KEY = 'stackyard.searchShortcut';
const listeners = new Set<() => void>();

function read(): SearchShortcut {
  try {
    const v = localStorage.getItem(KEY);
    return (SEARCH_SHORTCUTS as readonly string[]).includes(v ?? '') ? (v as SearchShortcut) : '/';
  } catch {
    return '/';
  }
}

export function setSearchShortcut(value: SearchShortcut) {
  try {
    localStorage.setItem(KEY, value);
  } catch {
    // Private windows may refuse storage: the choice then lasts until the page reloads.
  }
  current = value;
  listeners.forEach((l) => l());
}

let current: SearchShortcut | null = null;
const snapshot = () => (current ??= read());
const subscribe = (l: () => void) => {
  listeners.add(l);
  return () => listeners.delete(l);
};

export const useSearchShortcut = () => useSyncExternalStore(subscribe, snapshot, () => '/' as SearchShortcut);

/** Is focus in a field that takes typing (or a checkbox, select or editable area)? */
export const isTyping = (el: Element | null) => !!el && (el.matches('input, textarea, select, [contenteditable=""], [contenteditable="true"]') || (el as HTMLElement).isContentEditable);

/** Does this key press ask for the search box, under the chosen shortcut? Never while typing in a field. */
export function isSearchShortcut(e: KeyboardEvent, shortcut: SearchShortcut = snapshot()) {
  if (shortcut === 'off' || e.key !== '/' || e.altKey || e.metaKey) return false;
  if (shortcut === '/') return !e.ctrlKey && !isTyping(document.activeElement);
  return e.ctrlKey;
}

/** The catalogue's search box, which the shortcut focuses. */
export const CATALOGUE_SEARCH_ID = 'catalogue-search';
