import { powerFamily } from './power';

/** quint: f(s) = s^5 (d3-ease 3.0.2 quintIn / quintOut / quintInOut = polyIn.exponent(5)). */
export const quint = powerFamily(5);
