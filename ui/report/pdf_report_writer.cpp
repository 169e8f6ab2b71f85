#include "report/report_writers.hpp"

#include "report/pdf_outline.hpp"

#include "files/atomic_file.hpp"
#include "report/report_closing_html.hpp"

#include <QAbstractTextDocumentLayout>
#include <QBuffer>
#include <QPageSize>
#include <QPainter>
#include <QPdfWriter>
#include <QTextDocument>
#include <QTextOption>

namespace plumbline {

namespace {

QString escaped(const std::string& text)
{
    return QString::fromStdString(text).toHtmlEscaped();
}

// Lays blocks down the page and starts a new page when the next block does not fit; every page
// carries its number and the short caution in the footer.
class PdfLayout {
public:
    // `totalPages` is 0 on the first (measuring) pass; `header` runs along the top of every page
    // after the first.
    PdfLayout(QPdfWriter& writer, QPainter& painter, int totalPages, QString header)
        : m_writer(writer)
        , m_painter(painter)
        , m_area(QRectF(QPointF(0, 0), QSizeF(writer.width(), writer.height())).adjusted(0, headerHeight(), 0, -footerHeight()))
        , m_total(totalPages)
        , m_header(std::move(header))
    {
        m_y = m_area.top();
    }

    int page() const { return m_page + 1; }

    // A heading never ends a page: it needs room for itself and a fair part of what follows (a
    // whole chart when a chart comes next).
    void heading(const QString& html, bool chartNext = false)
    {
        fit(chartNext ? chartBlockHeight() + 2.0 * lineHeight() : m_area.height() * 0.3);
        this->html(html, 0.1);
    }

    double chartBlockHeight() const
    {
        const QSize logical = ReportCharts::logicalSize();
        return m_area.width() * logical.height() / logical.width() + 2.2 * lineHeight();
    }

    void html(const QString& html, double gapAfter = 0.4)
    {
        QTextDocument document;
        document.documentLayout()->setPaintDevice(&m_writer);
        document.setDefaultFont(QFont(QStringLiteral("DejaVu Sans"), 9));
        document.setDefaultStyleSheet(QStringLiteral("table{border-collapse:collapse} th{background:#eeeeee}"));
        // Wrap only at spaces: "supplier_score" or "0.574" never breaks mid-token (a column then
        // grows to its longest word instead).
        QTextOption wrapAtSpaces;
        wrapAtSpaces.setWrapMode(QTextOption::WordWrap);
        document.setDefaultTextOption(wrapAtSpaces);
        document.setHtml(html);
        document.setTextWidth(m_area.width());
        // A wide table whose words do not fit at 9 pt is set smaller, down to 6 pt, rather than
        // broken mid-word or run off the page.
        for (int points = 8; points >= 6 && document.idealWidth() > m_area.width(); --points) {
            document.setDefaultFont(QFont(QStringLiteral("DejaVu Sans"), points));
            document.setHtml(html);
            document.setTextWidth(m_area.width());
        }
        const double height = document.size().height();
        fit(height);
        m_painter.save();
        m_painter.translate(m_area.left(), m_y);
        document.drawContents(&m_painter);
        m_painter.restore();
        m_y += height + gapAfter * lineHeight();
    }

    // One chart a row at the full text width, so that its text prints at about 8 pt or more
    // (the chart is drawn at ReportCharts::logicalSize() and scaled), each with its caption.
    void charts(ReportCharts& charts, const std::vector<ReportChartRef>& which)
    {
        const double gap = lineHeight();
        const double width = m_area.width();
        const QSize logical = ReportCharts::logicalSize();
        const double height = width * logical.height() / logical.width();
        const double captionHeight = 2.2 * lineHeight();
        for (const ReportChartRef& chart : which) {
            fit(height + captionHeight);
            const QRectF box(m_area.left(), m_y, width, height);
            charts.draw(chart, &m_painter, box);
            m_painter.save();
            QFont font(QStringLiteral("DejaVu Sans"));
            font.setPixelSize(int(m_writer.resolution() * 8.0 / 72.0)); // 8 pt
            m_painter.setFont(font);
            m_painter.drawText(QRectF(box.left(), box.bottom() + gap * 0.2, width, captionHeight), Qt::AlignLeft | Qt::TextWordWrap,
                               charts.caption(chart));
            m_painter.restore();
            m_y += height + captionHeight + gap;
        }
    }

    void finish() { footer(); }

    // The next block starts on a new page (after the one-page decision summary).
    void newPage()
    {
        if (m_y > m_area.top()) {
            footer();
            m_writer.newPage();
            m_y = m_area.top();
        }
    }

private:
    double lineHeight() const { return m_writer.resolution() * 0.17; }
    double footerHeight() const { return m_writer.resolution() * 0.45; }
    double headerHeight() const { return m_writer.resolution() * 0.3; }

