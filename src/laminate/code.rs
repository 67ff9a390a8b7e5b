//! Laminate codes in the notation of the trade: `[0/±45/90]s`, `[0/90]2s`, `[±45]3`,
//! `[(0/90)2/45]s`, `[0/45/-45/90]T`, and hybrids that name a material per ply,
//! `[0:carbon-ud/±45:glass-biax]s`.
//!
//! The grammar (spaces are ignored):
//!
//! ```text
//! code     = "[" sequence "]" [count] ["s" | "T"]  |  sequence
//! sequence = item { "/" item }
//! item     = (angle | "(" sequence ")") [repeat] [":" material]
//! angle    = ["+" | "-" | "±" | "+-" | "∓" | "-+"] number        (degrees, -180..180)
//! repeat   = "_" digits | subscript digits | digits (after ")" only)
//! ```
//!
//! `±θ` stands for the pair `+θ/-θ` and `∓θ` for `-θ/+θ`; a count after the closing bracket
//! repeats the whole sequence; `s` then mirrors it about the midplane (symmetric), `T` (total)
//! leaves it as written. Plies are listed from the outer face inward.

use std::fmt;
use std::str::FromStr;

use super::LaminateError;
use crate::units::Angle;

/// One ply of an expanded code.
#[derive(Debug, Clone, PartialEq)]
pub struct CodePly {
    /// Fibre angle.
    pub angle: Angle,
    /// Material named in the code, if any.
    pub material: Option<String>,
}

/// A parsed and expanded laminate code.
#[derive(Debug, Clone, PartialEq)]
pub struct LayupCode {
    text: String,
    plies: Vec<CodePly>,
}

impl LayupCode {
    /// The expanded plies, outer face first.
    pub fn plies(&self) -> &[CodePly] {
        &self.plies
    }

    /// The code as written.
    pub fn as_str(&self) -> &str {
        &self.text
    }

    /// A code from an explicit list of plies (angle and optional material), outer face first.
    pub fn from_plies(plies: Vec<CodePly>) -> Self {
        let text = format!(
            "[{}]T",
            plies
                .iter()
                .map(|p| match &p.material {
                    Some(m) => format!("{}:{m}", fmt_angle(p.angle.deg())),
                    None => fmt_angle(p.angle.deg()),
                })
                .collect::<Vec<_>>()
                .join("/")
        );
        LayupCode { text, plies }
    }
}

fn fmt_angle(deg: f64) -> String {
    if deg.fract() == 0.0 { format!("{deg:.0}") } else { format!("{deg}") }
}

impl fmt::Display for LayupCode {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(&self.text)
    }
}

impl FromStr for LayupCode {
    type Err = LaminateError;

    fn from_str(s: &str) -> Result<Self, LaminateError> {
        let mut p = Parser { text: s, chars: s.chars().collect(), pos: 0 };
        let plies = p.code()?;
        Ok(LayupCode { text: s.to_string(), plies })
    }
}

struct Parser<'a> {
    text: &'a str,
    chars: Vec<char>,
    pos: usize,
}

const MAX_PLIES: usize = 100_000;

