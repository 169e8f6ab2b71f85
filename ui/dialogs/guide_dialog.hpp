#pragma once

#include <QDialog>

namespace plumbline {

// Help → Guide to the window: what each part shows, how the threshold links them, and the
// keyboard shortcuts.
class GuideDialog : public QDialog {
    Q_OBJECT
public:
    explicit GuideDialog(QWidget* parent = nullptr);
    static QString guideHtml();

private:
    static QString cautionsHtml();
};

} // namespace plumbline
