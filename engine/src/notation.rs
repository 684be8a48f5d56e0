//! Engineering notation at the edges: "200k" → 200 000, "4.7u" → 4.7e-6,
//! and back again for display. The engine itself works in plain SI values;
//! front ends call these to read what a user typed and to show results.

/// SI prefixes accepted on input, with their power of ten. "u" and "µ"
/// (and the Greek "μ") are both micro; "M" is mega, "m" is milli.
const PREFIXES: [(&str, i32); 11] = [
    ("p", -12),
    ("n", -9),
    ("u", -6),
    ("µ", -6),
    ("μ", -6),
    ("m", -3),
    ("k", 3),
    ("K", 3),
    ("M", 6),
    ("G", 9),
    ("T", 12),
];

/// Why a text is not a number.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum ParseError {
    Empty,
    NotANumber(String),
    /// A comma: "1,500" could be 1.5 or 1500, so it is read as neither.
    Comma(String),
    /// A count (turns, wraps, strands) that is not a whole number.
    NotWhole(String),
    /// A count below zero.
    Negative(String),
}

/// The entry as echoed in a message: a very long one is cut (30 characters
/// and an ellipsis) so the message stays readable.
fn echo(s: &str) -> String {
    if s.chars().count() <= 32 {
        s.to_string()
    } else {
        format!("{}…", s.chars().take(30).collect::<String>())
    }
}

impl std::fmt::Display for ParseError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        let (ParseError::NotANumber(s) | ParseError::Comma(s) | ParseError::NotWhole(s) | ParseError::Negative(s)) = self
        else {
            return f.write_str("enter a value");
        };
        let s = &echo(s);
        match self {
            ParseError::Empty => f.write_str("enter a value"),
            ParseError::NotANumber(_) => {
                write!(f, "\"{s}\" is not a number (examples: 200k, 4.7u, 1.5m, 2e5)")
            }
            ParseError::Comma(_) => write!(
                f,
                "\"{s}\" has a comma, which could be a decimal or a thousands separator: write a point for decimals (1.5) and no separator (1500)"
            ),
            ParseError::NotWhole(_) => write!(f, "\"{s}\" is not a whole number; give a count such as 2"),
            ParseError::Negative(_) => write!(f, "\"{s}\" is below zero; a count is 0 or more"),
        }
    }
}

/// Parses a number with an optional SI prefix and an optional unit symbol
/// after it: "200k", "200 kHz", "4.7u", "1.5e-3". `unit` is the unit symbol
/// that may follow (e.g. "Hz"); it is stripped. A dimensionless value
/// (`unit` "") may be given in percent: "45%" is 0.45 (ISO 80000-1 §7.3:
/// % stands for the number 0.01). A comma is refused: "1,500" would be 1.5
/// in some countries and 1500 in others, and a wrong guess changes the
/// design without a word.
pub fn parse(text: &str, unit: &str) -> Result<f64, ParseError> {
    let mut s = text.trim().to_string();
    if s.is_empty() {
        return Err(ParseError::Empty);
    }
    if s.contains(',') {
        return Err(ParseError::Comma(s));
    }
    if unit.is_empty() {
        if let Some(p) = s.strip_suffix('%') {
            let p = p.trim_end();
            if p.ends_with('%') {
                return Err(ParseError::NotANumber(s.clone()));
            }
            let v = parse(p, "")?;
            // A plain number reads as the decimal v/100, correctly rounded
            // ("45%" is exactly the 0.45 typed as "0.45").
            let exact = p.parse::<f64>().ok().and_then(|_| format!("{p}e-2").parse::<f64>().ok());
            return Ok(exact.unwrap_or(v / 100.0));
        }
    }
    if !unit.is_empty() {
        if let Some(stripped) = s.strip_suffix(unit) {
            s = stripped.trim_end().to_string();
        }
    }
    let bad = || ParseError::NotANumber(text.trim().to_string());
    let mut scale = 0;
    for (p, exp) in PREFIXES {
        if let Some(stripped) = s.strip_suffix(p) {
            // "1e" or "5 m" forms: the remainder must itself be a plain number.
            if stripped.trim_end().parse::<f64>().is_ok() {
                s = stripped.trim_end().to_string();
                scale = exp;
            }
            break;
        }
    }
    let v: f64 = s.parse().map_err(|_| bad())?;
    if !v.is_finite() {
        return Err(bad());
    }
    if scale == 0 {
        return Ok(v);
    }
    // "50u" reads as the decimal 50e-6, correctly rounded (multiplying by
    // 10^-6 would be off by an ulp, so a saved 50e-6 would not read back).
    let exact: f64 = format!("{s}e{scale}").parse().map_err(|_| bad())?;
    if !exact.is_finite() {
        return Err(bad());
    }
    Ok(exact)
}

