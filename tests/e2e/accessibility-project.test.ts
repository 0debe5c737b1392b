import { describeAccessibilityWalk, projectPages } from './support/accessibility-walk';

describeAccessibilityWalk("project pages, from the lead's seat", projectPages);
