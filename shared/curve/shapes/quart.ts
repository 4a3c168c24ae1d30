import { powerFamily } from './power';

/** quart: f(s) = s^4 (d3-ease 3.0.2 quartIn / quartOut / quartInOut = polyIn.exponent(4)). */
export const quart = powerFamily(4);
