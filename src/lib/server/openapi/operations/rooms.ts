// A room's treatment plan, worked through, and its cut list.
import { cutListQuerySchema } from '../../../schemas/exports';
import type { ApiOperation } from '../registry';
import { binary, cutListExportSchema, planSchema } from '../shapes';

const route = '/api/rooms/[roomId=id]/plan';

export const roomOperations: ApiOperation[] = [
	{
		method: 'get',
		route,
		resource: 'Treatment plans',
		operationId: 'getRoomPlan',
		summary: 'A room\'s treatment plan worked through',
		description: 'Its items, the predicted reverberation time per band beside the target and the measured visits, and the cost. A room without a plan answers an empty one.',
		access: 'project:internal',
		responses: { 200: { description: 'The plan.', content: { 'application/json': { schema: planSchema } } } }
	},
	{
		method: 'get',
		route: `${route}/cutlist`,
		resource: 'Treatment plans',
		operationId: 'exportCutList',
		summary: 'Every piece of the plan with its sheet and place, as CSV or JSON',
		description: 'Sent as a download. When the parts cannot be laid out on the stock, the JSON says why in problem and has no sheets.',
		access: 'project:internal',
		query: cutListQuerySchema,
		responses: {
			200: {
				description: 'The cut list.',
				content: { 'text/csv': { schema: binary('RFC 4180 CSV, UTF-8; lengths in mm, and in inches too with units=in.') }, 'application/json': { schema: cutListExportSchema } }
			}
		},
		errors: { 400: 'format is neither csv nor json.' }
	}
];
