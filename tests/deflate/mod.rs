//! Raw DEFLATE built by hand, for the link tests on both targets
//! (`tests/links.rs` natively, `tests/keeping.rs` in the browser): no
//! deflate library involved, so each reader is held to the same bytes.

/// `bytes` as raw DEFLATE made of stored (uncompressed) blocks, from
/// RFC 1951 section 3.2.4: a header byte (BFINAL, BTYPE 00), LEN and its
/// ones' complement NLEN (little-endian), then the bytes; at most 65,535
/// bytes a block (`bytes` not empty).
pub fn stored_blocks(bytes: &[u8]) -> Vec<u8> {
    let mut out = Vec::new();
    let mut chunks = bytes.chunks(0xFFFF).peekable();
    while let Some(chunk) = chunks.next() {
        let len = chunk.len() as u16;
        out.push(u8::from(chunks.peek().is_none()));
        out.extend(len.to_le_bytes());
        out.extend((!len).to_le_bytes());
        out.extend(chunk);
    }
    out
}
