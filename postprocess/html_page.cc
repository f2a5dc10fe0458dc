#include "html_page.h"

#include "output_file.h"
#include "post_error.h"

#include <vtkBase64Utilities.h>

#include <filesystem>
#include <vector>

namespace fickcast::post
{
  std::string html_escape(const std::string &text)
  {
    std::string out;
    out.reserve(text.size());
    for (const char c : text)
      switch (c)
        {
          case '&':
            out += "&amp;";
            break;
          case '<':
            out += "&lt;";
            break;
          case '>':
            out += "&gt;";
            break;
          case '"':
            out += "&quot;";
            break;
          default:
            out += c;
        }
    return out;
  }

  std::string html_table(const std::vector<std::string> &header, const std::vector<std::vector<std::string>> &rows,
                         const std::string &css_class)
  {
    // A table wider than the page (a study's per-case table) scrolls in its own box, not the page.
    std::string out = "<div class=\"table-box\">";
    out += css_class.empty() ? "<table>\n" : "<table class=\"" + css_class + "\">\n";
    if (!header.empty())
      {
        out += "<thead><tr>";
        for (const auto &cell : header)
          out += "<th>" + html_escape(cell) + "</th>";
        out += "</tr></thead>\n";
      }
    out += "<tbody>\n";
    for (const auto &row : rows)
      {
        out += "<tr>";
        for (const auto &cell : row)
          out += "<td>" + html_escape(cell) + "</td>";
        out += "</tr>\n";
      }
    return out + "</tbody></table></div>\n";
  }

  std::string html_embedded_png(const std::string &png_path, const std::string &alt)
  {
    if (!std::filesystem::is_regular_file(png_path))
      throw PostIoError("cannot read " + png_path);
    const std::string bytes = read_file(png_path, "a PNG image");
    std::vector<unsigned char> encoded(bytes.size() * 4 / 3 + 8);
    const unsigned long length = vtkBase64Utilities::Encode(reinterpret_cast<const unsigned char *>(bytes.data()),
                                                            static_cast<unsigned long>(bytes.size()), encoded.data());
    return "<img src=\"data:image/png;base64," + std::string(encoded.begin(), encoded.begin() + length) + "\" alt=\"" +
           html_escape(alt) + "\">";
  }

  std::string html_cautions()
  {
    return "<section class=\"cautions\">\n<h2>Cautions</h2>\n<ul>\n"
           "<li>These are model predictions. They support, but do not replace, testing, measurement and "
           "engineering judgement, and they are only as good as the diffusivities, partition coefficients and "
           "boundary conditions put in.</li>\n"
           "<li>The design and approval of medical or drug-release devices, containment barriers and liners, and "
           "anything touching process safety follow the applicable regulations, codes, standards and licensed "
           "professional practice of the place where they are built.</li>\n"
           "<li>The demo cases shipped with fickcast are scenarios of our own with invented numbers; they are not "
           "data for design.</li>\n</ul>\n</section>\n";
  }

  std::string html_document(const std::string &title, const std::string &body)
  {
    static const char *style = R"CSS(
body { font-family: "DejaVu Sans", Arial, sans-serif; color: #111; background: #fff; margin: 2em auto;
       max-width: 62em; padding: 0 1.5em; line-height: 1.45; }
h1 { font-size: 1.6em; margin-bottom: 0.2em; }
h2 { font-size: 1.2em; border-bottom: 1px solid #999; padding-bottom: 0.15em; margin-top: 1.8em; }
p.meta { color: #444; margin-top: 0; }
table { border-collapse: collapse; margin: 0.6em 0; font-size: 0.92em; }
div.table-box { max-width: 100%; overflow-x: auto; }
th, td { border: 1px solid #bbb; padding: 0.25em 0.6em; text-align: left; vertical-align: top; }
th { background: #eee; }
td.number { text-align: right; font-variant-numeric: tabular-nums; }
figure { margin: 1.2em 0; page-break-inside: avoid; break-inside: avoid; }
figure img { max-width: 100%; height: auto; border: 1px solid #ccc; }
figcaption { font-size: 0.9em; color: #333; }
.cautions { border: 2px solid #555; padding: 0.2em 1em; margin: 1.2em 0; }
.cautions h2 { border: none; margin-top: 0.6em; }
.status-ok { font-weight: bold; }
.status-bad { font-weight: bold; text-decoration: underline; }
code { font-family: "DejaVu Sans Mono", monospace; font-size: 0.92em; }
@media print {
  body { margin: 0; max-width: none; font-size: 10pt; }
  div.table-box { overflow: visible; }
  h2 { page-break-after: avoid; break-after: avoid; }
  a { color: #000; text-decoration: none; }
  figure img { border: none; }
  details > * { display: block; }
}
@page { size: A4; margin: 18mm 15mm; }
)CSS";
    static const char *script = R"JS(
<script>
window.addEventListener('load', function () {
  var images = document.getElementsByTagName('img');
  var ok = 0;
  for (var i = 0; i < images.length; ++i)
    if (images[i].complete && images[i].naturalWidth > 0) ++ok;
  document.body.setAttribute('data-images-ok', ok + '/' + images.length);
});
</script>
)JS";
    return "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>" + html_escape(title) +
           "</title>\n<style>" + style + "</style>\n</head>\n<body>\n" + body + script + "</body>\n</html>\n";
  }
} // namespace fickcast::post
