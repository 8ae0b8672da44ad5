// The length unit of a plan page: `units=mm|in` in the address (a builder switching at the
// bench) or in the form that was submitted (so a bare "24" means what the page showed), else
// the user's preference.
import type { Scope } from '../auth/access';
import { unitOfSystem } from '../../schemas/treatment';
import type { LengthUnit } from '../../treatment/units';

export function planUnit(source: URLSearchParams | FormData, scope: Pick<Scope, 'user'>): LengthUnit {
	const asked = source.get('units');
	if (asked === 'mm' || asked === 'in') return asked;
	return unitOfSystem(scope.user.unitSystem);
}

/** A form schema in the unit the submitted form was in. */
export function inFormUnit<S>(scope: Pick<Scope, 'user'>, schemaOf: (unit: LengthUnit) => S): (form: FormData) => S {
	return (form) => schemaOf(planUnit(form, scope));
}
