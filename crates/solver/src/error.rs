//! Typed errors. Each variant reads as a sentence an engineer can act on; numbers in the
//! messages are shown in engineering units (µm, N, MPa) because they reach the user as text.

/// An input that cannot describe a real bearing.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum InputError {
    /// A length, speed, load, viscosity… that must be positive is not.
    #[error("{what} must be a positive, finite number (got {value})")]
    NotPositive {
        /// What the value is.
        what: String,
        /// The value given.
        value: f64,
    },
    /// A value outside its allowed interval.
    #[error("{what} must lie between {lo} and {hi} (got {value})")]
    OutOfRange {
        /// What the value is.
        what: String,
        /// The value given.
        value: f64,
        /// Smallest allowed value.
        lo: f64,
        /// Largest allowed value.
        hi: f64,
    },
    /// Values that contradict each other.
    #[error("{0}")]
    Inconsistent(String),
}

/// Why a pad or bearing analysis did not produce a result.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum SolverError {
    /// The design itself is not valid.
    #[error("invalid design: {0}")]
    Input(#[from] InputError),
    /// The load cannot be carried with the film above the smallest allowed value.
    #[error(
        "the load of {load_n:.0} N per pad exceeds what this pad can carry above the smallest \
         allowed film of {min_film_um:.2} µm: at that film it carries only {capacity_n:.0} N"
    )]
    Overload {
        /// Load asked of one pad, N.
        load_n: f64,
        /// Smallest allowed film, µm.
        min_film_um: f64,
        /// Load the pad carries at that film, N.
        capacity_n: f64,
    },
    /// A tilting pad whose moments cannot balance with a converging film at this pivot.
    #[error(
        "no converging equilibrium for a pad pivoted at {offset_along:.3} of the arc and \
         {offset_across:.3} of the width: {reason}"
    )]
    NoEquilibrium {
        /// Pivot position along the motion, fraction of the arc from the leading edge.
        offset_along: f64,
        /// Pivot position across the motion, fraction of the width from the inner edge.
        offset_across: f64,
        /// What was found, in words.
        reason: String,
        /// How far aft of the pivot the centre of pressure stays at best, as a fraction of
        /// the pad length, where the pitch scan measured it (none for the other reasons).
        short_of_pivot: Option<f64>,
    },
    /// The film would close: the pad touches the runner.
    #[error("the film closes: the pad would touch the runner (smallest film {min_film_um:.3} µm)")]
    FilmClosed {
        /// Smallest film found, µm.
        min_film_um: f64,
    },
    /// The film would overheat.
    #[error(
        "the film would exceed {temperature_c:.0} °C: the oil cannot carry this duty at this \
         speed (reduce the load, enlarge the pads, or improve the cooling)"
    )]
    Overheated {
        /// Temperature reached, °C.
        temperature_c: f64,
    },
    /// A film that generates no pressure (a parallel, isoviscous film).
    #[error("the pad carries no load: {0}")]
    NoLoadCapacity(String),
    /// An iteration ran out of its budget.
    #[error(
        "the {what} did not converge within {iterations} iterations (remaining relative \
         residual {residual:.2e}); try a finer or coarser grid or check the design"
    )]
    NotConverged {
        /// Which iteration.
        what: &'static str,
        /// Iterations spent.
        iterations: usize,
        /// Last relative residual.
        residual: f64,
    },
}

impl From<crate::lubricant::LubricantError> for SolverError {
    fn from(e: crate::lubricant::LubricantError) -> Self {
        // The lubricant's messages are full sentences; embedded after "invalid design:" they
        // read better in lower case without the closing full stop.
        let text = e.to_string();
        let mut chars = text.trim_end_matches('.').chars();
        let text = match chars.next() {
            Some(first) => first.to_lowercase().chain(chars).collect(),
            None => String::new(),
        };
        SolverError::Input(InputError::Inconsistent(text))
    }
}

/// Checks a length given in metres against a range, with the message in micrometres.
pub(crate) fn within_um(what: &str, value_m: f64, lo_m: f64, hi_m: f64) -> Result<(), InputError> {
    if value_m.is_finite() && value_m >= lo_m && value_m <= hi_m {
        Ok(())
    } else {
        Err(InputError::Inconsistent(format!(
            "{what} must lie between {:.0} and {:.0} µm (got {} µm)",
            lo_m * 1e6,
            hi_m * 1e6,
            if value_m.is_finite() {
                format!("{:.3}", value_m * 1e6)
            } else {
                "no number".into()
            }
        )))
    }
}
