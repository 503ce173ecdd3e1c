// The bottom navigation bar: the areas of the app, reachable with one thumb. The shell passes the areas
// (web/app/areas.ts) in; a component never imports the shell.
import type { ComponentChildren } from 'preact';

/** One entry of the bar: the area's id (its first path segment) and its label. */
export interface NavItem {
  id: string;
  label: string;
}

const stroke = { fill: 'none', stroke: 'currentColor', 'stroke-width': 2, 'stroke-linecap': 'round', 'stroke-linejoin': 'round' } as const;

/** The icon of each area, by id. */
const ICONS: Record<string, ComponentChildren> = {
  sites: <svg viewBox="0 0 24 24" aria-hidden="true" {...stroke}><path d="M12 21s-7-6.2-7-11a7 7 0 0 1 14 0c0 4.8-7 11-7 11z" /><circle cx="12" cy="10" r="2.5" /></svg>,
  record: <svg viewBox="0 0 24 24" aria-hidden="true" {...stroke}><path d="M6 3v18M6 6h5M6 10h3M6 14h5M6 18h3" /><path d="M14 15c2-1.5 4-1.5 6 0" /><path d="M14 19c2-1.5 4-1.5 6 0" /></svg>,
  storm: <svg viewBox="0 0 24 24" aria-hidden="true" {...stroke}><path d="M3 20h18" /><path d="M4 19c3 0 4-13 7-13s4 9 9 11" /></svg>,
  data: <svg viewBox="0 0 24 24" aria-hidden="true" {...stroke}><ellipse cx="12" cy="6" rx="7" ry="3" /><path d="M5 6v12c0 1.7 3.1 3 7 3s7-1.3 7-3V6" /><path d="M5 12c0 1.7 3.1 3 7 3s7-1.3 7-3" /></svg>,
  sync: <svg viewBox="0 0 24 24" aria-hidden="true" {...stroke}><path d="M4 9h13l-3-3" /><path d="M20 15H7l3 3" /></svg>,
  about: <svg viewBox="0 0 24 24" aria-hidden="true" {...stroke}><circle cx="12" cy="12" r="9" /><path d="M12 11v6M12 7.5v.5" /></svg>,
};

/** Bottom bar of `items`; `current` is the id of the area on screen (none on a missing page). */
export function MainNav({ items, current }: { items: readonly NavItem[]; current: string | undefined }) {
  return (
    <nav class="mainnav" aria-label="Main">
      {items.map((a) => (
        <a key={a.id} href={`#/${a.id}`} aria-current={a.id === current ? 'page' : undefined}>
          {ICONS[a.id]}
          <span>{a.label}</span>
        </a>
      ))}
    </nav>
  );
}
