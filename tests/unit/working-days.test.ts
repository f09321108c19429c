import { describe, expect, it } from 'vitest';
import { addCalendarDays, addWorkingDays, isWorkingDay, previousWorkingDay, weekday } from '../../shared/compute/working-days';
import { ComputeError } from '../../shared/compute/errors';

// Working days are Monday–Friday (common practice); holidays are not modelled.
describe('working days', () => {
  it('knows the weekday of calendar dates', () => {
    expect(weekday('2026-01-01')).toBe(4); // ISO 8601 calendar: 1 January 2026 is a Thursday
    expect(weekday('2024-02-29')).toBe(4); // leap day 2024 was a Thursday
    expect(weekday('2000-01-01')).toBe(6); // 1 January 2000 was a Saturday
    expect(isWorkingDay('2026-01-03')).toBe(false);
    expect(isWorkingDay('2026-01-05')).toBe(true);
  });

  it('counts from the next day and skips weekends', () => {
    expect(addWorkingDays('2026-01-02', 1)).toBe('2026-01-05'); // Friday + 1 → Monday
    expect(addWorkingDays('2026-01-05', 1)).toBe('2026-01-06');
    expect(addWorkingDays('2026-01-02', 10)).toBe('2026-01-16'); // two full weeks
    expect(addWorkingDays('2026-01-03', 1)).toBe('2026-01-05'); // Saturday + 1 → Monday
    expect(addWorkingDays('2026-01-03', 0)).toBe('2026-01-05');
    expect(addWorkingDays('2026-01-07', 0)).toBe('2026-01-07');
    expect(addWorkingDays('2024-02-28', 2)).toBe('2024-03-01'); // across the leap day
  });

  it('finds the working day before a due date', () => {
    expect(previousWorkingDay('2026-01-05')).toBe('2026-01-02'); // Monday → Friday
    expect(previousWorkingDay('2026-01-07')).toBe('2026-01-06');
    expect(previousWorkingDay('2026-03-01')).toBe('2026-02-27');
  });

  it('adds calendar days across months and years', () => {
    expect(addCalendarDays('2026-01-02', 45)).toBe('2026-02-16');
    expect(addCalendarDays('2025-12-20', 45)).toBe('2026-02-03');
  });

  it('refuses what is not a date or a whole number of days', () => {
    expect(() => addWorkingDays('2026-02-30', 1)).toThrow(ComputeError);
    expect(() => addWorkingDays('yesterday', 1)).toThrow(/not a date/);
    expect(() => addWorkingDays('2026-01-02', -1)).toThrow(/0 or more/);
    expect(() => addWorkingDays('2026-01-02', 1.5)).toThrow(ComputeError);
  });
});
