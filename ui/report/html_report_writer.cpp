#include "report/report_writers.hpp"

#include "files/atomic_file.hpp"
#include "intake/printable_text.hpp"
#include "report/report_closing_html.hpp"

#include <QString>

namespace plumbline {

namespace {

QString escaped(const std::string& text)
{
    return QString::fromStdString(text).toHtmlEscaped();
}

// Qt's SVG starts with an XML declaration and a doctype, which an inline <svg> must not have.
QString inlineSvg(const QByteArray& svg)
{
    QString text = QString::fromUtf8(svg);
    const qsizetype start = text.indexOf(QStringLiteral("<svg"));
    text = start >= 0 ? text.mid(start) : QString();
    // Labels from the data (subgroup levels) may carry bidirectional controls: shown, not obeyed.
    QString out;
    for (const QChar c : text) {
        const char16_t u = c.unicode();
        const bool bidi = (u >= 0x202A && u <= 0x202E) || (u >= 0x2066 && u <= 0x2069) || u == 0x200E || u == 0x200F || u == 0x061C;
        out += bidi ? QStringLiteral("&lt;U+%1&gt;").arg(int(u), 4, 16, QLatin1Char('0')).toUpper().replace(QStringLiteral("&LT;"), QStringLiteral("&lt;")).replace(QStringLiteral("&GT;"), QStringLiteral("&gt;")) : QString(c);
    }
    return out;
}

QString tableHtml(const ReportTable& table)
{
    QString html = QStringLiteral("<table><caption>%1</caption><thead><tr>").arg(escaped(table.title));
    for (const auto& header : table.headers)
        html += QStringLiteral("<th>%1</th>").arg(escaped(header));
    html += QStringLiteral("</tr></thead><tbody>");
    for (const auto& row : table.rows) {
        html += QStringLiteral("<tr>");
        for (const auto& cell : row)
            html += QStringLiteral("<td class=\"%1\">%2</td>")
                        .arg(cell.suppressed ? QStringLiteral("suppressed") : cell.number ? QStringLiteral("number") : QStringLiteral("text"),
                             escaped(cell.text));
        html += QStringLiteral("</tr>");
    }
    html += QStringLiteral("</tbody></table>");
    if (!table.note.empty())
        html += QStringLiteral("<p class=\"note\">%1</p>").arg(escaped(table.note));
    return html;
}

const char* style = R"(body{font-family:'DejaVu Sans',Arial,sans-serif;max-width:1100px;margin:2em auto;color:#222;line-height:1.4}
h1{font-size:1.6em;margin-bottom:0}h2{font-size:1.25em;border-bottom:1px solid #ccc;margin-top:2em}
.subtitle{color:#666}.caution{background:#fff4d6;border:1px solid #e6c46a;padding:.6em}
table{border-collapse:collapse;margin:1em 0;font-size:.85em}caption{text-align:left;font-weight:bold;padding:.3em 0}
th,td{border:1px solid #ccc;padding:.2em .5em}th{background:#f0f0f0}td.number{text-align:right}
td.suppressed{text-align:right;color:#888;font-style:italic}.note{font-size:.8em;color:#555}
.chart{display:inline-block;margin:.5em;width:520px;vertical-align:top}.chart svg{width:520px;height:auto}
figcaption{font-size:.8em;color:#444})";

} // namespace

std::expected<void, InputError> writeHtmlReport(const ReportDocument& document, ReportCharts& charts, const std::string& path)
{
    // Well-formed XHTML-style markup: every element closed, every text escaped.
    QString html = QStringLiteral("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\"/><title>%1</title><style>%2</style></head><body>")
                       .arg(escaped(document.title), QString::fromLatin1(style));
    html += QStringLiteral("<h1>%1</h1><p class=\"subtitle\">%2<br/>Document %3</p>")
                .arg(escaped(document.title), escaped(document.subtitle), escaped(document.documentId));
    html += QStringLiteral("<p class=\"caution\">A validation supports, and does not replace, clinical and governance review; "
                           "results depend on local data quality and outcome definitions; follow local policy and regulation.</p>");
    for (const auto& section : document.sections) {
        html += QStringLiteral("<h2>%1</h2>").arg(escaped(section.title));
        for (const auto& paragraph : section.paragraphs)
            html += QStringLiteral("<p>%1</p>").arg(escaped(paragraph));
        for (const ReportChartRef& chart : section.charts)
            html += QStringLiteral("<figure class=\"chart\">%1<figcaption>%2</figcaption></figure>")
                        .arg(inlineSvg(charts.svg(chart)),
                             QString::fromStdString(withVisibleBidiControls(charts.caption(chart).toStdString())).toHtmlEscaped());
        for (const auto& table : section.tables)
            html += tableHtml(printedRows(table));
        html += closingHtml(section.closing);
    }
    html += QStringLiteral("</body></html>\n");
    return writeFileAtomically(path, html.toStdString());
}

} // namespace plumbline
