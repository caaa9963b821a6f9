import { addDays, format, parseISO } from 'date-fns';

/**
 * Today as the person in front of the screen counts it ('YYYY-MM-DD'). A plan's day is a calendar
 * day where the athlete trains, so the browser's own date is the right one to ask about.
 */
export function todayLocal(now: Date = new Date()): string {
  return format(now, 'yyyy-MM-dd');
}

export function addDaysIso(isoDate: string, days: number): string {
  return format(addDays(parseISO(isoDate), days), 'yyyy-MM-dd');
}
