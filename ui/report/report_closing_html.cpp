#include "report/report_closing_html.hpp"

namespace plumbline {

QString closingHtml(const std::vector<std::string>& paragraphs)
{
    QString html;
    QString openList; // the tag of the list being filled, empty when none
    auto close = [&] {
        if (!openList.isEmpty())
            html += QStringLiteral("</ul>");
        openList.clear();
    };
    for (const auto& paragraph : paragraphs) {
        const QString text = QString::fromStdString(paragraph);
        const bool bullet = text.startsWith(QStringLiteral("- "));
        const bool warning = text.startsWith(QStringLiteral("Warning: "));
        const QString kind = bullet ? QStringLiteral("findings") : warning ? QStringLiteral("warnings") : QString();
        if (kind != openList) {
            close();
            if (!kind.isEmpty()) {
                html += kind == QStringLiteral("warnings") ? QStringLiteral("<ul class=\"warnings\" style=\"font-size:small;margin-top:0px;margin-bottom:2px\">")
                                                           : QStringLiteral("<ul class=\"findings\" style=\"font-size:small;margin-top:0px;margin-bottom:2px\">");
                openList = kind;
            }
        }
        if (bullet)
            html += QStringLiteral("<li>%1</li>").arg(text.mid(2).toHtmlEscaped());
        else if (warning)
            html += QStringLiteral("<li>%1</li>").arg(text.toHtmlEscaped());
        else
            html += QStringLiteral("<p><b>%1</b></p>").arg(text.toHtmlEscaped());
    }
    close();
    return html;
}

} // namespace plumbline
