namespace LoopWatch.Storage.Rows;

/// <summary>A dashboard user; <see cref="PasswordHash"/> is the encoded hash, never a password.</summary>
public readonly record struct UserRow(string Name, string Role, string PasswordHash, long CreatedMs);
