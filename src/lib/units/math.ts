import { create, unitDependencies } from 'mathjs';

/**
 * mathjs with only its unit machinery: the full default instance would add most of mathjs to every
 * page that has a form. Shared by every parser in this folder.
 */
export const math = create({ unitDependencies });
