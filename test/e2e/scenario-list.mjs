// The scenarios in the order they run; later ones may rely on the workspace state of earlier
// ones only where their own file says so.
import { smoke } from './scenarios/smoke.mjs';

export const scenarios = [smoke];