    void fit(double height)
    {
        if (m_y + height > m_area.bottom() && m_y > m_area.top()) {
            footer();
            m_writer.newPage();
            m_y = m_area.top();
        }
    }

    void footer()
    {
        m_painter.save();
        QFont font(QStringLiteral("DejaVu Sans"));
        font.setPixelSize(int(m_writer.resolution() * 0.1));
        m_painter.setFont(font);
        m_painter.setPen(QColor(90, 90, 90));
        const QRectF box(0, m_writer.height() - footerHeight() * 0.8, m_writer.width(), footerHeight() * 0.8);
        m_painter.drawText(box, Qt::AlignLeft | Qt::AlignVCenter | Qt::TextWordWrap,
                           QStringLiteral("Supports, does not replace, clinical and governance review. Aggregates only."));
        ++m_page;
        m_painter.drawText(box, Qt::AlignRight | Qt::AlignVCenter,
                           m_total > 0 ? QStringLiteral("page %1 of %2").arg(m_page).arg(m_total) : QStringLiteral("page %1 of 00").arg(m_page));
        if (m_page > 1) // the running header: which document this page belongs to
            m_painter.drawText(QRectF(0, 0, m_writer.width(), headerHeight() * 0.7), Qt::AlignLeft | Qt::AlignVCenter, m_header);
        m_painter.restore();
    }

