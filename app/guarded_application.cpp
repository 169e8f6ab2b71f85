#include "guarded_application.hpp"

#include <QMessageBox>

#include <exception>
#include <iostream>
#include <new>

namespace plumbline {

GuardedApplication::GuardedApplication(int& argc, char** argv)
    : QApplication(argc, argv)
{
}

bool GuardedApplication::notify(QObject* receiver, QEvent* event)
{
    QString problem;
    try {
        return QApplication::notify(receiver, event);
    } catch (const std::bad_alloc&) {
        problem = tr("Plumbline ran out of memory. Close other programs, or validate a sample or one period at a time; "
                     "the results shown are unchanged.");
    } catch (const std::exception& error) {
        problem = tr("Internal error: %1. The results shown are unchanged; please report it with the files and settings used.")
                      .arg(QString::fromLocal8Bit(error.what()));
    } catch (...) {
        problem = tr("Internal error of an unknown kind. The results shown are unchanged; please report it.");
    }
    std::cerr << "plumbline: " << problem.toStdString() << '\n';
    QMessageBox::critical(activeWindow(), tr("Plumbline"), problem);
    return false;
}

} // namespace plumbline
