import { describeAccessibilityWalk, publicAndAccountPages } from './support/accessibility-walk';

describeAccessibilityWalk("pages signed out and each person's account pages", publicAndAccountPages);
