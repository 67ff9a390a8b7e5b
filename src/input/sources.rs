//! Where a project was written: its folder, the display names of its files, the line of each
//! station and ply, and the values that are legal but unusual. The reader fills a [`Sources`]
//! beside the [`crate::project::Project`] it reads, so that the model stays free of file
//! positions; the command line uses it to place an error raised by index or radius below it.

use std::path::PathBuf;

use super::location::Location;

/// The positions of a project in its files, kept apart from the model.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Sources {
    /// Folder of `blade.toml`; the files it names are relative to it.
    pub dir: PathBuf,
    /// Display name of `blade.toml` for messages.
    pub file: String,
    /// Display names of the files the project names.
    pub files: ProjectFiles,
    /// Line in the stations file of each station, by the station's index in the project.
    pub station_lines: Vec<usize>,
    /// Radius of each station as read, m, by index: to find the station nearest a radius
    /// without the project at hand.
    pub station_radii: Vec<f64>,
    /// Line in the plies file of each ply, by the ply's index in the project (outermost first).
    pub ply_lines: Vec<usize>,
    /// Values that are legal but unusual, with where they were given (worded in
    /// `report::warnings`).
    pub warnings: Vec<InputWarning>,
}

/// Display names (paths as joined to the project folder) of a project's files.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct ProjectFiles {
    /// The stations file.
    pub stations: String,
    /// The plies file.
    pub plies: String,
    /// The materials file.
    pub materials: String,
}

impl Sources {
    /// The line in the stations file of station `index`, 0 when there is no such station.
    pub fn station_line(&self, index: usize) -> usize {
        self.station_lines.get(index).copied().unwrap_or(0)
    }

    /// The line in the plies file of ply `index`, 0 when there is no such ply.
    pub fn ply_line(&self, index: usize) -> usize {
        self.ply_lines.get(index).copied().unwrap_or(0)
    }

    /// Index of the station nearest radius `r`, the first of two as near; `None` without
    /// stations.
    pub fn nearest_station(&self, r: f64) -> Option<usize> {
        self.station_radii
            .iter()
            .enumerate()
            .min_by(|(_, a), (_, b)| (*a - r).abs().total_cmp(&(*b - r).abs()))
            .map(|(i, _)| i)
    }

    /// Station `index`'s line of the stations file, or the whole file when there is no such
    /// station.
    pub fn station(&self, index: usize) -> Location {
        match self.station_lines.get(index) {
            Some(&line) => Location::line(self.files.stations.clone(), line),
            None => Location::file(self.files.stations.clone()),
        }
    }
}

/// A value of the input that is legal but unusual, with the place where it was given. Printed
/// with the other warnings and repeated with the design check's verdict.
#[derive(Debug, Clone, PartialEq)]
pub enum InputWarning {
    /// The first station lies outboard of the hub by more than half the blade's length.
    FarFromHub {
        /// Where `hub_radius_m` is given.
        place: Location,
        /// Radius of the first station, m.
        r_root: f64,
        /// The hub radius, m.
        hub_radius: f64,
    },
    /// A load case with a load factor below 1.
    LowLoadFactor {
        /// Where its `load_factor` is given.
        place: Location,
        /// The load case.
        case: String,
        /// The load factor.
        factor: f64,
    },
    /// A load case with a load factor above 3.
    HighLoadFactor {
        /// Where its `load_factor` is given.
        place: Location,
        /// The load case.
        case: String,
        /// The load factor.
        factor: f64,
    },
    /// A process temperature below the one before it (injection, gel, cure).
    FallingTemperature {
        /// Where the lower temperature is given.
        place: Location,
        /// Its key.
        key: String,
        /// Its value, °C.
        value_c: f64,
        /// The key of the temperature before it.
        before_key: String,
        /// That value, °C.
        before_c: f64,
    },
    /// A least reserve factor below 1.
    ReserveBelowOne {
        /// The project file (`blade.toml`).
        file: String,
        /// `criteria.min_reserve_factor`.
        min_reserve_factor: f64,
    },
    /// An isotropic material of a ply with a tensile strength but no compressive strength: the
    /// tensile strength is taken in compression (a foam or a core is weaker there).
    CompressionFromTension {
        /// Where the material's record is.
        place: Location,
        /// The material.
        material: String,
        /// Its tensile strength, Pa.
        tensile: f64,
    },
    /// A point mass further from the pitch axis than twice the blade's largest chord.
    MassFarOff {
        /// Where its larger offset is given.
        place: Location,
        /// The point mass.
        name: String,
        /// Its distance from the pitch axis, m.
        offset: f64,
        /// The blade's largest chord, m.
        chord: f64,
    },
    /// A least buckling reserve factor below 1.
    BucklingBelowOne {
        /// The project file (`blade.toml`).
        file: String,
        /// `criteria.min_buckling_factor`.
        min_buckling_factor: f64,
    },
}
