/** Printed on every hold-time sheet, in this order; the same warnings the app footer gives. */
export const STANDARD_CAUTIONS: readonly string[] = [
  'Parts stay hot long after they look cool: handle with tongs and heat-resistant gloves until a contact thermometer confirms the handling temperature.',
  'Predicted times are estimates from the plan model of this load; the shop\'s material specifications, procedures and local codes govern.',
  'Quench oil can ignite: keep lids and extinguishing media at hand and never exceed the oil\'s rated temperature.',
  'A load with a deviation listed on this sheet must not ship until QA has reviewed and signed off its record.',
]
