//! Entry point: mounts the sheet.
fn main() {
    console_error_panic_hook::set_once();
    leptos::mount::mount_to_body(joulewise_web::App);
    joulewise_web::bench::mark_figures_visible();
}
