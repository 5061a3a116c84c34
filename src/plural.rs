//! Counted nouns in messages and notes: "1 well", "3 wells", never "well(s)".

/// `n` and the noun in the number it needs: `one` for exactly one, `many` otherwise
/// ("0 wells", "1 well", "2 wells").
pub fn count(n: usize, one: &str, many: &str) -> String {
    format!("{n} {}", if n == 1 { one } else { many })
}

#[cfg(test)]
mod tests {
    use super::count;

    /// English takes the singular for exactly one and the plural for none or several
    /// (common practice (no source)).
    #[test]
    fn one_is_singular_none_and_several_are_plural() {
        assert_eq!(count(1, "entity", "entities"), "1 entity");
        assert_eq!(count(0, "well", "wells"), "0 wells");
        assert_eq!(count(3, "hole", "holes"), "3 holes");
    }
}
