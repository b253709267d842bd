//! HTML and SVG written as text, for the views that only show results
//! (the answer, the sizes around it, the worked steps, the charts, the
//! printed review sheet). The page sets such text as an element's inner
//! HTML in one step: cheaper on a keystroke than building the same
//! elements node by node across the wasm boundary, and one small routine
//! in the module instead of a view type per element.
//!
//! Safety: tag and attribute names are `&'static str`, written in this
//! crate's code; every text and attribute value goes through [`escape`].
//! Nothing typed into a worksheet or carried by a shared link can become
//! markup.

/// Markup being written.
#[derive(Debug, Default, Clone)]
pub struct Markup(String);

/// Appends `text` with the five characters that can end or start markup
/// replaced by their character references.
pub fn escape(out: &mut String, text: &str) {
    for c in text.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            c => out.push(c),
        }
    }
}

impl Markup {
    /// Nothing written yet.
    pub fn new() -> Self {
        Self::default()
    }

    fn start(&mut self, tag: &'static str, attrs: &[(&'static str, &str)]) {
        self.0.push('<');
        self.0.push_str(tag);
        for (name, value) in attrs {
            self.0.push(' ');
            self.0.push_str(name);
            self.0.push_str("=\"");
            escape(&mut self.0, value);
            self.0.push('"');
        }
    }

    /// An opening tag with its attributes.
    pub fn open(&mut self, tag: &'static str, attrs: &[(&'static str, &str)]) -> &mut Self {
        self.start(tag, attrs);
        self.0.push('>');
        self
    }

    /// A closing tag.
    pub fn close(&mut self, tag: &'static str) -> &mut Self {
        self.0.push_str("</");
        self.0.push_str(tag);
        self.0.push('>');
        self
    }

    /// Text, escaped.
    pub fn text(&mut self, text: &str) -> &mut Self {
        escape(&mut self.0, text);
        self
    }

    /// An element holding only text.
    pub fn el(&mut self, tag: &'static str, attrs: &[(&'static str, &str)], text: &str) -> &mut Self {
        self.open(tag, attrs).text(text).close(tag)
    }

    /// An element with no content, closed in the tag (`<circle … />`; in
    /// HTML only for void elements).
    pub fn empty(&mut self, tag: &'static str, attrs: &[(&'static str, &str)]) -> &mut Self {
        self.start(tag, attrs);
        self.0.push_str("/>");
        self
    }

    /// The text written.
    pub fn finish(self) -> String {
        self.0
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // The HTML standard's serialisation escapes `&`, `<`, `>` in text and
    // `&`, `"` in attribute values (WHATWG HTML, "Serialising HTML
    // fragments", from memory); here all five, and `'`, everywhere.
    #[test]
    fn text_and_attribute_values_cannot_become_markup() {
        let hostile = r#"<img src=x onerror="alert('x')"> & </td>"#;
        let mut m = Markup::new();
        m.el("p", &[("title", hostile)], hostile);
        let out = m.finish();
        assert_eq!(
            out,
            "<p title=\"&lt;img src=x onerror=&quot;alert(&#39;x&#39;)&quot;&gt; &amp; &lt;/td&gt;\">\
             &lt;img src=x onerror=&quot;alert(&#39;x&#39;)&quot;&gt; &amp; &lt;/td&gt;</p>"
        );
        assert_eq!(out.matches('<').count(), 2, "only the p's own two tags: {out}");
    }

    #[test]
    fn elements_nest_and_empty_ones_close_in_the_tag() {
        let mut m = Markup::new();
        m.open("g", &[("class", "points")]).empty("circle", &[("cx", "1.0"), ("r", "4")]).close("g");
        assert_eq!(m.finish(), r#"<g class="points"><circle cx="1.0" r="4"/></g>"#);
    }
}
