using Dapper;
using LoopWatch.Storage.Rows;

namespace LoopWatch.Storage.Users;

/// <summary>Dashboard users; written directly (not through the writer) because a login change must be visible at once.</summary>
public sealed class UserStore(LoopWatchDatabase database)
{
    /// <summary>Adds a user; false when the name is taken.</summary>
    public async Task<bool> AddAsync(UserRow user, CancellationToken cancellationToken = default)
    {
        await using var connection = database.OpenConnection();
        var added = await connection.ExecuteAsync(new CommandDefinition("""
            INSERT INTO users (name, role, password_hash, created_ms) VALUES (@Name, @Role, @PasswordHash, @CreatedMs)
            ON CONFLICT (name) DO NOTHING
            """, user, cancellationToken: cancellationToken)).ConfigureAwait(false);
        return added == 1;
    }

    /// <summary>The user with this exact name, or null.</summary>
    public async Task<UserRow?> FindAsync(string name, CancellationToken cancellationToken = default)
    {
        await using var connection = database.OpenConnection();
        var rows = await connection.QueryAsync<UserRow>(new CommandDefinition("""
            SELECT name AS Name, role AS Role, password_hash AS PasswordHash, created_ms AS CreatedMs
            FROM users WHERE name = @Name
            """, new { Name = name }, cancellationToken: cancellationToken)).ConfigureAwait(false);
        foreach (var row in rows) return row;
        return null;
    }

    /// <summary>Every user, by name; callers show names and roles only.</summary>
    public async Task<IReadOnlyList<UserRow>> ListAsync(CancellationToken cancellationToken = default)
    {
        await using var connection = database.OpenConnection();
        var rows = await connection.QueryAsync<UserRow>(new CommandDefinition(
            "SELECT name AS Name, role AS Role, password_hash AS PasswordHash, created_ms AS CreatedMs FROM users ORDER BY name",
            cancellationToken: cancellationToken)).ConfigureAwait(false);
        return rows.AsList();
    }

    /// <summary>Replaces a user's password hash and role; false when no such user.</summary>
    public async Task<bool> UpdateAsync(UserRow user, CancellationToken cancellationToken = default)
    {
        await using var connection = database.OpenConnection();
        var changed = await connection.ExecuteAsync(new CommandDefinition(
            "UPDATE users SET role = @Role, password_hash = @PasswordHash WHERE name = @Name",
            user, cancellationToken: cancellationToken)).ConfigureAwait(false);
        return changed == 1;
    }
}
