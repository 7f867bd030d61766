/**
 * Pre-season inspection: the checklist generated from what is installed, the findings a person
 * ticks, the two measurements a technician takes (bar wear under a straight edge, and a
 * clearance survey around the cage), a suggested severity, and the replacement parts that
 * flagged lines turn into. Pure: the server, the checklist island and the tests share it.
 *
 * Lengths are millimetres throughout; the pages convert for people who work in inches.
 */
export {
  type ChecklistKind,
  inspectionSeveritySchema,
  type InspectionSeverity,
  SEVERITY_TEXT,
  conditionIdSchema,
  type ConditionId,
  type ConditionText,
  CONDITIONS,
  conditionText,
  conditionsFor,
  type ChecklistLine,
  SURVEY_KEY,
  rowKey,
  checklistKind,
  buildChecklist,
  MAX_WEAR_MM,
  MAX_CLEARANCE_READING_MM,
  measurementAllowed,
  suggestSeverity,
  SEVERITY_RANK,
  type InspectedLine,
  type ReplacementLine,
  replacementLines,
  type ChecklistCounts,
  countSeverities,
} from './checklist';
export { WEAR_REPLACE_MM, WEAR_WATCH_MM, type WearVerdict, assessWear } from './wear';
export {
  clearanceEndSchema,
  type ClearanceEnd,
  clearanceReadingKey,
  parseClearanceReadingKey,
  clearanceTolerance,
  type ClearanceReading,
  type SurveyFindingKind,
  type SurveyFinding,
  type PositionSurvey,
  type ClearanceSurvey,
  surveyClearance,
  readingsFromMeasurements,
  surveyFromMeasurements,
} from './survey';
