// plumbline: the workbench window. `plumbline [FILE]` opens FILE in the import dialog (or runs it
// directly when --outcome and --score are given); `plumbline --snapshot OUT.png FILE [validate
// options]` runs the analysis, renders the whole window to OUT.png and exits — no display needed.
// As the composition root it catches what escapes and shows it once.
#include "files/atomic_file.hpp"
#include "cli_analysis_options.hpp"
#include "guarded_application.hpp"
#include "huge_pages.hpp"
#include "main_window.hpp"
#include "run/validation_task.hpp"
#include "files/version.hpp"

#include <CLI/CLI.hpp>

#include <QApplication>
#include <QBuffer>
#include <QEventLoop>
#include <QMessageBox>
#include <QPixmap>
#include <QTimer>

#include <cstdlib>
#include <iostream>

namespace {

struct GuiOptions {
    plumbline::cli::AnalysisOptions analysis; // the options of `plumbline-cli validate`
    std::string snapshot;
};

// Runs the request in the window and waits (snapshot mode only: there is no user to keep responsive).
int renderSnapshot(plumbline::MainWindow& window, const plumbline::AnalysisRequest& request, const std::string& out)
{
    QEventLoop loop;
    int status = 0;
    QObject::connect(window.task(), &plumbline::ValidationTask::finished, &loop, [&] { loop.quit(); });
    QObject::connect(window.task(), &plumbline::ValidationTask::failed, &loop, [&](const QString& message) {
        std::cerr << "plumbline: error: " << message.toStdString() << '\n';
        status = 2;
        loop.quit();
    });
    window.resize(1600, 1050);
    window.runRequest(request);
    loop.exec();
    if (status != 0)
        return status;
    QApplication::processEvents();
    const QPixmap image = window.grab();
    QByteArray bytes;
    QBuffer buffer(&bytes);
    buffer.open(QIODevice::WriteOnly);
    image.save(&buffer, "PNG");
    if (auto written = plumbline::writeFileAtomically(out, std::string_view(bytes.constData(), std::size_t(bytes.size()))); !written) {
        std::cerr << "plumbline: error: " << written.error().message() << '\n';
        return 2;
    }
    std::cout << "wrote " << out << '\n';
    return 0;
}

bool wantsSnapshot(int argc, char** argv)
{
    for (int i = 1; i < argc; ++i)
        if (std::string(argv[i]) == "--snapshot")
            return true;
    return false;
}

} // namespace

int main(int argc, char** argv)
{
    plumbline::restartWithHugePages(argv);
    // A snapshot needs no screen: without one, render offscreen rather than fail to start.
    if (wantsSnapshot(argc, argv) && !std::getenv("DISPLAY") && !std::getenv("WAYLAND_DISPLAY") && !std::getenv("QT_QPA_PLATFORM"))
        qputenv("QT_QPA_PLATFORM", "offscreen");
    plumbline::GuardedApplication app(argc, argv);
    QApplication::setOrganizationName(QStringLiteral("Plumbline"));
    QApplication::setApplicationName(QStringLiteral("Plumbline"));
    QApplication::setApplicationVersion(QString::fromLatin1(plumbline::versionString));

    CLI::App parser{"Plumbline workbench", "plumbline"};
    GuiOptions options;
    options.analysis.addTo(parser);
    parser.add_option("--snapshot", options.snapshot, "Render the window with the results to this PNG and exit");
    std::vector<std::string> arguments;
    for (const QString& argument : QApplication::arguments().mid(1))
        arguments.push_back(argument.toStdString());
    std::reverse(arguments.begin(), arguments.end()); // CLI11 takes them last-first
    try {
        parser.parse(arguments);
    } catch (const CLI::ParseError& error) {
        return parser.exit(error) == 0 ? 0 : 2;
    }

    try {
        plumbline::MainWindow window;
        std::vector<std::string> settingsWarnings;
        const auto analysis = options.analysis.resolved(parser, settingsWarnings);
        if (!analysis) {
            const std::string message = analysis.error().message();
            if (!options.snapshot.empty()) {
                std::cerr << "plumbline: error: " << message << '\n';
                return 2;
            }
            QMessageBox::warning(nullptr, QStringLiteral("Plumbline"), QString::fromStdString(message));
        }
        for (const auto& warning : settingsWarnings)
            std::cerr << "plumbline: warning: " << warning << '\n';
        // The same defaults as the command line: everything not given comes from AnalysisFile{}.
        const plumbline::AnalysisRequest request = plumbline::AnalysisRequest::fromAnalysisFile(analysis.value_or(plumbline::AnalysisFile{}));
        const bool complete = !request.intake.cohortFile.empty() && !request.intake.outcomeColumn.empty()
            && !request.intake.scoreColumns.empty();
        if (!options.snapshot.empty()) {
            if (!complete) {
                std::cerr << "plumbline: error: --snapshot needs FILE, --outcome and --score. What to do: give them as for "
                             "plumbline-cli validate.\n";
                return 2;
            }
            return renderSnapshot(window, request, options.snapshot);
        }
        window.show();
        if (complete)
            window.runRequest(request);
        else if (!request.intake.cohortFile.empty())
            QTimer::singleShot(0, &window, [&window, path = QString::fromStdString(request.intake.cohortFile)] {
                window.openWithDialog(path);
            });
        return QApplication::exec();
    } catch (const std::exception& error) {
        std::cerr << "plumbline: internal error: " << error.what() << ". Please report it.\n";
        QMessageBox::critical(nullptr, QStringLiteral("Plumbline"),
                              QStringLiteral("Internal error: %1. Please report it.").arg(QString::fromLocal8Bit(error.what())));
        return 1;
    }
}
