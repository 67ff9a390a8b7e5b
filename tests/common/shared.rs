//! Tooling builds shared by the tests of one binary: a test asks for the tooling of a project
//! with given settings and gets the one build made for every test that asks for the same project
//! (as read, so a copy of a demo in a temporary folder is the same project) and the same
//! settings. The first test to ask builds; the others wait for that build instead of making
//! their own. The builds are kept until the binary ends.

use std::collections::HashMap;
use std::sync::{Mutex, OnceLock};

use layloft::blade::Blade;
use layloft::project::Project;
use layloft::tooling::{BladeTooling, ToolingParams, build_tooling};

type Builds = HashMap<String, &'static OnceLock<BladeTooling>>;

/// The tooling of `project` with `params`, built once per test binary.
pub fn shared_tooling(project: &Project, params: &ToolingParams) -> &'static BladeTooling {
    static BUILDS: OnceLock<Mutex<Builds>> = OnceLock::new();
    // The key is the whole project and the whole settings, as their debug text (floats print
    // to the last bit), so two keys are equal only for the same input to the build.
    let key = format!("{project:?}\n{params:?}");
    let cell: &'static OnceLock<BladeTooling> = *BUILDS
        .get_or_init(Default::default)
        .lock()
        .unwrap_or_else(|e| e.into_inner())
        .entry(key)
        .or_insert_with(|| Box::leak(Box::new(OnceLock::new())));
    cell.get_or_init(|| {
        let blade = Blade::from_project(project).expect("the blade lofts");
        build_tooling(&blade, params, &mut |_, _, _| {}).unwrap_or_else(|e| panic!("{e}"))
    })
}
