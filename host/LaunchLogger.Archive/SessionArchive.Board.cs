using LaunchLogger.Archive.Board;
using Microsoft.Data.Sqlite;

namespace LaunchLogger.Archive;

// The board: runs ranked by one figure, per class.
public sealed partial class SessionArchive
{
    /// <summary>Makes a board.</summary>
    /// <remarks>Ranking: each competitor (the driver; a run without a driver competes as its
    /// car, and one with neither on its own) is placed by their best eligible run. Eligible:
    /// the run counts (not a rerun, not disqualified), its verdict is accepted, and it has the
    /// figure. Ties: <see cref="BoardResult.TieRule"/>.</remarks>
    /// <exception cref="ArchiveException">A name in the filter matches nothing.</exception>
    public BoardResult Board(BoardRequest request)
    {
        ArgumentNullException.ThrowIfNull(request);
        (string where, var parameters) = RunWhere(request.Filter);
        string column = request.Convention == Convention.Rollout && request.Figure.HasConventions ? "rollout" : "standstill";
        string sql =
            $"""
            SELECT r.id, r.box_run, r.driver_id, r.car_id, d.name, c.name, k.name, e.name, r.standing, r.standing_reason,
                   res.verdict, res.reasons, f.{column}, f.{column}_sigma
            FROM runs r
            JOIN results res ON res.id = r.result_id
            JOIN figures f ON f.result_id = res.id AND f.figure = $figure
            LEFT JOIN events e ON e.id = r.event_id
            LEFT JOIN drivers d ON d.id = r.driver_id
            LEFT JOIN cars c ON c.id = r.car_id
            LEFT JOIN classes k ON k.id = r.class_id
            {where}
            """;
        var candidates = new List<(BoardRow Row, string Competitor)>();
        using (SqliteCommand command = Command(sql, null, [.. parameters, ("$figure", request.Figure.Code)]))
        using (SqliteDataReader reader = command.ExecuteReader())
        {
            while (reader.Read())
            {
                if (reader.IsDBNull(12))
                {
                    continue;
                }

                string competitor = !reader.IsDBNull(2) ? "d" + reader.GetInt64(2) : !reader.IsDBNull(3) ? "c" + reader.GetInt64(3) : "r" + reader.GetInt64(0);
                candidates.Add((new BoardRow
                {
                    Run = reader.GetInt64(0),
                    BoxRun = reader.GetInt32(1),
                    Driver = reader.IsDBNull(4) ? null : reader.GetString(4),
                    Car = reader.IsDBNull(5) ? null : reader.GetString(5),
                    Class = reader.IsDBNull(6) ? null : reader.GetString(6),
                    Event = reader.IsDBNull(7) ? null : reader.GetString(7),
                    Standing = reader.GetString(8),
                    StandingReason = reader.IsDBNull(9) ? null : reader.GetString(9),
                    Verdict = reader.GetString(10),
                    Reasons = reader.GetString(11),
                    Value = reader.GetDouble(12),
                    Uncertainty = reader.IsDBNull(13) ? null : reader.GetDouble(13),
                }, competitor));
            }
        }

        var notCounted = candidates.Where(c => c.Row.Standing != "counted").Select(c => c.Row).OrderBy(r => r.Run).ToList();
        var counted = candidates.Where(c => c.Row.Standing == "counted").ToList();
        var eligible = counted.Where(c => Accepted(c.Row.Verdict, request.Accept)).ToList();
        Comparison<BoardRow> order = Order(request.Figure.HigherIsBetter);
        var sections = new List<BoardSection>();
        foreach (var byClass in eligible.GroupBy(c => c.Row.Class).OrderBy(g => g.Key is null).ThenBy(g => g.Key, StringComparer.OrdinalIgnoreCase))
        {
            List<BoardRow> rows;
            if (request.EveryRun)
            {
                rows = byClass.Select(c => c.Row).ToList();
            }
            else
            {
                rows = byClass.GroupBy(c => c.Competitor).Select(g =>
                {
                    List<BoardRow> own = g.Select(c => c.Row).ToList();
                    own.Sort(order);
                    return own[0] with { Runs = own.Count };
                }).ToList();
            }

            rows.Sort(order);
            sections.Add(new BoardSection(byClass.Key, rows.Select((r, i) => r with { Rank = i + 1 }).ToList()));
        }

        return new BoardResult
        {
            Figure = request.Figure.Code,
            Description = request.Figure.Description,
            Convention = request.Figure.HasConventions ? column : "none",
            Accept = request.Accept.ToString().ToLowerInvariant(),
            Unit = request.Figure.Quantity switch { FigureQuantity.Speed => "m/s", FigureQuantity.Distance => "m", _ => "s" },
            HigherIsBetter = request.Figure.HigherIsBetter,
            BestPerDriver = !request.EveryRun,
            Sections = sections,
            NotCounted = notCounted,
            LeftOutForVerdict = counted.Count - eligible.Count,
        };
    }

    private static bool Accepted(string verdict, Acceptance accept) => accept switch
    {
        Acceptance.All => true,
        Acceptance.Doubtful => verdict is "valid" or "doubtful",
        _ => verdict == "valid",
    };

    /// <summary>Best first: the value at the board's resolution (1e-3 in SI units), then the
    /// smaller uncertainty, then the run filed first.</summary>
    private static Comparison<BoardRow> Order(bool higherIsBetter) => (a, b) =>
    {
        long qa = (long)Math.Round(a.Value * 1000, MidpointRounding.AwayFromZero);
        long qb = (long)Math.Round(b.Value * 1000, MidpointRounding.AwayFromZero);
        int byValue = higherIsBetter ? qb.CompareTo(qa) : qa.CompareTo(qb);
        if (byValue != 0)
        {
            return byValue;
        }

        int bySigma = (a.Uncertainty ?? double.MaxValue).CompareTo(b.Uncertainty ?? double.MaxValue);
        return bySigma != 0 ? bySigma : a.Run.CompareTo(b.Run);
    };
}
