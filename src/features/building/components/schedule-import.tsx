export function ScheduleImport() {
  return null;
}
