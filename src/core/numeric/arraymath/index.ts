/** Elementary functions over whole arrays (faster than loops of `Math.*`). */
export { expArray, fastExp } from './exp';
export { logArray, fastLog } from './log';
export { powAbsArray } from './pow';
