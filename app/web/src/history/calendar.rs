//! Calendar arithmetic: the UTC month whose stored key holds an entry, the
//! times a month spans, and the local date and time shown for an entry.

use chrono::{DateTime, Datelike, NaiveDate, NaiveDateTime, NaiveTime, TimeZone, Timelike};
use std::ops::Range;

/// The month (UTC) of a time in ms since 1970, "YYYY-MM": the stored month
/// that holds an entry saved then.
pub fn month_of(ms: i64) -> String {
    let d = DateTime::from_timestamp_millis(ms).unwrap_or_default();
    format!("{:04}-{:02}", d.year(), d.month())
}

/// The times (ms, UTC) from the start of `month` ("YYYY-MM") up to the
/// start of the next: exactly those whose [`month_of`] it is.
pub fn month_span(month: &str) -> Option<Range<i64>> {
    let (y, m) = month.split_once('-')?;
    let (y, m): (i32, u32) = (y.parse().ok()?, m.parse().ok()?);
    let start =
        |y, m| NaiveDate::from_ymd_opt(y, m, 1).map(|d| d.and_time(NaiveTime::MIN).and_utc().timestamp_millis());
    let (ny, nm) = if m == 12 { (y + 1, 1) } else { (y, m + 1) };
    Some(start(y, m)?..start(ny, nm)?)
}

/// The local date and time of a stored UTC time.
pub fn local<Tz: TimeZone>(ms: i64, tz: &Tz) -> NaiveDateTime {
    DateTime::from_timestamp_millis(ms)
        .unwrap_or_default()
        .with_timezone(tz)
        .naive_local()
}

const MONTHS: [&str; 12] = [
    "Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec",
];
const DAYS: [&str; 7] = ["Mon", "Tue", "Wed", "Thu", "Fri", "Sat", "Sun"];

/// "Fri 3 May 2024".
pub fn day_words(d: NaiveDateTime) -> String {
    format!(
        "{} {} {} {}",
        DAYS[d.weekday().num_days_from_monday() as usize],
        d.day(),
        MONTHS[d.month0() as usize],
        d.year()
    )
}

/// "2024-05-03".
pub fn iso_date(d: NaiveDateTime) -> String {
    format!("{:04}-{:02}-{:02}", d.year(), d.month(), d.day())
}

/// "14:05".
pub fn clock(d: NaiveDateTime) -> String {
    format!("{:02}:{:02}", d.hour(), d.minute())
}

#[cfg(test)]
mod tests {
    use super::*;
    use chrono::FixedOffset;

    const MAY: i64 = 1_714_745_100_000; // 2024-05-03T14:05:00Z

    #[test]
    fn a_month_span_holds_exactly_the_times_of_that_month() {
        let may = month_span("2024-05").unwrap();
        assert_eq!(month_of(may.start), "2024-05");
        assert_eq!(month_of(may.start - 1), "2024-04");
        assert_eq!(month_of(may.end - 1), "2024-05");
        assert_eq!(month_of(may.end), "2024-06");
        let dec = month_span("2024-12").unwrap();
        assert_eq!(
            (month_of(dec.start), month_of(dec.end)),
            ("2024-12".to_string(), "2025-01".to_string())
        );
        assert_eq!(month_span("2024-13"), None);
        assert_eq!(month_span("May"), None);
    }

    #[test]
    fn months_are_taken_in_utc() {
        // 2024-05-31T23:30:00Z is June somewhere east of Greenwich, May in storage.
        assert_eq!(month_of(1_717_198_200_000), "2024-05");
    }

    #[test]
    fn local_dates_cross_midnight_by_the_offset() {
        let west = FixedOffset::west_opt(15 * 3600).unwrap();
        let d = local(MAY, &west);
        assert_eq!(
            (iso_date(d), clock(d), day_words(d)),
            ("2024-05-02".into(), "23:05".into(), "Thu 2 May 2024".into())
        );
    }
}
