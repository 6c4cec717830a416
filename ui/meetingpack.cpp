// SPDX-License-Identifier: MIT
#include "ui/meetingpack.h"

#include "ui/banderrorchart.h"
#include "ui/chartexporter.h"
#include "ui/errordistributionchart.h"
#include "ui/format.h"
#include "ui/kcurvechart.h"
#include "ui/userdifferencechart.h"
#include "ui/warningprevalencechart.h"

#include <QCoreApplication>
#include <QFileInfo>
#include <QPageLayout>
#include <QPainter>
#include <QPalette>
#include <QPdfWriter>

#include <algorithm>
#include <cmath>

namespace slatewise::ui {

namespace {

QString tr(const char* text)
{
    return QCoreApplication::translate("MeetingPack", text);
}

QString num(double v, int decimals = 3)
{
    return formatNumber(v, decimals);
}

QString signedNum(double v, int decimals = 3)
{
    if (std::isnan(v))
        return QStringLiteral("–");
    return (v > 0 ? QStringLiteral("+") : QString()) + QString::number(v, 'f', decimals);
}

QString pValue(double p)
{
    if (std::isnan(p) || p < 0)
        return QStringLiteral("–");
    if (p < 0.001)
        return QStringLiteral("< 0.001");
    return QString::number(p, 'f', 3);
}

QString withInterval(const core::RunEvaluation& run, const char* key, double value, int decimals = 3)
{
    QString text = num(value, decimals);
    const auto it = run.ci.find(key);
    if (it != run.ci.end() && !std::isnan(it->second.low))
        text += QLatin1Char('\n') + formatInterval(it->second, decimals);
    return text;
}

/// Places text, tables and charts top to bottom on A4 pages, starting a new page when the
/// next block does not fit, and numbers the pages.
class PageWriter {
public:
    explicit PageWriter(QPdfWriter& writer) : m_writer(writer), m_painter(&writer)
    {
        m_painter.setRenderHint(QPainter::Antialiasing);
        m_painter.setRenderHint(QPainter::TextAntialiasing);
        m_width = writer.width();
        m_height = writer.height();
        m_mm = writer.resolution() / 25.4;
        m_y = 0;
        m_footerHeight = 8 * m_mm;
    }
    bool ok() const { return m_painter.isActive(); }
    int pages() const { return m_page; }
    double mm() const { return m_mm; }
    double width() const { return m_width; }
    double remaining() const { return m_height - m_footerHeight - m_y; }

    QFont font(double points, bool bold = false) const
    {
        QFont f(QStringLiteral("DejaVu Sans"));
        f.setPointSizeF(points);
        f.setBold(bold);
        return f;
    }

    void finishPage()
    {
        m_painter.save();
        m_painter.setFont(font(7.5));
        m_painter.setPen(QColor(0x55, 0x55, 0x55));
        const QRectF footer(0, m_height - m_footerHeight * 0.7, m_width, m_footerHeight * 0.7);
        m_painter.drawText(footer, Qt::AlignLeft | Qt::AlignBottom, m_footerText);
        m_painter.drawText(footer, Qt::AlignRight | Qt::AlignBottom, tr("page %1").arg(m_page));
        m_painter.restore();
    }

    void newPage()
    {
        finishPage();
        m_writer.newPage();
        ++m_page;
        m_y = 0;
    }
    void ensure(double height)
    {
        if (m_y > 0 && height > remaining())
            newPage();
    }
    void setFooter(const QString& text) { m_footerText = text; }

    double textHeight(const QString& text, const QFont& f, double width)
    {
        m_painter.setFont(f);
        return m_painter.boundingRect(QRectF(0, 0, width, 1e6), Qt::TextWordWrap, text).height();
    }

    void text(const QString& text, double points, bool bold = false, QColor colour = Qt::black, double spaceAfterMm = 2)
    {
        const QFont f = font(points, bold);
        const double h = textHeight(text, f, m_width);
        ensure(h);
        m_painter.setFont(f);
        m_painter.setPen(colour);
        m_painter.drawText(QRectF(0, m_y, m_width, h), Qt::TextWordWrap, text);
        m_y += h + spaceAfterMm * m_mm;
    }
    void heading(const QString& t)
    {
        ensure(70 * m_mm); // never a heading alone at the bottom of a page
        if (m_y > 0)
            m_y += 3 * m_mm;
        text(t, 14, true, QColor(0x1d, 0x3d, 0x63), 2.5);
    }
    void paragraph(const QString& t) { text(t, 9.5); }
    void note(const QString& t) { text(t, 8.5, false, QColor(0x44, 0x44, 0x44)); }
    void bullets(const QStringList& items)
    {
        for (const auto& item : items)
            text(QStringLiteral("•  ") + item, 9.5, false, Qt::black, 1);
        m_y += 1.5 * m_mm;
    }

