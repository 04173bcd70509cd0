import { NavLink } from 'react-router-dom';

const LINKS = [
  { to: '/procedures', label: 'Procedures', end: true },
  { to: '/procedures/stations', label: 'Stations', end: false },
] as const;

/** The procedure area's own sections; the current one is marked by aria-current and a bar, not colour. */
export function ProceduresNav() {
  return (
    <nav aria-label="Procedure area" className="hf-no-print mb-5">
      <ul className="flex flex-wrap gap-2">
        {LINKS.map((link) => (
          <li key={link.to}>
            <NavLink
              to={link.to}
              end={link.end}
              className={({ isActive }) =>
                'inline-flex min-h-11 items-center rounded-md border-2 px-3 font-bold text-ink no-underline ' +
                (isActive ? 'border-line border-b-[6px] bg-selected' : 'border-line-soft hover:border-line')
              }
            >
              {link.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
