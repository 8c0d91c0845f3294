using LoopWatch.Dashboard.Access;
using LoopWatch.Storage.Rows;
using LoopWatch.Storage.Users;
using Microsoft.AspNetCore.Authorization;
using Microsoft.AspNetCore.Mvc;
using Microsoft.AspNetCore.Mvc.RazorPages;

namespace LoopWatch.Dashboard.Pages;

/// <summary>Admin page: the dashboard's users and their roles, and adding a user (passwords stored hashed).</summary>
[Authorize(Policy = Roles.CanAdminister)]
public sealed class UsersModel(UserStore users, TimeProvider time) : PageModel
{
    public IReadOnlyList<UserRow> Users { get; private set; } = [];
    public string? Notice { get; private set; }

    public async Task OnGetAsync(string? notice, CancellationToken ct)
    {
        Notice = notice;
        Users = await users.ListAsync(ct);
    }

    public async Task<IActionResult> OnPostAddAsync(string? name, string? role, string? password, CancellationToken ct)
    {
        string notice;
        if (string.IsNullOrWhiteSpace(name) || name.Length > 64 || name.Any(char.IsControl)) notice = "Name: 1-64 printable characters.";
        else if (role is null || !Roles.All.Contains(role)) notice = "Choose a role.";
        else if (password is null || password.Length < 8) notice = "The password must have at least 8 characters.";
        else notice = await users.AddAsync(new UserRow(name, role, Passwords.Hash(name, password), time.GetUtcNow().ToUnixTimeMilliseconds()), ct)
            ? $"User {name} added with role {role}." : $"User {name} exists already.";
        return RedirectToPage(new { notice });
    }
}
