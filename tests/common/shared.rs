//! Slow computations shared by the tests of one binary: a test asks for the tooling or the ply
//! book of a project with given settings and gets the one build made for every test that asks
//! for the same project (as read, so a copy of a demo in a temporary folder is the same project)
//! and the same settings. The first test to ask builds; the others wait for that build instead
//! of making their own. The builds are kept until the binary ends.

use std::collections::HashMap;
use std::sync::{Mutex, OnceLock};

use layloft::blade::Blade;
use layloft::plybook::{PlyBook, PlyBookParams, build_ply_book};
use layloft::project::Project;
use layloft::tooling::{BladeTooling, ToolingParams, build_tooling};

type Builds<T> = Mutex<HashMap<String, &'static OnceLock<T>>>;

/// The cell of `key` in `builds`, made empty on the first ask.
fn cell<T>(builds: &'static OnceLock<Builds<T>>, key: String) -> &'static OnceLock<T> {
    let mut map = builds.get_or_init(Default::default).lock().unwrap_or_else(|e| e.into_inner());
    if let Some(&cell) = map.get(&key) {
        return cell;
    }
    let cell: &'static OnceLock<T> = Box::leak(Box::new(OnceLock::new()));
    map.insert(key, cell);
    cell
}

/// The tooling of `project` with `params`, built once per test binary.
pub fn shared_tooling(project: &Project, params: &ToolingParams) -> &'static BladeTooling {
    static BUILDS: OnceLock<Builds<BladeTooling>> = OnceLock::new();
    // The key is the whole project and the whole settings, as their debug text (floats print
    // to the last bit), so two keys are equal only for the same input to the build.
    cell(&BUILDS, format!("{project:?}\n{params:?}")).get_or_init(|| {
        let blade = Blade::from_project(project).expect("the blade lofts");
        build_tooling(&blade, params, &mut |_, _, _| {}).unwrap_or_else(|e| panic!("{e}"))
    })
}

/// The ply book of `project` with `params`, built once per test binary.
pub fn shared_ply_book(project: &Project, params: &PlyBookParams) -> &'static PlyBook {
    static BUILDS: OnceLock<Builds<PlyBook>> = OnceLock::new();
    cell(&BUILDS, format!("{project:?}\n{params:?}")).get_or_init(|| {
        let blade = Blade::from_project(project).expect("the blade lofts");
        build_ply_book(&blade, project, params).expect("ply book")
    })
}
