import { describeAccessibilityWalk, toolPages } from './support/accessibility-walk';

describeAccessibilityWalk('tools and the pages other roles read', toolPages);
