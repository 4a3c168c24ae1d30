import { powerFamily } from './power';

/** quad: f(s) = s^2 (d3-ease 3.0.2 quadIn / quadOut / quadInOut). */
export const quad = powerFamily(2);
