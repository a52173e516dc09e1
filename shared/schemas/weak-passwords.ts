/**
 * Passwords that are too well known to protect an account: the kind that tops every published
 * tally of leaked passwords, keyboard walks, counting runs, sports teams, seasons plus a year,
 * and the name of this application. Compiled by hand for Tributary (our own list, not a copy of
 * any published file); entries are lowercase and compared with the lowercased candidate.
 *
 * Read by `passwordProblem` in shared/schemas/auth.ts (the sign-in, invite, reset and
 * change-password forms and routes). Most entries are 10 characters or longer, because anything
 * shorter is already refused by the length rule.
 */
export const WEAK_PASSWORDS: ReadonlySet<string> = new Set([
  // words + digits
  'password', 'password1', 'password12', 'password123', 'password1234', 'password12345',
  'password123456', 'password01', 'password007', 'password1!', 'password123!', 'password1234!',
  'password2020', 'password2021', 'password2022', 'password2023', 'password2024', 'password2025',
  'password2026', 'passw0rd123', 'p@ssword123', 'p@ssw0rd123', 'p4ssw0rd123', 'pass@word1',
  'pass123456', 'passpass123', 'passwordpassword', 'passwordqwerty', 'mypassword', 'mypassword1',
  'mypassword123', 'yourpassword', 'newpassword', 'newpassword1', 'newpassword123',
  'secret1234', 'secret12345', 'letmein123', 'letmein1234', 'letmeinplease', 'welcome123',
  'welcome1234', 'welcome2024', 'welcome2025', 'welcome@123', 'changeme123', 'changeme1234',
  'trustno1234', 'iloveyou12', 'iloveyou123', 'iloveyou1234', 'iloveu1234', 'loveyou123',
  'lovelove12', 'sweetheart', 'sweetheart1', 'beautiful1', 'forever123', 'family1234',
  'blessed123', 'jesus12345', 'godisgood1', 'whatever123', 'helloworld', 'helloworld1',
  'hello12345', 'hello123456', 'freedom123', 'sunshine123', 'princess123', 'princess1234',
  // keyboard walks and runs
  'qwertyuiop', 'qwertyuiop1', 'qwertyuiop123', 'qwerty12345', 'qwerty123456', 'qwerty123!',
  'qwerty2024', 'qwertyqwerty', 'qwertyu123', 'qwe123qwe123', '123qweasd', '123qweasdzxc',
  'asdfghjkl1', 'asdfghjkl123', 'asdf123456', 'asdfasdf12', 'asdfasdfasdf', 'zxcvbnm123',
  'zxcvbnmasdf', '1q2w3e4r5t', '1q2w3e4r5t6y', 'q1w2e3r4t5', 'q1w2e3r4t5y6', '1qaz2wsx3edc',
  'zaq1xsw2cde3', 'qazwsxedc123', 'qazwsxedcrfv', '1qaz1qaz1qaz', '!qaz2wsx3edc', '1qazxsw23edc',
  '1a2b3c4d5e', 'a1b2c3d4e5', 'abcdefghij', 'abcdefg123', 'abc1234567', 'abcd123456',
  'abc123abc123', 'abcdef123456', 'aaaaaaaaaa', 'aaaaaaaaaaaa',
  '1234567890', '0123456789', '0987654321', '9876543210', '12345678910', '123456789a',
  '1234567890a', '1234567891', '1234567899', '12345678901', '123456789012', '1234512345',
  '1122334455', '11223344556', '1231231231', '123123123123', '1472583690', '1597534560',
  '987654321a', '0000000000', '0000000001', '1111111111', '2222222222', '5555555555',
  '7777777777', '8888888888', '9999999999', '6969696969', '1212121212', '1010101010',
  // names, teams, brands, games
  'michael123', 'jennifer123', 'jessica123', 'matthew123', 'michelle123', 'andrew1234',
  'joshua1234', 'daniel1234', 'thomas1234', 'robert1234', 'ashley1234', 'nicole1234',
  'charlie1234', 'jordan2323', 'superman123', 'batman12345', 'spiderman1', 'spiderman123',
  'starwars123', 'dragon12345', 'monkey12345', 'master12345', 'shadow12345', 'football123',
  'football1234', 'baseball123', 'basketball', 'basketball1', 'soccer12345', 'hockey12345',
  'liverpool1', 'liverpool123', 'chelsea123', 'arsenal123', 'manchester', 'manchester1',
  'cowboys123', 'yankees123', 'eagles1234', 'dallas1234', 'mustang123', 'harley1234',
  'corvette12', 'blink182182', 'pokemon1234', 'minecraft1', 'minecraft123', 'fortnite123',
  'samsung123', 'iphone1234', 'google1234', 'facebook123', 'linkedin123', 'microsoft1',
  'microsoft123', 'computer123', 'internet123', 'butterfly1', 'butterfly123', 'chocolate1',
  'chocolate123', 'elephant123', 'buster1234', 'tigger1234', 'pepper1234', 'cookie1234',
  'maggie1234', 'summer1234', 'flower1234', 'hunter1234', 'ranger1234', 'killer1234',
  'ginger1234', 'angel12345', 'lovely1234', 'babygirl12',
  // seasons, months, days
  'summer2024', 'summer2025', 'summer2026', 'winter2024', 'winter2025', 'winter2026',
  'spring2025', 'spring2026', 'autumn2024', 'autumn2025', 'january2025', 'january2026',
  'monday12345', 'sunday12345',
  // administrators, defaults, test accounts
  'admin12345', 'admin123456', 'administrator', 'administrator1', 'test123456', 'testing123',
  'testtest123', 'guest12345', 'user123456', 'default123', 'login12345', 'access1234',
  'security123', 'temp123456', 'temporary1', 'temporary123',
  // this application and its field
  'tributary', 'tributary1', 'tributary123', 'tributary2025', 'tributary-demo', 'tributarydemo',
  'wildlife123', 'wildlife2025', 'conservation', 'conservation1', 'geneticrescue',
])