impl Parser<'_> {
    fn error(&self, expected: &str) -> LaminateError {
        let found = match self.chars.get(self.pos) {
            Some(c) => format!("'{c}'"),
            None => "the end of the code".to_string(),
        };
        LaminateError::Code {
            code: self.text.to_string(),
            position: self.pos + 1,
            message: format!("expected {expected}, found {found}"),
        }
    }

    fn error_at(&self, position: usize, message: String) -> LaminateError {
        LaminateError::Code { code: self.text.to_string(), position: position + 1, message }
    }

    fn skip_spaces(&mut self) {
        while self.chars.get(self.pos).is_some_and(|c| c.is_whitespace()) {
            self.pos += 1;
        }
    }

    fn peek(&mut self) -> Option<char> {
        self.skip_spaces();
        self.chars.get(self.pos).copied()
    }

    fn eat(&mut self, c: char) -> bool {
        if self.peek() == Some(c) {
            self.pos += 1;
            true
        } else {
            false
        }
    }

    fn code(&mut self) -> Result<Vec<CodePly>, LaminateError> {
        if self.peek().is_none() {
            return Err(self.error("a laminate code such as [0/±45/90]s"));
        }
        let bracketed = self.eat('[');
        let mut plies = self.sequence()?;
        if bracketed {
            if !self.eat(']') {
                return Err(self.error("'/' or ']'"));
            }
            let start = self.pos;
            if let Some(n) = self.digits()? {
                plies = repeat(plies, n, start, self)?;
            }
            match self.peek() {
                Some('s' | 'S') => {
                    self.pos += 1;
                    let mirrored: Vec<CodePly> = plies.iter().rev().cloned().collect();
                    plies.extend(mirrored);
                }
                Some('T' | 't') => self.pos += 1,
                _ => {}
            }
        }
        if self.peek().is_some() {
            let expected = if bracketed {
                "nothing after the closing bracket but a count, 's' or 'T'"
            } else {
                "'/' between plies"
            };
            return Err(self.error(expected));
        }
        if plies.len() > MAX_PLIES {
            return Err(self.error_at(0, format!("more than {MAX_PLIES} plies")));
        }
        Ok(plies)
    }

    fn sequence(&mut self) -> Result<Vec<CodePly>, LaminateError> {
        let mut plies = self.item()?;
        while self.eat('/') {
            plies.extend(self.item()?);
        }
        Ok(plies)
    }

    fn item(&mut self) -> Result<Vec<CodePly>, LaminateError> {
        let mut plies = match self.peek() {
            Some('(') => {
                self.pos += 1;
                let inner = self.sequence()?;
                if !self.eat(')') {
                    return Err(self.error("'/' or ')'"));
                }
                let start = self.pos;
                match self.repeat_count(true)? {
                    Some(n) => repeat(inner, n, start, self)?,
                    None => inner,
                }
            }
            _ => {
                let angles = self.angle()?;
                let start = self.pos;
                match self.repeat_count(false)? {
                    Some(n) => repeat(angles, n, start, self)?,
                    None => angles,
                }
            }
        };
        if self.eat(':') {
            let name = self.material_name()?;
            for p in plies.iter_mut().filter(|p| p.material.is_none()) {
                p.material = Some(name.clone());
            }
        }
        Ok(plies)
    }

    fn material_name(&mut self) -> Result<String, LaminateError> {
        self.skip_spaces();
        let start = self.pos;
        while let Some(&c) = self.chars.get(self.pos) {
            if c.is_alphanumeric() || matches!(c, '-' | '_' | '.' | '+' | '#') {
                self.pos += 1;
            } else {
                break;
            }
        }
        if self.pos == start {
            return Err(self.error("a material name after ':'"));
        }
        Ok(self.chars[start..self.pos].iter().collect())
    }

    /// `_n`, subscript digits, or (after a group) plain digits.
    fn repeat_count(&mut self, plain_digits: bool) -> Result<Option<usize>, LaminateError> {
        match self.peek() {
            Some('_') => {
                self.pos += 1;
                match self.digits()? {
                    Some(n) => Ok(Some(n)),
                    None => Err(self.error("a repeat count after '_'")),
                }
            }
            Some(c) if subscript_digit(c).is_some() => {
                let start = self.pos;
                let mut n: usize = 0;
                while let Some(d) = self.chars.get(self.pos).and_then(|&c| subscript_digit(c)) {
                    n = n.saturating_mul(10).saturating_add(d);
                    self.pos += 1;
                }
                check_count(n, start, self).map(Some)
            }
            Some(c) if plain_digits && c.is_ascii_digit() => self.digits(),
            _ => Ok(None),
        }
    }

    fn digits(&mut self) -> Result<Option<usize>, LaminateError> {
        self.skip_spaces();
        let start = self.pos;
        let mut n: usize = 0;
        while let Some(d) = self.chars.get(self.pos).and_then(|c| c.to_digit(10)) {
            n = n.saturating_mul(10).saturating_add(d as usize);
            self.pos += 1;
        }
        if self.pos == start { Ok(None) } else { check_count(n, start, self).map(Some) }
    }

    fn angle(&mut self) -> Result<Vec<CodePly>, LaminateError> {
        #[derive(PartialEq)]
        enum Sign {
            Plus,
            Minus,
            PlusMinus,
            MinusPlus,
        }
        self.skip_spaces();
        let rest: String = self.chars[self.pos..].iter().take(2).collect();
        let sign = if rest.starts_with("+-") {
            self.pos += 2;
            Sign::PlusMinus
        } else if rest.starts_with("-+") {
            self.pos += 2;
            Sign::MinusPlus
        } else {
            match self.chars.get(self.pos) {
                Some('±') => {
                    self.pos += 1;
                    Sign::PlusMinus
                }
                Some('∓') => {
                    self.pos += 1;
                    Sign::MinusPlus
                }
                Some('+') => {
                    self.pos += 1;
                    Sign::Plus
                }
                Some('-' | '−') => {
                    self.pos += 1;
                    Sign::Minus
                }
                _ => Sign::Plus,
            }
        };
        let start = self.pos;
        while self.chars.get(self.pos).is_some_and(|c| c.is_ascii_digit() || *c == '.') {
            self.pos += 1;
        }
        if self.pos == start {
            return Err(self.error("a ply angle in degrees"));
        }
        let text: String = self.chars[start..self.pos].iter().collect();
        let value: f64 = text
            .parse()
            .map_err(|_| self.error_at(start, format!("'{text}' is not a ply angle")))?;
        if value > 180.0 {
            return Err(
                self.error_at(start, format!("ply angle {text} is outside -180..180 degrees"))
            );
        }
        let ply = |deg: f64| CodePly { angle: Angle::from_deg(deg), material: None };
        Ok(match sign {
            Sign::Plus => vec![ply(value)],
            Sign::Minus => vec![ply(-value)],
            Sign::PlusMinus if value == 0.0 => vec![ply(0.0)],
            Sign::MinusPlus if value == 0.0 => vec![ply(0.0)],
            Sign::PlusMinus => vec![ply(value), ply(-value)],
            Sign::MinusPlus => vec![ply(-value), ply(value)],
        })
    }
}