/// Parses a count (turns, wraps, strands, wires in hand): a whole number,
/// 0 or more. "2.5" and "-1" are refused with a message, never rounded
/// or clamped to 0.
pub fn parse_count(text: &str) -> Result<u32, ParseError> {
    let v = parse(text, "")?;
    let shown = || text.trim().to_string();
    if v < 0.0 {
        return Err(ParseError::Negative(shown()));
    }
    if v.fract() != 0.0 || v > f64::from(u32::MAX) {
        return Err(ParseError::NotWhole(shown()));
    }
    Ok(v as u32)
}

/// Formats `v` with an SI prefix and `digits` significant figures, e.g.
/// `format(200e3, "Hz", 3)` → "200 kHz", `format(0.0123, "W", 3)` → "12.3 mW".
pub fn format(v: f64, unit: &str, digits: usize) -> String {
    if !v.is_finite() {
        return "—".to_string();
    }
    if v == 0.0 {
        return format!("0 {unit}").trim_end().to_string();
    }
    let exp3 = ((v.abs().log10() / 3.0).floor() as i32).clamp(-4, 4);
    let prefix = match exp3 {
        -4 => "p",
        -3 => "n",
        -2 => "µ",
        -1 => "m",
        0 => "",
        1 => "k",
        2 => "M",
        3 => "G",
        _ => "T",
    };
    let m = v / 10f64.powi(3 * exp3);
    let int_digits = if m.abs() >= 100.0 { 3 } else if m.abs() >= 10.0 { 2 } else { 1 };
    let decimals = digits.saturating_sub(int_digits);
    format!("{m:.decimals$} {prefix}{unit}").trim_end().to_string()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn parses_prefixes_and_units() {
        assert_eq!(parse("200k", "Hz"), Ok(200e3));
        assert_eq!(parse("200 kHz", "Hz"), Ok(200e3));

        assert!((parse("1.5m", "").unwrap() - 1.5e-3).abs() < 1e-18);
        assert_eq!(parse("2e5", "Hz"), Ok(2e5));
        assert_eq!(parse(" 48 ", "V"), Ok(48.0));
        assert_eq!(parse("48V", "V"), Ok(48.0));
        // ISO 80000-1 §7.3: % is the number 0.01.
        assert_eq!(parse("45%", ""), Ok(0.45));
        assert_eq!(parse("45 %", ""), Ok(0.45));
        assert_eq!(parse("0.5%", ""), Ok(0.005));
        assert!(parse("45%", "V").is_err());
        assert!(parse("%", "").is_err());
        assert!(parse("5%%", "").is_err());
        assert_eq!(parse("1M", "Hz"), Ok(1e6));
        assert_eq!(parse("-3", "V"), Ok(-3.0));
        // Prefixed values read as the correctly rounded decimal.
        assert_eq!(parse("50u", "m"), Ok(50e-6));
        assert_eq!(parse("50u", "m"), Ok(0.05e-3));
        assert_eq!(parse("4.7u", "H"), Ok(4.7e-6));
    }

    #[test]
    fn rejects_garbage() {
        assert_eq!(parse("", "V"), Err(ParseError::Empty));
        assert!(parse("abc", "V").is_err());
        assert!(parse("1.2.3", "V").is_err());
        assert!(parse("inf", "V").is_err());
        assert!(parse("NaN", "V").is_err());
        assert!(parse("k", "V").is_err());
    }

    /// A comma is refused, never read as a decimal point (issue 14).
    #[test]
    fn comma_is_refused() {
        for t in ["1,500", "0,45", "1,5k", ","] {
            assert!(matches!(parse(t, "A"), Err(ParseError::Comma(_))), "{t}");
        }
        assert!(parse("1,500", "A").unwrap_err().to_string().contains("comma"));
        let long = "9".repeat(500) + "x";
        assert!(parse(&long, "").unwrap_err().to_string().len() < 120, "a long entry is cut in the message");
    }

    #[test]
    fn counts_are_whole_and_not_negative() {
        assert_eq!(parse_count("3"), Ok(3));
        assert_eq!(parse_count(" 0 "), Ok(0));
        assert_eq!(parse_count("1k"), Ok(1000));
        assert!(matches!(parse_count("-1"), Err(ParseError::Negative(_))));
        assert!(matches!(parse_count("2.5"), Err(ParseError::NotWhole(_))));
        assert!(matches!(parse_count("1e12"), Err(ParseError::NotWhole(_))));
        assert!(parse_count("x").is_err());
    }

    #[test]
    fn formats_with_prefix() {
        assert_eq!(format(200e3, "Hz", 3), "200 kHz");
        assert_eq!(format(0.0123, "W", 3), "12.3 mW");
        assert_eq!(format(1.5, "W", 3), "1.50 W");
        assert_eq!(format(0.0, "W", 3), "0 W");
        assert_eq!(format(f64::NAN, "W", 3), "—");
    }
}
