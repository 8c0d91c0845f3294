using Microsoft.AspNetCore.Identity;

namespace LoopWatch.Dashboard.Access;

/// <summary>Password hashing with ASP.NET Core's <see cref="PasswordHasher{TUser}"/> (PBKDF2, salted, versioned format).</summary>
public static class Passwords
{
    private static readonly PasswordHasher<string> Hasher = new();

    /// <summary>The encoded hash of a password for a user name.</summary>
    public static string Hash(string user, string password) => Hasher.HashPassword(user, password);

    /// <summary>True when <paramref name="password"/> matches the stored hash.</summary>
    public static bool Verify(string user, string hash, string password) =>
        Hasher.VerifyHashedPassword(user, hash, password) is PasswordVerificationResult.Success or PasswordVerificationResult.SuccessRehashNeeded;
}
