#pragma once

#include <QApplication>

namespace plumbline {

// The window's application object, and the last line of defence of every slot and event
// handler: an exception that escapes one is shown once and the window goes on, instead of
// ending the program with the user's unsaved work.
class GuardedApplication : public QApplication {
    Q_OBJECT
public:
    GuardedApplication(int& argc, char** argv);
    bool notify(QObject* receiver, QEvent* event) override;
};

} // namespace plumbline
