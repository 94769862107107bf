/** Report keys of the flicker, object and iIoU scores (src/docs/metrics.md), checked in test/cli/sceneScores.test.ts. */
export const SCENE_KEYS = [
  'flipBack', 'flipBackVoid', 'flipBackPerClass', 'objectsBySize', 'objectsBySizePerClass', 'smallObjectRecall', 'iIoU',
];
