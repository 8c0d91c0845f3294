using System.Reflection;
using System.Text.RegularExpressions;
using Microsoft.Data.Sqlite;

namespace LoopWatch.Storage.Writing;

/// <summary>
/// One write statement prepared once on the writer's connection, its parameters made once from the row type's
/// properties (named as in the statement) and only their values set per row.
/// </summary>
internal sealed class PreparedStatement : IDisposable
{
    private readonly SqliteCommand _command;
    private readonly PropertyInfo[] _properties;
    private readonly SqliteParameter[] _parameters;

    /// <summary>Prepares <paramref name="sql"/> for rows of <paramref name="rowType"/> on <paramref name="connection"/>.</summary>
    public PreparedStatement(SqliteConnection connection, string sql, Type rowType)
    {
        RowType = rowType;
        _command = connection.CreateCommand();
        _command.CommandText = sql;
        var named = Regex.Matches(sql, @"@(\w+)").Select(m => m.Groups[1].Value).ToHashSet(StringComparer.Ordinal);
        _properties = rowType.GetProperties(BindingFlags.Public | BindingFlags.Instance).Where(p => named.Contains(p.Name)).ToArray();
        _parameters = _properties.Select(p => _command.Parameters.Add(new SqliteParameter("@" + p.Name, DBNull.Value))).ToArray();
    }

    /// <summary>The row type the parameters were made for.</summary>
    public Type RowType { get; }

    /// <summary>Runs the statement for <paramref name="row"/> inside <paramref name="transaction"/>.</summary>
    public void Run(object row, SqliteTransaction transaction)
    {
        _command.Transaction = transaction;
        for (var i = 0; i < _properties.Length; i++) _parameters[i].Value = _properties[i].GetValue(row) ?? DBNull.Value;
        _command.ExecuteNonQuery();
    }

    public void Dispose() => _command.Dispose();
}
