// Building a self-contained HTML page: escaping, tables, embedded images, our stylesheet.
#pragma once

#include <string>
#include <vector>

namespace fickcast::post
{
  /// @p text with &, <, >, " escaped for HTML.
  std::string html_escape(const std::string &text);

  /// A table: optional header row, then rows of cells (escaped here).
  std::string html_table(const std::vector<std::string> &header, const std::vector<std::vector<std::string>> &rows,
                         const std::string &css_class = "");

  /// An <img> with the PNG file @p png_path embedded as a data: URI (base64), and @p alt text.
  /// PostIoError if the file cannot be read.
  std::string html_embedded_png(const std::string &png_path, const std::string &alt);

  /**
   * A whole page: head with our stylesheet (screen and print), @p body, and the script that
   * counts loaded images after load and sets `data-images-ok="N/M"` on <body>.
   */
  std::string html_document(const std::string &title, const std::string &body);

  /// The cautions every report shows (model predictions, regulated uses, invented demo data).
  std::string html_cautions();
} // namespace fickcast::post