    /// Column widths proportional to the longest line in each column, within limits.
    void table(const PackTable& table, double fontPoints = 8.5, std::vector<double> weights = {})
    {
        if (!table.title.isEmpty()) {
            ensure(40 * m_mm); // keep the title with the first rows
            text(table.title, 10.5, true, Qt::black, 1.5);
        }
        const int columns = static_cast<int>(table.headers.size());
        if (columns == 0)
            return;
        const QFont body = font(fontPoints);
        const QFont head = font(fontPoints, true);
        if (weights.size() != static_cast<std::size_t>(columns)) {
            weights.assign(static_cast<std::size_t>(columns), 1.0);
            QFontMetricsF fm(body, &m_writer);
            auto widest = [&](const QString& cell) {
                double w = 0;
                for (const auto& line : cell.split(QLatin1Char('\n')))
                    w = std::max(w, fm.horizontalAdvance(line));
                return w;
            };
            for (int c = 0; c < columns; ++c) {
                double w = widest(table.headers[c]) * 0.7;
                for (const auto& row : table.rows)
                    if (c < row.size())
                        w = std::max(w, widest(row[c]));
                weights[static_cast<std::size_t>(c)] = std::clamp(w, 8 * m_mm, 70 * m_mm);
            }
        }
        double sum = 0;
        for (double w : weights)
            sum += w;
        std::vector<double> widths;
        for (double w : weights)
            widths.push_back(m_width * w / sum);
        const double pad = 1.2 * m_mm;

        auto rowHeight = [&](const QStringList& cells, const QFont& f) {
            double h = 0;
            for (int c = 0; c < columns; ++c)
                h = std::max(h, textHeight(c < cells.size() ? cells[c] : QString(), f,
                                           widths[static_cast<std::size_t>(c)] - 2 * pad));
            return h + 2 * pad;
        };
        auto drawRow = [&](const QStringList& cells, const QFont& f, bool header, bool shaded) {
            const double h = rowHeight(cells, f);
            if (h > remaining()) {
                newPage();
                if (!header)
                    drawHeaderRow(table.headers, head, widths, pad, columns, rowHeight(table.headers, head));
            }
            if (shaded)
                m_painter.fillRect(QRectF(0, m_y, m_width, h), QColor(0xf0, 0xf3, 0xf7));
            double x = 0;
            m_painter.setFont(f);
            m_painter.setPen(Qt::black);
            for (int c = 0; c < columns; ++c) {
                const double w = widths[static_cast<std::size_t>(c)];
                m_painter.drawText(QRectF(x + pad, m_y + pad, w - 2 * pad, h - 2 * pad), Qt::TextWordWrap,
                                   c < cells.size() ? cells[c] : QString());
                x += w;
            }
            m_y += h;
            if (header) {
                m_painter.setPen(QPen(Qt::black, 0.3 * m_mm));
                m_painter.drawLine(QPointF(0, m_y), QPointF(m_width, m_y));
            }
        };
        ensure(rowHeight(table.headers, head) + (table.rows.empty() ? 0 : rowHeight(table.rows.front(), body)));
        drawRow(table.headers, head, true, false);
        for (std::size_t r = 0; r < table.rows.size(); ++r)
            drawRow(table.rows[r], body, false, r % 2 == 1);
        m_painter.setPen(QPen(QColor(0x88, 0x88, 0x88), 0.2 * m_mm));
        m_painter.drawLine(QPointF(0, m_y), QPointF(m_width, m_y));
        m_y += 2 * m_mm;
        if (table.rows.empty())
            note(tr("(no rows)"));
        if (!table.note.isEmpty())
            note(table.note);
        m_y += 2 * m_mm;
    }