fn subscript_digit(c: char) -> Option<usize> {
    let v = c as u32;
    (0x2080..=0x2089).contains(&v).then(|| (v - 0x2080) as usize)
}

fn check_count(n: usize, start: usize, p: &Parser<'_>) -> Result<usize, LaminateError> {
    if n == 0 || n > MAX_PLIES {
        Err(p.error_at(start, format!("repeat count {n} must be between 1 and {MAX_PLIES}")))
    } else {
        Ok(n)
    }
}

fn repeat(
    plies: Vec<CodePly>,
    n: usize,
    start: usize,
    p: &Parser<'_>,
) -> Result<Vec<CodePly>, LaminateError> {
    if plies.len().saturating_mul(n) > MAX_PLIES {
        return Err(p.error_at(start, format!("the code expands to more than {MAX_PLIES} plies")));
    }
    Ok(plies.iter().cycle().take(plies.len() * n).cloned().collect())
}

#[cfg(test)]
mod tests {
    use super::*;

    fn angles(code: &str) -> Vec<f64> {
        let c: LayupCode = code.parse().unwrap();
        c.plies().iter().map(|p| p.angle.deg().round()).collect()
    }

    // Expansions of the standard laminate code (Kaw, Mechanics of Composite Materials, 2nd ed.,
    // 2006, §4.2 "Code for laminate stacking sequence"; Jones 1999, §4.1).
    #[test]
    fn standard_codes_expand_as_the_notation_says() {
        assert_eq!(angles("[0/±45/90]s"), [0., 45., -45., 90., 90., -45., 45., 0.]);
        assert_eq!(angles("[0/90]2s"), [0., 90., 0., 90., 90., 0., 90., 0.]);
        assert_eq!(angles("[±45]3"), [45., -45., 45., -45., 45., -45.]);
        assert_eq!(angles("[(0/90)2/45]s"), [0., 90., 0., 90., 45., 45., 90., 0., 90., 0.]);
        assert_eq!(angles("[0/45/-45/90]T"), [0., 45., -45., 90.]);
        assert_eq!(angles("[0_2/90]s"), [0., 0., 90., 90., 0., 0.]);
        assert_eq!(angles("[0₂/90]s"), [0., 0., 90., 90., 0., 0.]);
        assert_eq!(angles("0/+-30/-+60"), [0., 30., -30., -60., 60.]);
        assert_eq!(angles("[ 0 / ∓45 ]"), [0., -45., 45.]);
    }

    #[test]
    fn hybrid_codes_carry_a_material_per_ply() {
        let c: LayupCode = "[0:cud/±45:gbx/90]s".parse().unwrap();
        let m: Vec<Option<&str>> = c.plies().iter().map(|p| p.material.as_deref()).collect();
        assert_eq!(
            m,
            [
                Some("cud"),
                Some("gbx"),
                Some("gbx"),
                None,
                None,
                Some("gbx"),
                Some("gbx"),
                Some("cud")
            ]
        );
    }

    #[test]
    fn malformed_codes_point_at_the_offending_character() {
        let e = "[0/±4x/90]s".parse::<LayupCode>().unwrap_err();
        assert!(e.to_string().contains("character 6"), "{e}");
        let e = "[0/90".parse::<LayupCode>().unwrap_err();
        assert!(e.to_string().contains("the end of the code"), "{e}");
        let e = "[0//90]".parse::<LayupCode>().unwrap_err();
        assert!(e.to_string().contains("character 4"), "{e}");
        let e = "[0/200]".parse::<LayupCode>().unwrap_err();
        assert!(e.to_string().contains("outside -180..180"), "{e}");
    }
}
