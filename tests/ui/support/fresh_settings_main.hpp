#pragma once

// A QtTest main whose settings store is a new, empty folder (XDG_CONFIG_HOME), as on a first
// start: no remembered options, layout or recent files can make a test pass.
#include <QApplication>
#include <QTemporaryDir>
#include <QTest>

#include <cstdlib>

#define PLUMBLINE_FRESH_SETTINGS_MAIN(TestClass)                                         \
    int main(int argc, char** argv)                                                      \
    {                                                                                    \
        QTemporaryDir config;                                                            \
        qputenv("XDG_CONFIG_HOME", config.path().toUtf8());                              \
        QApplication app(argc, argv);                                                    \
        QApplication::setOrganizationName(QStringLiteral("Plumbline"));                  \
        QApplication::setApplicationName(QStringLiteral("Plumbline"));                   \
        TestClass tests;                                                                 \
        return QTest::qExec(&tests, argc, argv);                                         \
    }
