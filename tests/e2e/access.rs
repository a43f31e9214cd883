//! Accessibility checks on the demo page: text contrast, a name for every control, keyboard
//! reach and a visible focus ring.
//!
//! Kept apart from: the charts' colours (checked natively in src/chart/palette.rs). Sources:
//! WCAG 2.1 (W3C Recommendation, 2018): relative luminance and contrast ratio as defined there;
//! success criterion 1.4.3 (text at least 4.5:1, large text, at least 24 px or 18.66 px bold, at
//! least 3:1), 4.1.2 (every control has a name), 2.1.1 (keyboard) and 2.4.7 (focus visible).

use serde_json::Value;

use super::page::{open, wait_for_item};

/// `[elements checked, lowest ratio, failures]`, each failure `[text, ratio, minimum]`: text
/// elements whose contrast with their effective background is below the WCAG 2.1 AA minimum.
/// The background is the first opaque one up the tree.
const LOW_CONTRAST: &str = r#"
const rgb = s => (s.match(/[\d.]+/g) || []).map(Number);
const lum = ([r, g, b]) => {
  const f = c => { c /= 255; return c <= 0.03928 ? c / 12.92 : Math.pow((c + 0.055) / 1.055, 2.4); };
  return 0.2126 * f(r) + 0.7152 * f(g) + 0.0722 * f(b);
};
const background = el => {
  for (let e = el; e; e = e.parentElement) {
    const c = rgb(getComputedStyle(e).backgroundColor);
    if (c.length === 3 || (c.length === 4 && c[3] > 0.99)) return c.slice(0, 3);
  }
  return [255, 255, 255];
};
const out = [];
let checked = 0, lowest = 99;
for (const el of document.querySelectorAll('body *')) {
  const own = [...el.childNodes].some(n => n.nodeType === 3 && n.textContent.trim());
  if (!own || el.closest('[hidden], noscript, .visually-hidden, .visually-hidden-file')) continue;
  const st = getComputedStyle(el);
  if (st.visibility === 'hidden' || st.display === 'none' || Number(st.opacity) === 0) continue;
  const r = el.getBoundingClientRect();
  if (r.width === 0 || r.height === 0) continue;
  // Text colour and the opacity of the element and its ancestors blend the text into its
  // background: contrast is of what is drawn.
  let alpha = rgb(st.color).length === 4 ? rgb(st.color)[3] : 1;
  for (let e = el; e; e = e.parentElement) alpha *= Number(getComputedStyle(e).opacity);
  if (alpha === 0) continue;
  const bg = background(el);
  const fg = rgb(st.color).slice(0, 3).map((c, i) => c * alpha + bg[i] * (1 - alpha));
  const [a, b] = [lum(fg), lum(bg)];
  const ratio = (Math.max(a, b) + 0.05) / (Math.min(a, b) + 0.05);
  const size = parseFloat(st.fontSize), bold = Number(st.fontWeight) >= 700;
  const large = size >= 24 || (bold && size >= 18.66);
  const min = large ? 3 : 4.5;
  checked++;
  lowest = Math.min(lowest, ratio);
  if (ratio < min) out.push([el.tagName + ' ' + el.textContent.trim().slice(0, 40), Math.round(ratio * 100) / 100, min]);
}
return [checked, Math.round(lowest * 100) / 100, out];
"#;

/// Controls without an accessible name (label, aria-label, aria-labelledby or text).
const UNNAMED: &str = r#"
return [...document.querySelectorAll('input, select, textarea, button')].filter(el => {
  if (el.type === 'hidden') return false;
  const labelled = (el.labels && [...el.labels].some(l => l.textContent.trim()))
    || (el.getAttribute('aria-label') || '').trim()
    || (el.getAttribute('aria-labelledby') || '').split(' ').some(id => { const t = document.getElementById(id); return t && t.textContent.trim(); })
    || (el.tagName === 'BUTTON' && el.textContent.trim());
  return !labelled;
}).map(el => el.outerHTML.slice(0, 80));
"#;

/// Controls that a keyboard cannot reach (negative tabIndex; the hidden file input is reached
/// through its label, which the page styles as a button).
const UNREACHABLE: &str = r#"
return [...document.querySelectorAll('input, select, textarea, button, a[href]')]
  .filter(el => el.tabIndex < 0 && !el.disabled)
  .map(el => el.outerHTML.slice(0, 80));
"#;

