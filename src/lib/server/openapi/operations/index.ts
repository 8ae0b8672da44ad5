// Every operation of the API, by resource. A new route under src/routes/api gets its entries in
// the file of its resource (or a new file listed here).
import type { ApiOperation, DescriptionLimits } from '../registry';
import { captureOperations } from './captures';
import { captureReferenceOperations } from './capture-reference';
import { comparisonOperations } from './comparisons';
import { descriptionOperations } from './description';
import { photoOperations } from './photos';
import { roomOperations } from './rooms';
import { sessionOperations } from './sessions';
import { sweepOperations } from './sweeps';

export function apiOperations(limits: DescriptionLimits): ApiOperation[] {
	return [...captureOperations, ...captureReferenceOperations(limits), ...sessionOperations(limits), ...comparisonOperations, ...roomOperations, ...sweepOperations, ...photoOperations, ...descriptionOperations];
}
