// This description itself.
import type { ApiOperation } from '../registry';

export const descriptionOperations: ApiOperation[] = [
	{
		method: 'get',
		route: '/api/openapi.json',
		resource: 'Description',
		operationId: 'getApiDescription',
		summary: 'This API description (OpenAPI 3.1)',
		description: 'Public: it names the routes and shapes, nothing of anyone\'s data. The same description is readable at /developers/api.',
		access: 'public',
		responses: { 200: { description: 'The OpenAPI document.', content: { 'application/json': { schema: { type: 'object', description: 'An OpenAPI 3.1 document.' } } } } }
	}
];
