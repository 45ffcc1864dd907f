/**
 * Text from the server as a rider reads it: no internal references. A file name ("see
 * docs/spring-model.md", "SPRING-MODEL.md") is dropped, and a bare symbol ("n = 1.4") is put in
 * words. The technical detail itself is under "How this was worked out".
 */
export function riderText(text: string): string {
  return text
    .replace(/\(\s*see\s+[\w./-]+\.md\s*\)/gi, '')
    .replace(/[,;]?\s*see\s+[\w./-]+\.md/gi, '')
    .replace(/\(\s*[\w./-]+\.md\s*\)/g, '')
    .replace(/[\w./-]+\.md\b/g, '')
    .replace(/\(\s*n\s*=\s*(\d+(?:\.\d+)?)\s*\)/g, '(air index $1)')
    .replace(/\bn\s*=\s*(\d+(?:\.\d+)?)/g, 'air index $1')
    .replace(/\(\s*\)/g, '')
    .replace(/\s{2,}/g, ' ')
    .replace(/\s+([,.;:)])/g, '$1')
    .trim();
}
