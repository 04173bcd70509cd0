import { NavLink } from 'react-router-dom';
import { hasAnyRole, type Role } from '../../domain/people/roles';
import { NAV_ITEMS } from './navItems';

/** The links a person's roles allow. The current page is marked by aria-current and a thick bar, not by colour. */
export function MainNav({ roles }: { roles: readonly Role[] }) {
  const items = NAV_ITEMS.filter((item) => !item.roles || hasAnyRole(roles, item.roles));
  return (
    <nav aria-label="Main">
      <ul className="flex flex-col gap-1 lg:flex-row lg:flex-wrap lg:gap-0">
        {items.map((item) => (
          <li key={item.to}>
            <NavLink
              to={item.to}
              end={item.end}
              className={({ isActive }) =>
                'flex min-h-12 items-center border-l-[6px] px-3 font-bold text-ink no-underline lg:border-b-[6px] lg:border-l-0 lg:px-3.5 ' +
                (isActive ? 'border-line bg-selected' : 'border-transparent hover:border-line-soft')
              }
            >
              {item.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}
