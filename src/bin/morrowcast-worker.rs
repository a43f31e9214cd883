//! The page's Web Worker (wasm): registers the plan worker and waits for asks.
//!
//! Kept apart from: everything it registers ([`crate::worker`]). Natively it only says what
//! it is, like the app's own entry point.

#[cfg(target_arch = "wasm32")]
fn main() {
    use gloo_worker::Registrable;
    use wasm_bindgen::JsCast;
    // A panic in the worker is thrown as a JavaScript error naming the ask and the panic, so
    // the page (listening for its workers' errors) can say what happened and start a new
    // worker. The worker first closes itself: after a panic its state cannot be trusted, and
    // the page has no handle to end it (gloo-worker keeps the Worker object to itself).
    std::panic::set_hook(Box::new(|info| {
        let message = morrowcast_app::worker::fault_message(
            morrowcast_app::worker::answering(),
            &info.to_string(),
        );
        if let Ok(scope) = js_sys::global().dyn_into::<web_sys::DedicatedWorkerGlobalScope>() {
            scope.close();
        }
        wasm_bindgen::throw_str(&message);
    }));
    morrowcast_app::worker::PlanWorker::registrar().register();
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!("morrowcast-worker is the browser app's Web Worker: trunk builds it for wasm32 (bash scripts/start.sh)");
    std::process::exit(2);
}