/// Focus each kind of control and compare its look focused and unfocused: the ring (outline
/// of at least 2 px, or a box shadow) must appear with the focus.
const FOCUS_RINGS: &str = r#"
const ring = el => {
  const st = getComputedStyle(el);
  return [st.outlineStyle !== 'none' && parseFloat(st.outlineWidth) >= 2, st.boxShadow];
};
const out = [];
for (const sel of ['#intake-text', '#load-demo', '#horizon', '#rank-by', '#level-90', '#ranking-table button.row-pick']) {
  const el = document.querySelector(sel);
  if (!el) { out.push([sel, 'missing']); continue; }
  if (document.activeElement) document.activeElement.blur();
  const [outlineBefore, shadowBefore] = ring(el);
  el.focus();
  const [outlineAfter, shadowAfter] = ring(el);
  const shows = (outlineAfter && !outlineBefore) || (shadowAfter !== 'none' && shadowAfter !== shadowBefore);
  if (document.activeElement !== el || !shows) out.push([sel, outlineAfter, shadowAfter]);
}
document.activeElement.blur();
return out;
"#;

fn list(v: &Value) -> Vec<String> {
    v.as_array()
        .map(|a| a.iter().map(|x| x.to_string()).collect())
        .unwrap_or_default()
}

/// The demo page at 1366x768 passes the four checks.
#[test]
fn the_demo_page_meets_contrast_names_keyboard_and_focus_checks() {
    let Some(page) = open((1366, 768)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    let contrast = browser.js(LOW_CONTRAST);
    let checked = contrast[0].as_u64().unwrap_or(0);
    assert!(checked > 100, "only {checked} text elements were checked");
    let low = list(&contrast[2]);
    assert!(
        low.is_empty(),
        "text below the WCAG 2.1 AA contrast: {low:#?}"
    );
    eprintln!(
        "contrast: {checked} text elements, lowest ratio {}",
        contrast[1]
    );
    let unnamed = list(&browser.js(UNNAMED));
    assert!(unnamed.is_empty(), "controls without a name: {unnamed:#?}");
    let unreachable = list(&browser.js(UNREACHABLE));
    assert!(
        unreachable.is_empty(),
        "controls a keyboard cannot reach: {unreachable:#?}"
    );
    let no_ring = list(&browser.js(FOCUS_RINGS));
    assert!(
        no_ring.is_empty(),
        "controls without a visible focus ring: {no_ring:#?}"
    );
}

/// The layout fits a 1366x768 laptop and a wide screen: no sideways scrolling of the page, the
/// charts as wide as their panels. Screenshots of both are saved for review.
#[test]
fn the_layout_fits_a_laptop_and_a_wide_screen() {
    for (window, name) in [
        ((1366, 768), "layout-1366.png"),
        ((2560, 1300), "layout-2560.png"),
    ] {
        let Some(page) = open(window) else {
            return;
        };
        let browser = &page.browser;
        wait_for_item(browser, "Seed packets");
        let fit = browser.js("const c = document.getElementById('look-ahead-chart'); \
             const p = c.closest('.panel').getBoundingClientRect(); \
             return [document.documentElement.scrollWidth, window.innerWidth, \
                     c.getBoundingClientRect().width, p.width]");
        let n = |i: usize| fit[i].as_f64().unwrap_or(f64::NAN);
        if n(0) > n(1) {
            // The elements that reach past the window, outermost first, to say which.
            let wide = browser.js(
                "const clipped = e => { for (let a = e.parentElement; a; a = a.parentElement) \
                   if (['auto', 'scroll', 'hidden'].includes(getComputedStyle(a).overflowX)) \
                     return true; return false; }; \
                 return [...document.querySelectorAll('body *')]\
                   .filter(e => e.getBoundingClientRect().right > window.innerWidth + 1 \
                     && !clipped(e))\
                   .slice(0, 6).map(e => e.tagName + '.' + e.className + ': ' \
                     + e.textContent.slice(0, 80))",
            );
            panic!("{window:?}: the page scrolls sideways ({fit}): {wide:#}");
        }
        // Every column of the Error ledger is in view, down to the tracking signal.
        let ledger = browser.js(
            "const w = document.querySelector('#error-ledger .table-wrap'); \
             return [w.scrollWidth, w.clientWidth]",
        );
        assert!(
            ledger[0].as_f64() <= ledger[1].as_f64(),
            "{window:?}: the Error ledger scrolls sideways ({ledger})"
        );
        assert!(
            n(2) >= 0.9 * n(3) - 40.0,
            "{window:?}: the chart is narrower than its panel ({fit})"
        );
        super::page::save_screenshot(browser, name);
    }
}
