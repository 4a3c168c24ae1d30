import { powerFamily } from './power';

/** cubic: f(s) = s^3 (d3-ease 3.0.2 cubicIn / cubicOut / cubicInOut). */
export const cubic = powerFamily(3);
