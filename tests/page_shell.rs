//! The page's static stand-in (`www/index.html`), shown while the program
//! downloads and starts, says what every result says.
#![cfg(not(target_arch = "wasm32"))]

use headroom::sheet::report::CAUTION;

#[test]
fn the_stand_in_shows_the_caution_every_result_carries() {
    let page = include_str!("../www/index.html");
    let stand_in = &page[page.find("<div id=\"loading\"").expect("a stand-in")..];
    assert!(stand_in.contains(&format!("<p class=\"caution\" role=\"note\">{CAUTION}</p>")), "{stand_in}");
    assert!(stand_in.contains("<h1>Headroom</h1>"));
}
