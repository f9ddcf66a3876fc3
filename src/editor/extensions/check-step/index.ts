import { ReactNodeViewRenderer } from '@tiptap/react';
import { CheckStep as CheckStepNode } from './check-step';
import { CheckStepView } from './check-step-view';

export const CheckStep = CheckStepNode.extend({
  addNodeView() {
    return ReactNodeViewRenderer(CheckStepView);
  },
});
export default CheckStep;
