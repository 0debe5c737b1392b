import { z } from 'zod';
import { idParam } from './common';

export const projectParams = z.object({ projectId: idParam });
export const memberParams = projectParams.extend({ userId: idParam });
export const targetParams = projectParams.extend({ targetId: idParam });