    void chart(ChartView& view, double heightMm)
    {
        const double h = heightMm * m_mm;
        ensure(h);
        // The chart's logical size keeps the same aspect ratio as its box on the page.
        const double logicalWidth = 900;
        view.resize(static_cast<int>(logicalWidth), static_cast<int>(logicalWidth * h / m_width));
        // Printed pages are white: charts take light colours even when the desktop is dark.
        QPalette paper = view.palette();
        for (const auto group : {QPalette::Active, QPalette::Inactive, QPalette::Disabled}) {
            paper.setColor(group, QPalette::Base, Qt::white);
            paper.setColor(group, QPalette::Window, Qt::white);
            paper.setColor(group, QPalette::WindowText, QColor(0x20, 0x20, 0x20));
            paper.setColor(group, QPalette::Text, QColor(0x20, 0x20, 0x20));
        }
        view.setPalette(paper);
        ChartExporter::paint(view, m_painter, QRectF(0, m_y, m_width, h));
        m_y += h + 3 * m_mm;
    }

    void end()
    {
        finishPage();
        m_painter.end();
    }

private:
    void drawHeaderRow(const QStringList& headers, const QFont& f, const std::vector<double>& widths, double pad,
                       int columns, double h)
    {
        double x = 0;
        m_painter.setFont(f);
        m_painter.setPen(Qt::black);
        for (int c = 0; c < columns; ++c) {
            const double w = widths[static_cast<std::size_t>(c)];
            m_painter.drawText(QRectF(x + pad, m_y + pad, w - 2 * pad, h - 2 * pad), Qt::TextWordWrap, headers[c]);
            x += w;
        }
        m_y += h;
        m_painter.setPen(QPen(Qt::black, 0.3 * m_mm));
        m_painter.drawLine(QPointF(0, m_y), QPointF(m_width, m_y));
    }

