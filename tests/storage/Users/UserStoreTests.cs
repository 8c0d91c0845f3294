using LoopWatch.Storage.Rows;
using LoopWatch.Storage.Tests.Support;
using LoopWatch.Storage.Users;

namespace LoopWatch.Storage.Tests.Users;

public sealed class UserStoreTests : IDisposable
{
    private readonly TempDatabase _temp = new();

    public void Dispose() => _temp.Dispose();

    [Fact]
    public async Task AddFindUpdate_NamesAreUnique()
    {
        using var db = LoopWatchDatabase.Open(_temp.Options());
        var users = new UserStore(db);
        var op = new UserRow("op1", "operator", "hash-a", SampleRows.T0);

        Assert.True(await users.AddAsync(op));
        Assert.False(await users.AddAsync(op with { Role = "admin" }));
        Assert.Equal(op, await users.FindAsync("op1"));
        Assert.Null(await users.FindAsync("OP1' OR '1'='1"));
        Assert.True(await users.UpdateAsync(op with { PasswordHash = "hash-b", Role = "engineer" }));
        Assert.Equal(op with { PasswordHash = "hash-b", Role = "engineer" }, await users.FindAsync("op1"));
        Assert.False(await users.UpdateAsync(op with { Name = "nobody" }));
    }
}