    QPdfWriter& m_writer;
    QPainter& m_painter;
    QRectF m_area;
    double m_y = 0;
    int m_page = 0;
    int m_total = 0;
    QString m_header;
};

// A cell that is a number or a few numbers (digits with signs, points, ±, brackets, %, dates):
// kept on one line in a table.
bool unbreakable(const std::string& text)
{
    if (text.empty() || text.size() > 40)
        return false;
    bool digit = false;
    for (const QChar c : QString::fromStdString(text)) {
        if (c.isLetter())
            return false;
        digit = digit || c.isDigit();
    }
    return digit;
}

QString tableHtml(const ReportTable& table, std::size_t from, std::size_t to)
{
    QString html = QStringLiteral("<p><b>%1</b>%2</p><table border=\"1\" cellpadding=\"3\" cellspacing=\"0\" width=\"100%\"><tr>")
                       .arg(escaped(table.title), from > 0 ? QStringLiteral(" (continued)") : QString());
    for (const auto& header : table.headers)
        html += QStringLiteral("<th>%1</th>").arg(escaped(header));
    html += QStringLiteral("</tr>");
    for (std::size_t r = from; r < to; ++r) {
        html += QStringLiteral("<tr>");
        for (const auto& cell : table.rows[r]) {
            // A number (or numbers with ± and brackets) never breaks across lines ("0.\n317",
            // "60848 ±\n4878"): no wrap inside it; a wide table is set smaller instead (above).
            const bool numeric = unbreakable(cell.text);
            html += QStringLiteral("<td%1%2>%3</td>")
                        .arg(cell.number || cell.suppressed ? QStringLiteral(" align=\"right\"") : QString(),
                             numeric ? QStringLiteral(" nowrap style=\"white-space:nowrap\"") : QString(),
                             cell.suppressed ? QStringLiteral("<i>%1</i>").arg(escaped(cell.text))
                             : numeric       ? escaped(cell.text).replace(QLatin1Char(' '), QStringLiteral("&nbsp;"))
                                             : escaped(cell.text));
        }
        html += QStringLiteral("</tr>");
    }
    html += QStringLiteral("</table>");
    if (to == table.rows.size() && !table.note.empty())
        html += QStringLiteral("<p><small>%1</small></p>").arg(escaped(table.note));
    return html;
}

} // namespace

namespace {

// Lays the whole report out on `writer`. `sectionPages` (the page each section starts on) and
// `totalPages` come from a first pass; on that pass they are empty and 0, and the contents list
// and footers take the same room with placeholder numbers, so both passes break pages alike.
void layOut(QPdfWriter& writer, const ReportDocument& document, ReportCharts& charts, const std::vector<int>& sectionPages,
            int totalPages, std::vector<int>& startsOut, int& pagesOut)
{
    QPainter painter(&writer);
    PdfLayout layout(writer, painter, totalPages, QString::fromStdString(document.title) + QStringLiteral(" - document ")
                                                      + QString::fromStdString(document.documentId));
    layout.html(QStringLiteral("<h1>%1</h1><p>%2<br/>Document %3</p><p style=\"background:#fff4d6\"><b>Caution:</b> a validation supports, "
                               "and does not replace, clinical and governance review; results depend on local data quality and outcome "
                               "definitions; follow local policy and regulation.</p>")
                    .arg(escaped(document.title), escaped(document.subtitle), QString::fromStdString(document.documentId)));
    constexpr std::size_t rowsPerBlock = 20; // a table block, even with two-line rows and its note, never outgrows a page
    startsOut.clear();
    for (std::size_t k = 0; k < document.sections.size(); ++k) {
        const ReportSection& section = document.sections[k];
        // The heading is set in one block with what follows it (a paragraph or the first rows of a
        // table), so it can never stand alone at the foot of a page; before a chart it asks for
        // the chart's room.
        QString heading = QStringLiteral("<h2>%1</h2>").arg(escaped(section.title));
        const bool chartFirst = section.paragraphs.empty() && !section.charts.empty();
        if (chartFirst || (section.paragraphs.empty() && section.tables.empty())) {
            layout.heading(heading, chartFirst);
            heading.clear();
            startsOut.push_back(layout.page());
        }
        auto block = [&](const QString& html, double gapAfter) {
            layout.html(heading + html, gapAfter);
            if (!heading.isEmpty())
                startsOut.push_back(layout.page());
            heading.clear();
        };
        for (const auto& paragraph : section.paragraphs)
            block(QStringLiteral("<p>%1</p>").arg(escaped(paragraph)), 0.1);
        layout.charts(charts, section.charts);
        for (const auto& whole : section.tables) {
            const ReportTable table = printedRows(whole);
            for (std::size_t from = 0; from < std::max<std::size_t>(table.rows.size(), 1); from += rowsPerBlock)
                block(tableHtml(table, from, std::min(table.rows.size(), from + rowsPerBlock)), 0.4);
        }
        // The closing lines flow one by one (a heading line kept with the line after it), so a
        // long list of findings fills page 1 instead of moving whole to the next page.
        for (std::size_t j = 0; j < section.closing.size(); ++j) {
            std::vector<std::string> chunk{section.closing[j]};
            const bool title = !section.closing[j].starts_with("- ") && !section.closing[j].starts_with("Warning: ");
            if (title && j + 1 < section.closing.size())
                chunk.push_back(section.closing[++j]);
            layout.html(closingHtml(chunk), 0.0);
        }
        if (section.pageBreakAfter) {
            layout.newPage();
            if (k == 0) { // after the decision summary: the contents
                QString contents = QStringLiteral("<h2>Contents</h2><table cellpadding=\"2\" width=\"100%\">");
                for (std::size_t j = 0; j < document.sections.size(); ++j)
                    contents += QStringLiteral("<tr><td>%1</td><td align=\"right\">page %2</td></tr>")
                                    .arg(escaped(document.sections[j].title),
                                         j < sectionPages.size() ? QString::number(sectionPages[j]) : QStringLiteral("00"));
                layout.html(contents + QStringLiteral("</table>"));
            }
        }
    }
    layout.finish();
    pagesOut = layout.page() - 1;
}

void setUp(QPdfWriter& writer, const ReportDocument& document)
{
    writer.setPageSize(QPageSize(QPageSize::A4));
    writer.setPageMargins(QMarginsF(18, 16, 18, 14), QPageLayout::Millimeter);
    writer.setResolution(300);
    writer.setTitle(QString::fromStdString(document.title));
    writer.setCreator(QStringLiteral("Plumbline"));
}

} // namespace

std::expected<void, InputError> writePdfReport(const ReportDocument& document, ReportCharts& charts, const std::string& path)
{
    // First pass: where each section starts and how many pages there are.
    std::vector<int> starts;
    int pages = 0;
    {
        QByteArray scratch;
        QBuffer buffer(&scratch);
        buffer.open(QIODevice::WriteOnly);
        QPdfWriter writer(&buffer);
        setUp(writer, document);
        layOut(writer, document, charts, {}, 0, starts, pages);
    }
    QByteArray bytes;
    QBuffer buffer(&bytes);
    buffer.open(QIODevice::WriteOnly);
    std::vector<PdfBookmark> bookmarks;
    {
        QPdfWriter writer(&buffer);
        setUp(writer, document);
        std::vector<int> again;
        int total = 0;
        layOut(writer, document, charts, starts, pages, again, total);
        for (std::size_t k = 0; k < again.size() && k < document.sections.size(); ++k)
            bookmarks.push_back({QString::fromStdString(document.sections[k].title), again[k]});
    }
    // Bookmarks: one per section, so a reader can jump from the outline pane.
    bytes = withPdfOutline(bytes, bookmarks);
    return writeFileAtomically(path, std::string_view(bytes.constData(), std::size_t(bytes.size())));
}

} // namespace plumbline