    QPdfWriter& m_writer;
    QPainter m_painter;
    double m_width = 0, m_height = 0, m_mm = 1, m_y = 0, m_footerHeight = 0;
    int m_page = 1;
    QString m_footerText;
};

PackTable turned(const PackTable& t)
{
    PackTable out;
    out.title = t.title;
    out.note = t.note;
    out.headers << tr("measure");
    for (const auto& row : t.rows)
        out.headers << row.value(0);
    for (int c = 1; c < t.headers.size(); ++c) {
        QStringList cells{t.headers[c]};
        for (const auto& row : t.rows)
            cells << row.value(c);
        out.rows.push_back(cells);
    }
    return out;
}

} // namespace

PackTable MeetingPack::runSummary(const std::vector<core::RunEvaluation>& runs)
{
    PackTable t;
    t.title = tr("Run summary (95% bootstrap intervals below the values)");
    int k = runs.empty() ? 10 : runs.front().settings.k;
    t.headers << tr("run") << tr("RMSE") << tr("MAE") << tr("mean error") << tr("scored") << tr("precision@%1").arg(k)
              << tr("recall@%1").arg(k) << tr("NDCG@%1").arg(k) << tr("hit rate") << tr("MRR") << tr("held-out top-k")
              << tr("coverage") << tr("ILD") << tr("novelty") << tr("users with a list");
    for (const auto& run : runs) {
        QStringList row{toQ(run.runName)};
        if (run.accuracy) {
            const auto& a = *run.accuracy;
            row << withInterval(run, "rmse", a.rmse) << withInterval(run, "mae", a.mae)
                << withInterval(run, "mean_error", a.meanError) << QStringLiteral("%1 %").arg(100 * a.scoredFraction, 0, 'f', 1);
        } else {
            row << tr("no scores") << QString() << QString() << QString();
        }
        if (run.ranking) {
            const auto& r = *run.ranking;
            row << withInterval(run, "precision", r.precision) << withInterval(run, "recall", r.recall)
                << withInterval(run, "ndcg", r.ndcg) << withInterval(run, "hit_rate", r.hitRate)
                << withInterval(run, "mrr", r.mrr) << withInterval(run, "heldout_topk", r.heldoutTopk);
        } else {
            row << tr("no lists") << QString() << QString() << QString() << QString()
                << (run.accuracy ? QString() : QString());
        }
        if (run.beyond) {
            const auto& b = *run.beyond;
            row << QStringLiteral("%1 %").arg(100 * b.coverage, 0, 'f', 1) << withInterval(run, "ild", b.ild)
                << withInterval(run, "novelty", b.novelty, 2);
        } else {
            row << QString() << QString() << QString();
        }
        if (run.ranking) {
            const auto users = run.ranking->users;
            row << QStringLiteral("%1 of %2").arg(users - run.ranking->usersWithoutList).arg(users);
        } else {
            row << QString();
        }
        t.rows.push_back(row);
    }
    t.note = tr("RMSE, MAE and mean error: lower absolute values are better (rating points). Ranking measures at "
                "k = %1: higher is better. Intervals: 95% percentile bootstrap over users.")
                 .arg(k);
    return t;
}

QString MeetingPack::verdict(const PackComparisonRow& row)
{
    const bool adjusted = row.pHolm >= 0;
    const double p = adjusted ? row.pHolm : row.pT;
    // "p < 0.001", not "p = < 0.001".
    const QString shown = pValue(p);
    const QString relation = shown.startsWith(QLatin1Char('<')) ? shown : QStringLiteral("= ") + shown;
    const QString pText = adjusted ? tr("Holm-adjusted p %1").arg(relation) : tr("p %1").arg(relation);
    const QString interval = tr("the 95% interval %1 to %2").arg(signedNum(row.ciLow, 4), signedNum(row.ciHigh, 4));
    if (row.n < 30)
        return tr("too few users to judge (n = %1, under 30)").arg(row.n);
    const bool coversZero = !(row.ciLow > 0 || row.ciHigh < 0);
    if (std::isnan(p) || p >= 0.05 || coversZero) {
        if (coversZero)
            return tr("not significant (%1; %2 includes 0)").arg(pText, interval);
        return tr("not significant (%1)").arg(pText);
    }
    const bool candidateBetter = (row.meanDiff > 0) == row.higherIsBetter;
    return candidateBetter ? tr("significant: candidate better (%1)").arg(pText)
                           : tr("significant: candidate worse (%1)").arg(pText);
}

core::Status MeetingPack::write(const MeetingPackContent& content, const QString& path)
{
    QPdfWriter writer(path);
    writer.setPageSize(QPageSize(QPageSize::A4));
    writer.setPageMargins(QMarginsF(16, 16, 16, 14), QPageLayout::Millimeter);
    writer.setResolution(300);
    writer.setTitle(tr("Slatewise meeting pack: %1").arg(content.workspaceName));
    writer.setCreator(QStringLiteral("Slatewise"));
    PageWriter page(writer);
    if (!page.ok())
        return core::Error{.kind = core::ErrorKind::Workspace,
                           .file = path.toStdString(),
                           .message = "could not write the PDF file",
                           .expected = "a writable file path"};
    page.setFooter(tr("Slatewise meeting pack · %1 · %2").arg(content.workspaceName, content.generatedAt));

    // 1. What was evaluated and the summary.
    page.text(tr("Meeting pack: %1").arg(content.workspaceName), 20, true, QColor(0x1d, 0x3d, 0x63), 1.5);
    page.note(tr("Generated %1 by Slatewise. Settings: %2.").arg(content.generatedAt, content.settingsText));
    QStringList contents{tr("Run summary and error by withheld rating"), tr("Precision, recall and NDCG against k"),
                         tr("Warnings per run")};
    if (content.comparison)
        contents << tr("Comparison: %1 (candidate) against %2 (base)")
                        .arg(content.comparison->candidate, content.comparison->base);
    contents << tr("The ten worst-served users") << tr("%1 user case studies").arg(content.caseStudies.size());
    page.paragraph(tr("In this pack:"));
    page.bullets(contents);

    page.heading(tr("1. Run summary"));
    if (content.runs.empty())
        page.paragraph(tr("The workspace has no evaluated run."));
    else
        page.table(turned(runSummary(content.runs)), 8.5);

    BandErrorChart bands;
    bands.setData(content.runs);
    page.heading(tr("2. Error by withheld rating"));
    page.paragraph(tr("A run can look accurate on average while missing where it matters: the bars show, per "
                      "withheld rating, how far the scores are off (RMSE) and in which direction (mean error)."));
    page.chart(bands, 125);

    if (!content.errors.empty()) {
        ErrorDistributionChart errors;
        errors.setData(content.errors);
        page.chart(errors, 95);
    }

    page.heading(tr("3. Ranking quality against list length"));
    KCurveChart curves;
    curves.setData(content.runs);
    page.chart(curves, 90);

    page.heading(tr("4. Warnings per run"));
    WarningPrevalenceChart warnings;
    warnings.setData(content.runs);
    page.chart(warnings, 110);

    if (content.comparison) {
        const auto& cmp = *content.comparison;
        page.newPage();
        page.heading(tr("5. Comparison: %1 against %2").arg(cmp.candidate, cmp.base));
        page.paragraph(tr("Per metric over the users both runs can be scored on: the mean of %1 − %2 with a 95% "
                          "paired bootstrap interval, the paired t-test and Wilcoxon signed-rank p-values, and how "
                          "many users got better, stayed the same or got worse. A difference is called significant "
                          "only when p < 0.05 and the interval excludes 0.")
                           .arg(cmp.candidate, cmp.base));
        PackTable table;
        table.headers << tr("metric") << tr("users") << tr("base → candidate") << tr("difference\n[95% interval]")
                      << tr("p (t / Wilcoxon / Holm)") << tr("better / same / worse") << tr("verdict");
        for (const auto& row : cmp.rows) {
            const bool higher = row.higherIsBetter;
            table.rows.push_back(
                {row.metric + (higher ? tr("\n(higher is better)") : tr("\n(lower is better)")),
                 QString::number(row.n), num(row.meanBase, 4) + QStringLiteral(" → ") + num(row.meanCandidate, 4),
                 signedNum(row.meanDiff, 4) + QStringLiteral("\n[") + signedNum(row.ciLow, 4) + QStringLiteral(", ") +
                     signedNum(row.ciHigh, 4) + QLatin1Char(']'),
                 pValue(row.pT) + QStringLiteral(" / ") + pValue(row.pWilcoxon) + QStringLiteral(" / ") + pValue(row.pHolm),
                 QStringLiteral("%1 / %2 / %3").arg(row.wins).arg(row.ties).arg(row.losses), verdict(row)});
        }
        table.note = cmp.note;
        page.table(table, 8, {14, 8, 20, 20, 18, 16, 34});
        if (!cmp.differences.empty()) {
            UserDifferenceChart diff;
            diff.setData(cmp.differences, cmp.differenceMetric, cmp.base, cmp.candidate);
            page.chart(diff, 100);
        }
        if (!cmp.segments.empty()) {
            PackTable seg;
            seg.title = tr("By segment");
            seg.headers << tr("segment") << tr("metric") << tr("users") << tr("difference [95% interval]") << tr("p")
                        << tr("verdict");
            for (const auto& s : cmp.segments) {
                QString verdictText;
                if (s.tooSmall)
                    verdictText = tr("too small to judge (under 30 users)");
                else if (!(s.ciLow > 0 || s.ciHigh < 0) || s.p >= 0.05)
                    verdictText = tr("not significant");
                else
                    verdictText = tr("significant");
                seg.rows.push_back({s.segment, s.metric, QString::number(s.n),
                                    signedNum(s.meanDiff, 4) + QStringLiteral(" [") + signedNum(s.ciLow, 4) +
                                        QStringLiteral(", ") + signedNum(s.ciHigh, 4) + QLatin1Char(']'),
                                    pValue(s.p), verdictText});
            }
            page.table(seg, 8, {26, 12, 9, 28, 9, 26});
        }
    } else {
        page.heading(tr("5. Comparison"));
        page.paragraph(tr("No comparison in this pack: give a base and a candidate run to include one."));
    }

    page.newPage();
    page.heading(tr("6. The ten worst-served users"));
    page.table(content.worstUsers, 8);

    int number = 1;
    for (const auto& study : content.caseStudies) {
        page.newPage();
        page.heading(tr("7.%1 Case study: user %2 under %3").arg(number++).arg(study.userId, study.runName));
        page.paragraph(study.why);
        if (!study.metrics.isEmpty())
            page.bullets(study.metrics);
        page.text(tr("Warnings"), 10.5, true, Qt::black, 1.5);
        if (study.warnings.isEmpty())
            page.paragraph(tr("No warning for this user."));
        else
            page.bullets(study.warnings);
        page.table(study.list, 8, {6, 30, 20, 22, 8, 22});
        page.table(study.withheld, 8);
    }
    page.end();
    if (!QFileInfo(path).isFile()) {
        core::Error e;
        e.kind = core::ErrorKind::Workspace;
        e.file = path.toStdString();
        e.message = "could not write the PDF file";
        e.expected = "a writable file path";
        return e;
    }
    return core::Done{};
}

} // namespace slatewise::ui
