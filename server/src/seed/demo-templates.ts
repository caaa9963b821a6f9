import { createPlanTemplate } from '../commands/plan-templates';
import type { DemoDirector } from './demo-story';

/**
 * Two plan templates of our own wording, written through the command as the clinicians who would
 * write them (so they are audited like any other). Stage lengths and limits are illustrations for
 * the demo, not clinical advice: each plan started from one is checked and changed by its clinician.
 */
export async function demoPlanTemplates(d: DemoDirector): Promise<void> {
  await d.as('clinicianPriya', createPlanTemplate, {
    name: 'Low back, extension-related, young athlete (three stages)',
    description:
      'For a young athlete whose back pain comes on with arching and landing. Not for pain with leg symptoms, or pain at rest or at night: refer on.',
    guidance:
      'Walking, cycling and upper-body work are fine. Stop and tell the care team if pain spreads into a leg or keeps you awake at night.',
    stages: [
      {
        label: 'Settle',
        startOffset: 0,
        endOffset: 13,
        reviewOffset: 12,
        painCeiling: 2,
        patterns: { jump: { mode: 'blocked' }, hinge: { mode: 'capped', caps: { maxPercent1RM: 50, maxRpe: 6 } } },
      },
      {
        label: 'Rebuild',
        startOffset: 14,
        endOffset: 34,
        reviewOffset: 33,
        painCeiling: 3,
        patterns: {
          jump: { mode: 'capped', caps: { impactAllowed: false, maxSetsPerSession: 3 } },
          hinge: { mode: 'capped', caps: { maxPercent1RM: 70, maxRpe: 7 } },
        },
      },
      {
        label: 'Back to the team',
        startOffset: 35,
        endOffset: 55,
        painCeiling: 3,
        patterns: { hinge: { mode: 'capped', caps: { maxPercent1RM: 85 } } },
      },
    ],
  });
  await d.as('clinicianMarcus', createPlanTemplate, {
    name: 'Lateral ankle sprain (two stages)',
    description:
      'After a first sprain with no fracture found. Swelling that grows, or pain on weight-bearing after a week: see the doctor.',
    guidance: 'Walk as comfort allows. Hopping and cutting wait until your clinician says so.',
    stages: [
      { label: 'Protect', startOffset: 0, endOffset: 9, reviewOffset: 7, painCeiling: 2, patterns: { jump: { mode: 'blocked' } } },
      {
        label: 'Load and hop',
        startOffset: 10,
        endOffset: 27,
        painCeiling: 3,
        patterns: { jump: { mode: 'capped', caps: { maxSetsPerSession: 4 } } },
      },
    ],
  });
}
